import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

const id = { type: DataTypes.STRING(36), primaryKey: true, allowNull: false };
const timestamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const organisationRef = {
  type: DataTypes.STRING(36),
  allowNull: false,
  references: { model: 'organisations', key: 'id' },
  onDelete: 'CASCADE',
};

export async function up({ queryInterface: qi }: MigrationContext): Promise<void> {
  await qi.createTable('organisations', {
    id,
    name: { type: DataTypes.STRING(200), allowNull: false },
    ...timestamps,
  });
  await qi.createTable('users', {
    id,
    organisationId: organisationRef,
    email: { type: DataTypes.STRING(320), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(200), allowNull: false },
    role: { type: DataTypes.STRING(20), allowNull: false },
    passwordHash: { type: DataTypes.STRING(200), allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...timestamps,
  });
  await qi.createTable('sites', {
    id,
    organisationId: organisationRef,
    name: { type: DataTypes.STRING(200), allowNull: false },
    address: { type: DataTypes.TEXT, allowNull: true },
    clientContact: { type: DataTypes.TEXT, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('sites', ['organisationId', 'name']);
  await qi.createTable('circuits', {
    id,
    organisationId: organisationRef,
    siteId: { type: DataTypes.STRING(36), allowNull: false, references: { model: 'sites', key: 'id' }, onDelete: 'CASCADE' },
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
    ...timestamps,
  });
  await qi.addIndex('circuits', ['organisationId', 'siteId']);
  await qi.createTable('loads', {
    id,
    organisationId: organisationRef,
    circuitId: { type: DataTypes.STRING(36), allowNull: false, references: { model: 'circuits', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.STRING(200), allowNull: false },
    nameplateA: { type: DataTypes.DOUBLE, allowNull: true },
    nameplateW: { type: DataTypes.DOUBLE, allowNull: true },
    powerFactor: { type: DataTypes.DOUBLE, allowNull: true },
    connection: { type: DataTypes.STRING(30), allowNull: false },
    continuous: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    motorHp: { type: DataTypes.DOUBLE, allowNull: true },
    lockedRotorCode: { type: DataTypes.STRING(1), allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('loads', ['organisationId', 'circuitId']);
  await qi.createTable('traces', {
    id,
    organisationId: organisationRef,
    siteId: { type: DataTypes.STRING(36), allowNull: true, references: { model: 'sites', key: 'id' }, onDelete: 'SET NULL' },
    circuitId: { type: DataTypes.STRING(36), allowNull: true, references: { model: 'circuits', key: 'id' }, onDelete: 'SET NULL' },
    loadId: { type: DataTypes.STRING(36), allowNull: true, references: { model: 'loads', key: 'id' }, onDelete: 'SET NULL' },
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
    ...timestamps,
  });
  await qi.addIndex('traces', ['organisationId', 'createdAt']);
  await qi.addIndex('traces', ['organisationId', 'circuitId']);
}

export async function down({ queryInterface: qi }: MigrationContext): Promise<void> {
  for (const table of ['traces', 'loads', 'circuits', 'sites', 'users', 'organisations']) await qi.dropTable(table);
}
