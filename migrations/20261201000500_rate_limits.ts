import type { Knex } from 'knex'

// Counters of sign-in attempts, shared by every app instance (rate-limiter-flexible's
// PostgreSQL store, whose table layout this is; the app passes tableCreated: true).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`CREATE TABLE rate_limits (
    key varchar(255) PRIMARY KEY,
    points integer NOT NULL DEFAULT 0,
    expire bigint
  )`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('rate_limits')
}
