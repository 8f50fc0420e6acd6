import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const LOAD_CONNECTIONS = ['cord-and-plug', 'fastened-in-place'] as const;
export type LoadConnection = (typeof LOAD_CONNECTIONS)[number];

/** Equipment on a circuit. */
export class Load extends Model<InferAttributes<Load>, InferCreationAttributes<Load>> {
  declare id: string;
  declare organisationId: string;
  declare circuitId: string;
  declare name: string;
  declare nameplateA: number | null;
  declare nameplateW: number | null;
  declare powerFactor: number | null;
  declare connection: LoadConnection;
  declare continuous: boolean;
  declare motorHp: number | null;
  declare lockedRotorCode: string | null;
  /** Start-up peak (RMS, amps) from the nameplate or maker, e.g. a compressor's locked-rotor amps. */
  declare startPeakA: CreationOptional<number | null>;
  /** How long the start-up peak lasts, seconds. */
  declare startDurationS: CreationOptional<number | null>;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return Load.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        circuitId: { type: DataTypes.STRING(36), allowNull: false },
        name: { type: DataTypes.STRING(200), allowNull: false },
        nameplateA: { type: DataTypes.DOUBLE, allowNull: true },
        nameplateW: { type: DataTypes.DOUBLE, allowNull: true },
        powerFactor: { type: DataTypes.DOUBLE, allowNull: true },
        connection: { type: DataTypes.STRING(30), allowNull: false },
        continuous: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        motorHp: { type: DataTypes.DOUBLE, allowNull: true },
        lockedRotorCode: { type: DataTypes.STRING(1), allowNull: true },
        startPeakA: { type: DataTypes.DOUBLE, allowNull: true },
        startDurationS: { type: DataTypes.DOUBLE, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'loads' },
    );
  }
}
