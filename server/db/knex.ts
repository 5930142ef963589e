import knex, { type Knex } from 'knex';

export type Db = Knex;

export function createDb(databaseUrl: string): Db {
  return knex({
    client: 'pg',
    connection: { connectionString: databaseUrl, connectionTimeoutMillis: 2000 },
    // short acquire timeout: when PostgreSQL is down, requests fail fast with 503 instead of hanging
    pool: { min: 0, max: 10, acquireTimeoutMillis: 3000 },
    migrations: { directory: new URL('../../migrations', import.meta.url).pathname, loadExtensions: ['.ts'] },
    seeds: { directory: new URL('../../seeds', import.meta.url).pathname, loadExtensions: ['.ts'] },
  });
}
