import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const TRACE_KINDS = ['rms', 'waveform'] as const;
export type TraceKind = (typeof TRACE_KINDS)[number];
export const TRACE_STATUSES = ['open', 'closed'] as const;
export type TraceStatus = (typeof TRACE_STATUSES)[number];

/** How raw readings become amps (see analysis/probe). */
export interface ProbeSettings {
  inputUnit: 'A' | 'mA' | 'mV';
  /** Raw units per ampere at the jaw, e.g. 1 (A/A), 1 (mA/A), 10 (mV/A). */
  sensitivity: number;
  /** Turns of the conductor through the jaw (a x10 splitter loop is 10). */
  loops: number;
}

/** One timed series of current samples from one probe on one conductor (metadata; samples live in chunks). */
export class Trace extends Model<InferAttributes<Trace>, InferCreationAttributes<Trace>> {
  declare id: string;
  declare organisationId: string;
  declare siteId: string | null;
  declare circuitId: string | null;
  declare loadId: string | null;
  declare name: string;
  declare kind: TraceKind;
  declare status: CreationOptional<TraceStatus>;
  declare probe: ProbeSettings;
  declare nominalVoltageV: number | null;
  declare mainsHz: number | null;
  declare startTime: Date | null;
  declare sampleRateHz: number | null;
  declare tags: CreationOptional<string[]>;
  declare notes: string | null;
  declare summary: CreationOptional<Record<string, unknown> | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return Trace.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        siteId: { type: DataTypes.STRING(36), allowNull: true },
        circuitId: { type: DataTypes.STRING(36), allowNull: true },
        loadId: { type: DataTypes.STRING(36), allowNull: true },
        name: { type: DataTypes.STRING(200), allowNull: false },
        kind: { type: DataTypes.STRING(10), allowNull: false },
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'open' },
        probe: { type: DataTypes.JSON, allowNull: false },
        nominalVoltageV: { type: DataTypes.DOUBLE, allowNull: true },
        mainsHz: { type: DataTypes.DOUBLE, allowNull: true },
        startTime: { type: DataTypes.DATE, allowNull: true },
        sampleRateHz: { type: DataTypes.DOUBLE, allowNull: true },
        tags: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        notes: { type: DataTypes.TEXT, allowNull: true },
        summary: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'traces' },
    );
  }
}
