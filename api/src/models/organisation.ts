import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** The tenant. Every other row belongs to exactly one organisation. */
export class Organisation extends Model<InferAttributes<Organisation>, InferCreationAttributes<Organisation>> {
  declare id: string;
  declare name: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return Organisation.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        name: { type: DataTypes.STRING(200), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'organisations' },
    );
  }
}
