import type { Config } from '../config/config.js';
import type { Db } from '../db/open.js';
import { createCircuitsService } from './circuits.js';
import { createSitesService } from './sites.js';

/** Every service, built once per app. Services are the only users of the models. */
export function createServices(db: Db, _config: Config) {
  const sites = createSitesService(db);
  const circuits = createCircuitsService(db, sites);
  return { db, sites, circuits };
}

export type Services = ReturnType<typeof createServices>;
