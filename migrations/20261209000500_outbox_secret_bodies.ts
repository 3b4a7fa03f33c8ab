import type { Knex } from 'knex'

// An e-mail whose body carries a one-time link (an invitation) is marked secret: the worker
// empties its body once the message is sent, so the outbox never keeps a usable link. The
// invitation e-mails already sent lose their bodies now; those still waiting are marked.
const FORGOTTEN = 'This message held a one-time link. Its text was removed once it was sent.'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('mail_outbox', (t) => {
    /** Empty the body once sent: it carries a link that must not be kept. */
    t.boolean('secret_body').notNullable().defaultTo(false)
  })
  await knex('mail_outbox').where({ template: 'invitation' }).update({ secret_body: true })
  await knex('mail_outbox').where({ secret_body: true }).whereNotNull('sent_at')
    .update({ text_body: FORGOTTEN, html_body: null })
}

export async function down(knex: Knex): Promise<void> {
  // The emptied bodies cannot come back; only the mark goes.
  await knex.schema.alterTable('mail_outbox', (t) => {
    t.dropColumn('secret_body')
  })
}
