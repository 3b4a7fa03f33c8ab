import type { Knex } from 'knex'

// Grid checks: a scrutineer's record for one entry on one contest day — checklist answers,
// notes, outcome and the readiness it gave — and the weigh-ins taken with them. A phone that
// lost signal sends its queued checks later, each under the idempotency key it made, so a
// check sent twice is stored once. Two scrutineers checking one entry both get a row; the
// later check (by checked_at, the phone's time of checking) sets the entry's readiness.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('grid_checks', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.date('day').notNullable()
    t.uuid('idempotency_key').notNullable().unique()
    /** SHA-256 of the check as first received: a replay with another body is refused. */
    t.string('body_sha256', 64).notNullable()
    t.uuid('scrutineer_id').notNullable().references('users.id').onDelete('RESTRICT')
    t.timestamp('checked_at', { useTz: true }).notNullable()
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    /** [{ itemId, label, result: 'pass' | 'fail' | 'not-checked', note }] */
    t.jsonb('answers').notNullable().defaultTo('[]')
    t.text('notes').notNullable().defaultTo('')
    t.text('outcome').notNullable().checkIn(['pass', 'fail'])
    t.text('readiness').notNullable().checkIn(['ready', 'caution', 'held', 'unchecked'])
    /** The engine's findings when the check was recorded (blocking first). */
    t.jsonb('findings').notNullable().defaultTo('[]')
    /** How the scrutineer reached the entry: a scanned tag, a typed short code, the list. */
    t.text('found_by').checkIn(['scan', 'code', 'list'])
    t.index(['competition_id', 'day'])
    t.index(['entry_id', 'day', 'checked_at'])
  })
  await knex.schema.createTable('weigh_ins', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.uuid('grid_check_id').unique().references('grid_checks.id').onDelete('CASCADE')
    t.date('weighed_on').notNullable()
    t.text('units').notNullable().checkIn(['kg-m', 'lb-in'])
    /** [{ point, weight, arm }] in the units above. */
    t.jsonb('readings').notNullable()
    t.decimal('mass_kg', 8, 2).notNullable()
    t.decimal('cg_arm_m', 8, 4)
    t.uuid('weighed_by').notNullable().references('users.id').onDelete('RESTRICT')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['entry_id', 'weighed_on'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('weigh_ins')
  await knex.schema.dropTable('grid_checks')
}
