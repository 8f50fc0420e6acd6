import type { Sequelize } from 'sequelize';
import { ApiKey, ApiKeyAddress } from './api-key.js';
import { AuditEvent } from './audit-event.js';
import { Circuit } from './circuit.js';
import { Load } from './load.js';
import { OneTimeToken } from './one-time-token.js';
import { Organisation } from './organisation.js';
import { Session } from './session.js';
import { Site } from './site.js';
import { Trace } from './trace.js';
import { TraceAnalysis } from './trace-analysis.js';
import { TraceChunk } from './trace-chunk.js';
import { TraceChunkData } from './trace-chunk-data.js';
import { IdempotencyKey } from './idempotency-key.js';
import { User } from './user.js';

/**
 * Every model, initialised on one Sequelize instance. Sequelize models are classes bound to the
 * instance they were last initialised on, so one process runs one database (tests run one app per file).
 */
export function initModels(sequelize: Sequelize) {
  const models = {
    Organisation: Organisation.initModel(sequelize),
    User: User.initModel(sequelize),
    Site: Site.initModel(sequelize),
    Circuit: Circuit.initModel(sequelize),
    Load: Load.initModel(sequelize),
    Trace: Trace.initModel(sequelize),
    TraceChunk: TraceChunk.initModel(sequelize),
    TraceChunkData: TraceChunkData.initModel(sequelize),
    TraceAnalysis: TraceAnalysis.initModel(sequelize),
    IdempotencyKey: IdempotencyKey.initModel(sequelize),
    Session: Session.initModel(sequelize),
    ApiKey: ApiKey.initModel(sequelize),
    ApiKeyAddress: ApiKeyAddress.initModel(sequelize),
    OneTimeToken: OneTimeToken.initModel(sequelize),
    AuditEvent: AuditEvent.initModel(sequelize),
  };
  return models;
}

export type Models = ReturnType<typeof initModels>;
