import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * Overcurrent device kinds: IEC 60898-1 curves B/C/D, a North-American residential thermal-magnetic
 * breaker (UL 489), or a fuse.
 */
export const DEVICE_KINDS = ['iec-b', 'iec-c', 'iec-d', 'na-thermal-magnetic', 'fuse'] as const;
export type DeviceKind = (typeof DEVICE_KINDS)[number];
export const CONDUCTOR_MATERIALS = ['cu', 'al'] as const;
export type ConductorMaterial = (typeof CONDUCTOR_MATERIALS)[number];

/** A branch circuit at a site. */
export class Circuit extends Model<InferAttributes<Circuit>, InferCreationAttributes<Circuit>> {
  declare id: string;
  declare organisationId: string;
  declare siteId: string;
  declare label: string;
  declare nominalVoltageV: number;
  declare mainsHz: number;
  declare deviceRatingA: number;
  declare deviceKind: DeviceKind;
  declare conductorSize: string | null;
  declare conductorMaterial: ConductorMaterial | null;
  declare feedsOtherOutlets: boolean;
  declare necEdition: number;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return Circuit.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        siteId: { type: DataTypes.STRING(36), allowNull: false },
        label: { type: DataTypes.STRING(200), allowNull: false },
        nominalVoltageV: { type: DataTypes.DOUBLE, allowNull: false },
        mainsHz: { type: DataTypes.DOUBLE, allowNull: false },
        deviceRatingA: { type: DataTypes.DOUBLE, allowNull: false },
        deviceKind: { type: DataTypes.STRING(40), allowNull: false },
        conductorSize: { type: DataTypes.STRING(20), allowNull: true },
        conductorMaterial: { type: DataTypes.STRING(10), allowNull: true },
        feedsOtherOutlets: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        necEdition: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 2023 },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'circuits' },
    );
  }
}
