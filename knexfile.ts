// Knex configuration shared by the scripts, the tests and the built server. Migrations are
// imported statically (migrations/index.ts) so the bundled server needs no directory scan.
import type { Knex } from 'knex'
import { migrationSource } from './migrations/index'

export function createKnexConfig(databaseUrl: string): Knex.Config {
  return {
    client: 'pg',
    connection: {
      connectionString: databaseUrl,
      // Fail fast while the database is down instead of hanging the request.
      connectionTimeoutMillis: 3000,
      application_name: 'gridmark',
    },
    pool: { min: 0, max: Number(process.env.GRIDMARK_DB_POOL_MAX ?? 10) },
    acquireConnectionTimeout: 4000,
    migrations: { migrationSource, tableName: 'knex_migrations' },
  }
}

export default createKnexConfig(process.env.DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/gridmark')
