import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const TRACE_KINDS = ['rms', 'waveform'] as const;
export type TraceKind = (typeof TRACE_KINDS)[number];
export const TRACE_STATUSES = ['open', 'closed'] as const;
export type TraceStatus = (typeof TRACE_STATUSES)[number];

/** How raw readings become amps (see analysis/probe). */
export interface ProbeSettings {
  inputUnit: 'A' | 'mA' | 'mV';
  /** Raw units per ampere at the jaw, e.g. 1 (A/A), 1 (mA/A), 10 (mV/A). */
  sensitivityPerA: number;
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
  /** Mergeable summary of every stored sample in raw probe units (storage/summary-rows.ts), kept current on each append. */
  declare summary: CreationOptional<Record<string, unknown> | null>;
  // Storage state, written by the chunk store (api/src/storage) in the same transaction as the samples.
  declare sampleCount: CreationOptional<number>;
  /** Committed chunks; chunks with seq >= chunkCount belong to a batch still being written. */
  declare chunkCount: CreationOptional<number>;
  /** Microseconds since the epoch of time 0 of the stored summaries (the first sample's time). */
  declare originUs: CreationOptional<number | null>;
  declare firstSampleUs: CreationOptional<number | null>;
  declare lastSampleUs: CreationOptional<number | null>;
  /** Intervals longer than this (s) are gaps; fixed once the trace has two samples. */
  declare gapThresholdS: CreationOptional<number | null>;
  declare closedAt: CreationOptional<Date | null>;
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
        sampleCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        chunkCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        originUs: { type: DataTypes.DOUBLE, allowNull: true },
        firstSampleUs: { type: DataTypes.DOUBLE, allowNull: true },
        lastSampleUs: { type: DataTypes.DOUBLE, allowNull: true },
        gapThresholdS: { type: DataTypes.DOUBLE, allowNull: true },
        closedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'traces' },
    );
  }
}
