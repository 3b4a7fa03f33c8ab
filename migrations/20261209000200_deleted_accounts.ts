import type { Knex } from 'knex'

// A deleted account keeps its row, anonymised: grid checks, documents, tags and the audit log
// point at it, and the audit log must outlive the person. deleted_at marks it; the address
// becomes a placeholder, so the person's own address can sign up again.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.timestamp('deleted_at', { useTz: true })
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', t => t.dropColumn('deleted_at'))
}
