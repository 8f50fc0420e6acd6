import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const traceRef = {
  type: DataTypes.STRING(36),
  allowNull: false,
  references: { model: 'traces', key: 'id' },
  onDelete: 'CASCADE',
};
const organisationRef = {
  type: DataTypes.STRING(36),
  allowNull: false,
  references: { model: 'organisations', key: 'id' },
  onDelete: 'CASCADE',
};
const real = (allowNull = false) => ({ type: DataTypes.DOUBLE, allowNull });

/**
 * Sample storage (api/src/storage): chunk summaries and chunk data in two tables, so that window
 * statistics scan small summary rows and never page through the blobs; idempotency records for
 * retried POSTs; the stored result of closing a trace; and the per-trace storage state on `traces`.
 * Times are microseconds since the Unix epoch held in DOUBLE columns (exact integers below 2^53 on
 * every dialect, and plain numbers from the PostgreSQL driver, unlike BIGINT).
 */
export async function up({ queryInterface: qi }: MigrationContext): Promise<void> {
  await qi.addColumn('traces', 'sampleCount', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 });
  await qi.addColumn('traces', 'chunkCount', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 });
  await qi.addColumn('traces', 'originUs', real(true));
  await qi.addColumn('traces', 'firstSampleUs', real(true));
  await qi.addColumn('traces', 'lastSampleUs', real(true));
  await qi.addColumn('traces', 'gapThresholdS', real(true));
  await qi.addColumn('traces', 'closedAt', { type: DataTypes.DATE, allowNull: true });
  await qi.addIndex('traces', ['organisationId', 'siteId']);
  await qi.addIndex('traces', ['organisationId', 'loadId']);
  await qi.addIndex('traces', ['organisationId', 'status']);

  // One row per chunk of up to 4,096 samples: where it sits, how its times are encoded, and its
  // mergeable summary (raw probe units; times in seconds from the trace's origin).
  await qi.createTable('trace_chunks', {
    traceId: { ...traceRef, primaryKey: true },
    seq: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    organisationId: organisationRef,
    encoding: { type: DataTypes.STRING(10), allowNull: false },
    count: { type: DataTypes.INTEGER, allowNull: false },
    firstUs: real(),
    lastUs: real(),
    runStartUs: real(true),
    runOffset: { type: DataTypes.INTEGER, allowNull: true },
    rateHz: real(true),
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
    longestGapStartS: real(true),
    longestGapEndS: real(true),
  });
  await qi.addIndex('trace_chunks', ['traceId', 'lastUs']);

  // The samples of each chunk: a min/max/mean envelope per 64 samples, delta-encoded times (explicit
  // chunks only) and float32 values. Blobs last, so a row's small columns sit on its first page.
  await qi.createTable('trace_chunk_data', {
    traceId: { ...traceRef, primaryKey: true },
    seq: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    envelope: { type: DataTypes.BLOB, allowNull: false },
    times: { type: DataTypes.BLOB, allowNull: true },
    samples: { type: DataTypes.BLOB, allowNull: false },
  });

  await qi.createTable('idempotency_keys', {
    organisationId: { ...organisationRef, primaryKey: true },
    key: { type: DataTypes.STRING(255), allowNull: false, primaryKey: true },
    operation: { type: DataTypes.STRING(80), allowNull: false },
    fingerprint: { type: DataTypes.STRING(64), allowNull: false },
    status: { type: DataTypes.INTEGER, allowNull: false },
    response: { type: DataTypes.TEXT, allowNull: false },
    createdAt: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('idempotency_keys', ['createdAt']);

  await qi.createTable('trace_analyses', {
    traceId: { ...traceRef, primaryKey: true },
    organisationId: organisationRef,
    result: { type: DataTypes.JSON, allowNull: false },
    rmsTimesS: { type: DataTypes.BLOB, allowNull: true },
    rmsValuesA: { type: DataTypes.BLOB, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down({ queryInterface: qi }: MigrationContext): Promise<void> {
  for (const table of ['trace_analyses', 'idempotency_keys', 'trace_chunk_data', 'trace_chunks']) await qi.dropTable(table);
  await qi.removeIndex('traces', ['organisationId', 'siteId']);
  await qi.removeIndex('traces', ['organisationId', 'loadId']);
  await qi.removeIndex('traces', ['organisationId', 'status']);
  for (const column of ['closedAt', 'gapThresholdS', 'lastSampleUs', 'firstSampleUs', 'originUs', 'chunkCount', 'sampleCount']) {
    await qi.removeColumn('traces', column);
  }
}
