import type { Knex } from 'knex'

// People and their sign-in sessions. A session row lets sign-out revoke a cookie for good.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('CREATE EXTENSION IF NOT EXISTS pgcrypto')
  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.text('email').notNullable()
    t.text('name').notNullable()
    t.text('password_hash').notNullable()
    t.boolean('is_admin').notNullable().defaultTo(false)
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
  })
  // E-mail addresses are unique regardless of case.
  await knex.raw('CREATE UNIQUE INDEX users_email_lower_unique ON users (lower(email))')

  await knex.schema.createTable('user_sessions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('last_seen_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('revoked_at', { useTz: true })
    t.text('user_agent')
    t.text('ip_address')
    t.index(['user_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('user_sessions')
  await knex.schema.dropTable('users')
}
