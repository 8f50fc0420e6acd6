import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';

const migrationsDir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

export interface MigrationContext {
  queryInterface: QueryInterface;
  sequelize: Sequelize;
}

/** A migration module: `api/src/db/migrations/NNNN-verb-noun.ts` exporting `up` (and `down`). */
export interface MigrationModule {
  up(ctx: MigrationContext): Promise<void>;
  down?(ctx: MigrationContext): Promise<void>;
}

export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: {
      glob: ['[0-9][0-9][0-9][0-9]-*.{ts,js}', { cwd: migrationsDir, ignore: ['**/*.test.*', '**/*.d.ts'] }],
      resolve: ({ name, path: file, context }) => ({
        name: name.replace(/\.(ts|js)$/, ''),
        up: async () => {
          const mod = (await import(pathToFileURL(file!).href)) as MigrationModule;
          return mod.up(context);
        },
        down: async () => {
          const mod = (await import(pathToFileURL(file!).href)) as MigrationModule;
          if (!mod.down) throw new Error(`Migration ${name} cannot be undone`);
          return mod.down(context);
        },
      }),
    },
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

/** Applies every pending migration, in name order. */
export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const applied = await createMigrator(sequelize).up();
  return applied.map((m) => m.name);
}
