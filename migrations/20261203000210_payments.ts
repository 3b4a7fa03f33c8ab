import type { Knex } from 'knex'

// Card payments of entry fees, and the payment service's notifications already processed.
// payment_events' primary key is what makes each notification count exactly once: it is
// inserted in the same transaction as the change the notification causes.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('payments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.uuid('created_by').references('users.id').onDelete('SET NULL')
    /** The payment service's checkout session. */
    t.text('session_id').notNullable().unique()
    t.text('payment_intent').unique()
    /** In minor units of currency (cents). */
    t.integer('amount_minor').notNullable()
    t.string('currency', 3).notNullable()
    t.text('status').notNullable().defaultTo('pending')
    t.integer('refunded_minor').notNullable().defaultTo(0)
    t.text('refund_id')
    t.timestamp('paid_at', { useTz: true })
    t.timestamp('refunded_at', { useTz: true })
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['entry_id'])
    t.index(['competition_id', 'status'])
  })
  await knex.raw(`ALTER TABLE payments ADD CONSTRAINT payments_status_known
    CHECK (status IN ('pending', 'paid', 'failed', 'refunded'))`)
  await knex.raw(`ALTER TABLE payments ADD CONSTRAINT payments_amounts_sane
    CHECK (amount_minor >= 0 AND refunded_minor >= 0 AND refunded_minor <= amount_minor)`)

  await knex.schema.createTable('payment_events', (t) => {
    t.text('event_id').primary()
    t.text('type').notNullable()
    t.uuid('payment_id').references('payments.id').onDelete('SET NULL')
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('payment_events')
  await knex.schema.dropTable('payments')
}
