import type { Knex } from 'knex'

// The table @socket.io/postgres-adapter keeps socket events in when they are too large for a
// PostgreSQL notification (8,000 bytes), so every app instance can pass them on to its
// screens. The adapter deletes old rows itself.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`CREATE TABLE IF NOT EXISTS socket_io_attachments (
    id bigserial UNIQUE,
    created_at timestamptz DEFAULT now(),
    payload bytea
  )`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('socket_io_attachments')
}
