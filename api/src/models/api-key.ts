import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const KEY_SCOPES = ['ingest', 'read'] as const;
export type KeyScope = (typeof KEY_SCOPES)[number];

/**
 * An integrator's API key. The id is the public part of the key (`hrk_<id>_<secret>`); only the SHA-256
 * hash of the secret is stored.
 */
export class ApiKey extends Model<InferAttributes<ApiKey>, InferCreationAttributes<ApiKey>> {
  declare id: string;
  declare organisationId: string;
  declare name: string;
  declare scopes: KeyScope[];
  declare secretHash: string;
  declare createdByUserId: string | null;
  declare expiresAt: Date | null;
  declare revokedAt: Date | null;
  declare rotatedAt: Date | null;
  declare lastUsedAt: Date | null;
  declare lastUsedFrom: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return ApiKey.init(
      {
        id: { type: DataTypes.STRING(16), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        name: { type: DataTypes.STRING(200), allowNull: false },
        scopes: { type: DataTypes.JSON, allowNull: false },
        secretHash: { type: DataTypes.STRING(64), allowNull: false },
        createdByUserId: { type: DataTypes.STRING(36), allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        rotatedAt: { type: DataTypes.DATE, allowNull: true },
        lastUsedAt: { type: DataTypes.DATE, allowNull: true },
        lastUsedFrom: { type: DataTypes.STRING(64), allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'api_keys', updatedAt: false },
    );
  }
}

/** An address an API key has been used from; a new one is written to the audit log. */
export class ApiKeyAddress extends Model<InferAttributes<ApiKeyAddress>, InferCreationAttributes<ApiKeyAddress>> {
  declare apiKeyId: string;
  declare address: string;
  declare firstSeenAt: Date;

  static initModel(sequelize: Sequelize) {
    return ApiKeyAddress.init(
      {
        apiKeyId: { type: DataTypes.STRING(16), primaryKey: true },
        address: { type: DataTypes.STRING(64), primaryKey: true },
        firstSeenAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: 'api_key_addresses', timestamps: false },
    );
  }
}
