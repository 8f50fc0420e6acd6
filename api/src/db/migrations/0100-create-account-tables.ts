import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const id = { type: DataTypes.STRING(36), primaryKey: true, allowNull: false };
const organisationRef = {
  type: DataTypes.STRING(36),
  allowNull: false,
  references: { model: 'organisations', key: 'id' },
  onDelete: 'CASCADE',
};
const userRef = (allowNull: boolean) => ({
  type: DataTypes.STRING(36),
  allowNull,
  references: { model: 'users', key: 'id' },
  onDelete: allowNull ? 'SET NULL' : 'CASCADE',
});
const createdAt = { type: DataTypes.DATE, allowNull: false };

/**
 * Sessions, API keys (with the addresses each key was used from), one-time tokens for invitations and
 * password resets, and the audit log. Every secret is stored only as a SHA-256 hash.
 */
export async function up({ queryInterface: qi }: MigrationContext): Promise<void> {
  await qi.createTable('sessions', {
    id,
    organisationId: organisationRef,
    userId: userRef(false),
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt,
  });
  await qi.addIndex('sessions', ['userId']);

  await qi.createTable('api_keys', {
    id: { type: DataTypes.STRING(16), primaryKey: true, allowNull: false },
    organisationId: organisationRef,
    name: { type: DataTypes.STRING(200), allowNull: false },
    scopes: { type: DataTypes.JSON, allowNull: false },
    secretHash: { type: DataTypes.STRING(64), allowNull: false },
    createdByUserId: userRef(true),
    expiresAt: { type: DataTypes.DATE, allowNull: true },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    rotatedAt: { type: DataTypes.DATE, allowNull: true },
    lastUsedAt: { type: DataTypes.DATE, allowNull: true },
    lastUsedFrom: { type: DataTypes.STRING(64), allowNull: true },
    createdAt,
  });
  await qi.addIndex('api_keys', ['organisationId', 'createdAt']);

  await qi.createTable('api_key_addresses', {
    apiKeyId: { type: DataTypes.STRING(16), allowNull: false, primaryKey: true, references: { model: 'api_keys', key: 'id' }, onDelete: 'CASCADE' },
    address: { type: DataTypes.STRING(64), allowNull: false, primaryKey: true },
    firstSeenAt: { type: DataTypes.DATE, allowNull: false },
  });

  await qi.createTable('one_time_tokens', {
    id,
    organisationId: organisationRef,
    userId: userRef(false),
    purpose: { type: DataTypes.STRING(20), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt,
  });
  await qi.addIndex('one_time_tokens', ['userId', 'purpose']);

  await qi.createTable('audit_events', {
    id,
    organisationId: organisationRef,
    action: { type: DataTypes.STRING(60), allowNull: false },
    actorKind: { type: DataTypes.STRING(10), allowNull: false },
    actorId: { type: DataTypes.STRING(36), allowNull: true },
    actorLabel: { type: DataTypes.STRING(320), allowNull: true },
    targetKind: { type: DataTypes.STRING(20), allowNull: true },
    targetId: { type: DataTypes.STRING(36), allowNull: true },
    targetLabel: { type: DataTypes.STRING(320), allowNull: true },
    address: { type: DataTypes.STRING(64), allowNull: true },
    details: { type: DataTypes.JSON, allowNull: true },
    createdAt,
  });
  await qi.addIndex('audit_events', ['organisationId', 'createdAt']);
}

export async function down({ queryInterface: qi }: MigrationContext): Promise<void> {
  for (const table of ['audit_events', 'one_time_tokens', 'api_key_addresses', 'api_keys', 'sessions']) await qi.dropTable(table);
}
