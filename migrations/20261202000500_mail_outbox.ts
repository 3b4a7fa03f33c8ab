import type { Knex } from 'knex'

// Outgoing e-mail, written in the transaction of the event it reports and sent by a worker
// with retries, so a message survives an SMTP outage.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.bigIncrements('id').primary()
    t.text('to_address').notNullable()
    t.text('subject').notNullable()
    t.text('text_body').notNullable()
    t.text('html_body')
    /** Which message this is (invitation, entry-submitted, …), for tests and the audit. */
    t.text('template').notNullable()
    t.uuid('competition_id')
    t.uuid('entry_id')
    t.integer('attempts').notNullable().defaultTo(0)
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('sent_at', { useTz: true })
    t.text('last_error')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
  })
  await knex.raw('CREATE INDEX mail_outbox_due ON mail_outbox (next_attempt_at) WHERE sent_at IS NULL')
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mail_outbox')
}
