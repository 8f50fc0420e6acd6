import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * The result of closing a trace: the full analysis (statistics with percentiles, inrush events,
 * surges, waveform figures) as JSON, and for waveform traces the half-cycle RMS series as float32 blobs.
 */
export class TraceAnalysis extends Model<InferAttributes<TraceAnalysis>, InferCreationAttributes<TraceAnalysis>> {
  declare traceId: string;
  declare organisationId: string;
  declare result: Record<string, unknown>;
  /** Little-endian float64 seconds from the trace's origin (waveform traces). */
  declare rmsTimesS: Buffer | null;
  /** Little-endian float32 amperes (waveform traces). */
  declare rmsValuesA: Buffer | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return TraceAnalysis.init(
      {
        traceId: { type: DataTypes.STRING(36), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        result: { type: DataTypes.JSON, allowNull: false },
        rmsTimesS: { type: DataTypes.BLOB, allowNull: true },
        rmsValuesA: { type: DataTypes.BLOB, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'trace_analyses' },
    );
  }
}
