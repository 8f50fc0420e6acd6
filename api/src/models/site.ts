import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A building or job location. */
export class Site extends Model<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: string;
  declare organisationId: string;
  declare name: string;
  declare address: string | null;
  declare clientContact: string | null;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return Site.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        name: { type: DataTypes.STRING(200), allowNull: false },
        address: { type: DataTypes.TEXT, allowNull: true },
        clientContact: { type: DataTypes.TEXT, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'sites' },
    );
  }
}
