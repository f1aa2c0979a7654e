import knexFactory, { type Knex } from 'knex';
import { knexSnakeCaseMappers } from 'objection';
import path from 'node:path';
import pg from 'pg';
import { REPO_ROOT } from '../config';
import { logLine } from '../log';

// bigint (int8) ids arrive as strings by default; a lab's row counts stay far below 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (value) => Number(value));

export const MIGRATIONS_DIR = path.join(REPO_ROOT, 'migrations');

/** A knex instance; `createApp` binds the Objection models to the one the server uses. */
export function createKnex(databaseUrl: string, poolMax = 10): Knex {
  const knex = knexFactory({
    client: 'pg',
    connection: databaseUrl,
    pool: { min: 0, max: poolMax },
    acquireConnectionTimeout: 10_000,
    migrations: { directory: MIGRATIONS_DIR, loadExtensions: ['.ts'] },
    ...knexSnakeCaseMappers(),
    log: {
      warn: (message: string) => logLine(`knex: ${message}`),
      error: (message: string) => logLine(`knex: ${message}`),
      deprecate: (message: string) => logLine(`knex: ${message}`),
      debug: () => undefined,
    },
  });
  return knex;
}

export async function migrateToLatest(knex: Knex): Promise<string[]> {
  const [, applied] = (await knex.migrate.latest()) as [number, string[]];
  return applied;
}
