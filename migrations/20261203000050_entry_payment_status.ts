import type { Knex } from 'knex'

// An entry's payment state, kept on the entry by the payment module (webhooks, refunds) so
// the staff entries table can filter and sort by it without adding up payments per row.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('entries', (t) => {
    t.text('payment_status').notNullable().defaultTo('unpaid')
    /** Paid minus refunded, in minor units of the competition's currency. */
    t.integer('paid_minor').notNullable().defaultTo(0)
    t.index(['competition_id', 'payment_status'])
  })
  await knex.raw(`ALTER TABLE entries ADD CONSTRAINT entries_payment_status_known
    CHECK (payment_status IN ('unpaid', 'paid', 'refunded'))`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('entries', (t) => {
    t.dropIndex(['competition_id', 'payment_status'])
    t.dropColumns('payment_status', 'paid_minor')
  })
}
