import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** The samples of one chunk: envelope (min/max/mean per 64 samples), delta-encoded times, float32 values. */
export class TraceChunkData extends Model<InferAttributes<TraceChunkData>, InferCreationAttributes<TraceChunkData>> {
  declare traceId: string;
  declare seq: number;
  declare envelope: Buffer;
  /** Explicit chunks only: LEB128 varints of the microsecond steps after the first sample. */
  declare times: Buffer | null;
  /** Little-endian float32 raw readings. */
  declare samples: Buffer;

  static initModel(sequelize: Sequelize) {
    return TraceChunkData.init(
      {
        traceId: { type: DataTypes.STRING(36), primaryKey: true },
        seq: { type: DataTypes.INTEGER, primaryKey: true },
        envelope: { type: DataTypes.BLOB, allowNull: false },
        times: { type: DataTypes.BLOB, allowNull: true },
        samples: { type: DataTypes.BLOB, allowNull: false },
      },
      { sequelize, tableName: 'trace_chunk_data', timestamps: false },
    );
  }
}
