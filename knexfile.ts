// Knex configuration shared by the scripts, the tests and the built server. Migrations are
// imported statically (migrations/index.ts) so the bundled server needs no directory scan.
import type { Knex } from 'knex'
import pg from 'pg'
import { migrationSource } from './migrations/index'

/**
 * A `date` column (contest days, expiry dates) is a calendar date, read as its YYYY-MM-DD text:
 * the driver's default would make it a Date at local midnight, which a time zone can shift.
 * Set here, once, for every connection; no query formats dates itself.
 */
const DATE_OID = 1082
const types = {
  getTypeParser: (oid: number, format: string) => (oid === DATE_OID ? (value: string) => value : pg.types.getTypeParser(oid, format as 'text')),
}

export function createKnexConfig(databaseUrl: string): Knex.Config {
  return {
    client: 'pg',
    connection: {
      connectionString: databaseUrl,
      // Fail fast while the database is down instead of hanging the request.
      connectionTimeoutMillis: 3000,
      application_name: 'gridmark',
      types,
    },
    pool: { min: 0, max: Number(process.env.GRIDMARK_DB_POOL_MAX ?? 10) },
    acquireConnectionTimeout: 4000,
    migrations: { migrationSource, tableName: 'knex_migrations' },
  }
}

export default createKnexConfig(process.env.DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/gridmark')
