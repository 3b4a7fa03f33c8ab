import type { Knex } from 'knex'

// An accepted entry stays current until the end of the last contest day: its entrant updates
// units, documents, IGC files and contact data. The last such change after acceptance is kept
// on the entry, so the office and the desk see "changed since acceptance".
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('entries', (t) => {
    t.timestamp('changed_after_acceptance_at', { useTz: true })
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('entries', t => t.dropColumn('changed_after_acceptance_at'))
}
