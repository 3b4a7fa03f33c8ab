import type { Knex } from 'knex'

// Indexes behind the staff entries table: each sortable column within a competition, and the
// lower-case search columns. The search is a substring match (LIKE '%…%'), which a btree
// cannot serve; within one competition's rows (reached by competition_id) a scan of 1,000
// entries is quick, and the sorted indexes serve the first page without sorting them all.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`CREATE INDEX entries_table_comp_id ON entries (competition_id, lpad(upper(comp_id), 3, ' '))`)
  await knex.raw('CREATE INDEX entries_table_pilot ON entries (competition_id, lower(pilot_name))')
  await knex.raw('CREATE INDEX entries_table_registration ON entries (competition_id, lower(registration))')
  await knex.raw('CREATE INDEX entries_table_submitted ON entries (competition_id, submitted_at)')
  await knex.raw('CREATE INDEX entries_table_class ON entries (competition_id, class_id)')
  await knex.raw('CREATE INDEX entries_class_id ON entries (class_id)')
}

export async function down(knex: Knex): Promise<void> {
  for (const name of ['entries_table_comp_id', 'entries_table_pilot', 'entries_table_registration', 'entries_table_submitted', 'entries_table_class', 'entries_class_id']) {
    await knex.raw(`DROP INDEX IF EXISTS ${name}`)
  }
}
