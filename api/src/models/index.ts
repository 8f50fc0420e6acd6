import type { Sequelize } from 'sequelize';
import { Circuit } from './circuit.js';
import { Load } from './load.js';
import { Organisation } from './organisation.js';
import { Site } from './site.js';
import { Trace } from './trace.js';
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
  };
  return models;
}

export type Models = ReturnType<typeof initModels>;
