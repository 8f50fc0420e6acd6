import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * The answer given to a POST that carried an `Idempotency-Key` header, so that a retry with the same
 * key gets the same answer and stores nothing twice. Kept for IDEMPOTENCY_TTL_HOURS (services/traces).
 */
export class IdempotencyKey extends Model<InferAttributes<IdempotencyKey>, InferCreationAttributes<IdempotencyKey>> {
  declare organisationId: string;
  declare key: string;
  /** The operation and target, e.g. `append-samples:<traceId>`. */
  declare operation: string;
  /** SHA-256 (hex) of the request: a key reused for a different request is refused. */
  declare fingerprint: string;
  declare status: number;
  /** The JSON body of the original answer. */
  declare response: string;
  declare createdAt: Date;

  static initModel(sequelize: Sequelize) {
    return IdempotencyKey.init(
      {
        organisationId: { type: DataTypes.STRING(36), primaryKey: true },
        key: { type: DataTypes.STRING(255), primaryKey: true },
        operation: { type: DataTypes.STRING(80), allowNull: false },
        fingerprint: { type: DataTypes.STRING(64), allowNull: false },
        status: { type: DataTypes.INTEGER, allowNull: false },
        response: { type: DataTypes.TEXT, allowNull: false },
        createdAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: 'idempotency_keys', timestamps: false },
    );
  }
}
