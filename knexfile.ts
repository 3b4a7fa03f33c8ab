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

/** A whole number of milliseconds from the environment, or the default. */
function millis(name: string, fallback: number): number {
  const value = Number(process.env[name])
  return Number.isInteger(value) && value >= 0 ? value : fallback
}

/**
 * Every connection's limits. No statement runs longer than `statementTimeoutMs` and none waits
 * longer than `lockTimeoutMs` for a lock (PostgreSQL cancels it, the transaction rolls back and
 * the request answers 503 "busy"); a request waits at most `acquireTimeoutMs` for a free
 * connection of the pool. Migrations pass `timeouts: false`: a schema change on a large table
 * may rightly take long.
 */
export function databaseLimits() {
  return {
    poolMax: millis('GRIDMARK_DB_POOL_MAX', 10) || 10,
    acquireTimeoutMs: millis('GRIDMARK_DB_ACQUIRE_TIMEOUT_MS', 4000) || 4000,
    statementTimeoutMs: millis('GRIDMARK_DB_STATEMENT_TIMEOUT_MS', 30_000),
    lockTimeoutMs: millis('GRIDMARK_DB_LOCK_TIMEOUT_MS', 10_000),
  }
}

export function createKnexConfig(databaseUrl: string, options: { timeouts?: boolean } = {}): Knex.Config {
  const limits = databaseLimits()
  const timeouts = options.timeouts ?? true
  return {
    client: 'pg',
    connection: {
      connectionString: databaseUrl,
      // Fail fast while the database is down instead of hanging the request.
      connectionTimeoutMillis: 3000,
      application_name: 'gridmark',
      types,
      // Sent with the connection's start-up, so they hold for every statement on it (0: none).
      ...(timeouts ? { statement_timeout: limits.statementTimeoutMs, lock_timeout: limits.lockTimeoutMs } : {}),
    },
    pool: { min: 0, max: limits.poolMax },
    acquireConnectionTimeout: limits.acquireTimeoutMs,
    migrations: { migrationSource, tableName: 'knex_migrations' },
  }
}

export default createKnexConfig(process.env.DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/gridmark')
