import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const CHUNK_ENCODINGS = ['uniform', 'explicit'] as const;
export type ChunkEncoding = (typeof CHUNK_ENCODINGS)[number];

/**
 * One chunk of a trace's samples (up to 4,096): where it sits in time, how its timestamps are encoded
 * and its mergeable summary in raw probe units (see api/src/storage). The samples themselves are in
 * TraceChunkData, so that summary scans never read blobs.
 */
export class TraceChunk extends Model<InferAttributes<TraceChunk>, InferCreationAttributes<TraceChunk>> {
  declare traceId: string;
  /** 0, 1, 2… in time order within the trace. */
  declare seq: number;
  declare organisationId: string;
  /** `uniform`: time of sample i = runStartUs + (runOffset + i) / rateHz; `explicit`: delta-encoded times. */
  declare encoding: ChunkEncoding;
  declare count: number;
  /** Time of the first and last sample, microseconds since the Unix epoch. */
  declare firstUs: number;
  declare lastUs: number;
  declare runStartUs: number | null;
  declare runOffset: number | null;
  declare rateHz: number | null;
  declare mean: number;
  declare m2: number;
  declare minValue: number;
  declare minTimeS: number;
  declare maxValue: number;
  declare maxTimeS: number;
  declare firstTimeS: number;
  declare firstValue: number;
  declare lastTimeS: number;
  declare lastValue: number;
  declare coveredTimeS: number;
  declare integral: number;
  declare integral2: number;
  declare gapCount: number;
  declare gapTimeS: number;
  declare longestGapStartS: number | null;
  declare longestGapEndS: number | null;

  static initModel(sequelize: Sequelize) {
    // Fresh objects per attribute: Sequelize writes into attribute definitions.
    const real = () => ({ type: DataTypes.DOUBLE, allowNull: false });
    const optionalReal = () => ({ type: DataTypes.DOUBLE, allowNull: true });
    return TraceChunk.init(
      {
        traceId: { type: DataTypes.STRING(36), primaryKey: true },
        seq: { type: DataTypes.INTEGER, primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        encoding: { type: DataTypes.STRING(10), allowNull: false },
        count: { type: DataTypes.INTEGER, allowNull: false },
        firstUs: real(),
        lastUs: real(),
        runStartUs: optionalReal(),
        runOffset: { type: DataTypes.INTEGER, allowNull: true },
        rateHz: optionalReal(),
        mean: real(),
        m2: real(),
        minValue: real(),
        minTimeS: real(),
        maxValue: real(),
        maxTimeS: real(),
        firstTimeS: real(),
        firstValue: real(),
        lastTimeS: real(),
        lastValue: real(),
        coveredTimeS: real(),
        integral: real(),
        integral2: real(),
        gapCount: { type: DataTypes.INTEGER, allowNull: false },
        gapTimeS: real(),
        longestGapStartS: optionalReal(),
        longestGapEndS: optionalReal(),
      },
      { sequelize, tableName: 'trace_chunks', timestamps: false },
    );
  }
}
