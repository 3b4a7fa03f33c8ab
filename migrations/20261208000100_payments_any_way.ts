import type { Knex } from 'knex'

// Money taken any way. A payment is a card checkout (as before) or one the office records: a
// bank transfer, cash, another way, or a waiver of the fee (which counts towards "paid" but
// moves no money). Each refund is a row of its own, with its reason and who made it, so a
// payment can be refunded in parts. The entry keeps what its checks and tables read:
// paid_minor (money received, net of refunds, as before), waived_minor, and first_paid_on, the
// day of its first payment (the late fee is owed only by an entry that paid nothing by its date).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('payments', (t) => {
    t.text('method').notNullable().defaultTo('card')
    /** The bank's or the receipt's reference, as the office typed it. */
    t.text('reference')
    /** Why the fee was waived (waivers only). */
    t.text('reason')
    t.uuid('recorded_by').references('users.id').onDelete('SET NULL')
    /** The day the money arrived (recorded payments); a card payment's is its paid_at. */
    t.date('paid_on')
    /** The office's form sends one per submission, so a double click records once. */
    t.text('idempotency_key')
    t.unique(['entry_id', 'idempotency_key'])
  })
  await knex.raw('ALTER TABLE payments ALTER COLUMN session_id DROP NOT NULL')
  await knex.raw(`ALTER TABLE payments ADD CONSTRAINT payments_method_known
    CHECK (method IN ('card', 'bank-transfer', 'cash', 'other', 'waived'))`)
  // A card payment has its checkout session; a recorded one has none, and has its day.
  await knex.raw(`ALTER TABLE payments ADD CONSTRAINT payments_method_shape
    CHECK ((method = 'card') = (session_id IS NOT NULL) AND (method = 'card' OR paid_on IS NOT NULL))`)
  await knex.raw(`ALTER TABLE payments ADD CONSTRAINT payments_waiver_reason
    CHECK (method <> 'waived' OR length(btrim(coalesce(reason, ''))) > 0)`)

  await knex.schema.createTable('payment_refunds', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.uuid('payment_id').notNullable().references('payments.id').onDelete('CASCADE')
    t.integer('amount_minor').notNullable()
    /** Why; null only for a refund made at the payment service itself (or before reasons were kept). */
    t.text('reason')
    t.uuid('recorded_by').references('users.id').onDelete('SET NULL')
    /** pending while the payment service is asked (card), then succeeded or failed. */
    t.text('status').notNullable().defaultTo('succeeded')
    /** The payment service's refund id (card refunds). */
    t.text('service_refund_id').unique()
    t.text('idempotency_key')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('completed_at', { useTz: true })
    t.unique(['payment_id', 'idempotency_key'])
    t.index(['entry_id'])
    t.index(['competition_id'])
  })
  await knex.raw(`ALTER TABLE payment_refunds ADD CONSTRAINT payment_refunds_sane
    CHECK (amount_minor > 0 AND status IN ('pending', 'succeeded', 'failed'))`)
  // What was refunded before refunds had rows of their own.
  await knex.raw(`INSERT INTO payment_refunds (competition_id, entry_id, payment_id, amount_minor, status, service_refund_id, created_at, completed_at)
    SELECT competition_id, entry_id, id, refunded_minor, 'succeeded', refund_id, coalesce(refunded_at, updated_at), coalesce(refunded_at, updated_at)
    FROM payments WHERE refunded_minor > 0`)

  await knex.schema.alterTable('entries', (t) => {
    /** Waived by the office, net of waivers withdrawn; counts towards paid, never as money. */
    t.integer('waived_minor').notNullable().defaultTo(0)
    t.date('first_paid_on')
  })
  await knex.raw(`UPDATE entries e SET first_paid_on = p.first_day
    FROM (SELECT p.entry_id, min((p.paid_at AT TIME ZONE c.time_zone)::date) AS first_day
          FROM payments p JOIN competitions c ON c.id = p.competition_id
          WHERE p.status IN ('paid', 'refunded') AND p.paid_at IS NOT NULL GROUP BY p.entry_id) p
    WHERE p.entry_id = e.id`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('entries', t => t.dropColumns('waived_minor', 'first_paid_on'))
  await knex.schema.dropTable('payment_refunds')
  await knex('payments').whereNot('method', 'card').delete()
  await knex.raw('ALTER TABLE payments DROP CONSTRAINT payments_waiver_reason')
  await knex.raw('ALTER TABLE payments DROP CONSTRAINT payments_method_shape')
  await knex.raw('ALTER TABLE payments DROP CONSTRAINT payments_method_known')
  await knex.raw('ALTER TABLE payments ALTER COLUMN session_id SET NOT NULL')
  await knex.schema.alterTable('payments', (t) => {
    t.dropUnique(['entry_id', 'idempotency_key'])
    t.dropColumns('method', 'reference', 'reason', 'recorded_by', 'paid_on', 'idempotency_key')
  })
}
