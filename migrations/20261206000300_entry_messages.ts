import type { Knex } from 'knex'

// Messages between an entrant and the office about one entry: the entrant asks for what only the
// office changes once the entry is accepted (class, competition ID, registration, glider type);
// the office answers. Kept here, not in the audit log (which holds ids, never free text).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('entry_messages', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.uuid('author_id').notNullable().references('users.id').onDelete('RESTRICT')
    /** Written by the office (an organiser) rather than the entrant. */
    t.boolean('from_office').notNullable()
    t.text('body').notNullable()
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['entry_id', 'created_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('entry_messages')
}
