import type { Knex } from 'knex'

// The contest director's holds, releases and waivers. Rows are only ever added: a release
// follows a hold, it does not delete it, so the record of who decided what stays whole (the
// audit log says the same in its own words). A waiver names one finding — its check, and the
// unit or subject it is about — for one day, or for the whole competition when day is null.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('director_actions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.text('kind').notNullable().checkIn(['hold', 'release', 'waiver'])
    t.date('day')
    t.text('check_id')
    t.text('unit_id')
    t.text('subject')
    t.text('reason').notNullable()
    /** The waived finding as it read when waived (severity, reason), for the record. */
    t.jsonb('finding')
    t.uuid('actor_id').notNullable().references('users.id').onDelete('RESTRICT')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['competition_id', 'entry_id', 'created_at'])
  })
  await knex.raw(`ALTER TABLE director_actions ADD CONSTRAINT director_actions_shape CHECK (
    (kind IN ('hold', 'release') AND day IS NOT NULL AND check_id IS NULL)
    OR (kind = 'waiver' AND check_id IS NOT NULL)
  )`)
  await knex.raw(`ALTER TABLE director_actions ADD CONSTRAINT director_actions_reason CHECK (length(btrim(reason)) > 0)`)
  // The entry's timeline reads the audit log by entry.
  await knex.raw(`CREATE INDEX audit_log_entry ON audit_log (competition_id, (details->>'entryId'), at)`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS audit_log_entry')
  await knex.schema.dropTable('director_actions')
}
