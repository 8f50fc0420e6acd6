import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const ROLES = ['admin', 'engineer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: string;
  declare organisationId: string;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: string | null;
  declare active: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return User.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        email: { type: DataTypes.STRING(320), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(200), allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false },
        passwordHash: { type: DataTypes.STRING(200), allowNull: true },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users' },
    );
  }
}
