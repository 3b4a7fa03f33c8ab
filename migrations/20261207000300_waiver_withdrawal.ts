import type { Knex } from 'knex'

// A waiver can be withdrawn by the director, with a reason. The waiver row stays (who granted
// it, when and why remain on the record) and gains who withdrew it, when and why; from then on
// it lifts nothing. Only a waiver can be withdrawn, and only once, with a reason.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('director_actions', (t) => {
    t.timestamp('withdrawn_at', { useTz: true })
    t.uuid('withdrawn_by').references('users.id').onDelete('RESTRICT')
    t.text('withdrawal_reason')
  })
  await knex.raw(`ALTER TABLE director_actions ADD CONSTRAINT director_actions_withdrawal CHECK (
    (withdrawn_at IS NULL AND withdrawn_by IS NULL AND withdrawal_reason IS NULL)
    OR (kind = 'waiver' AND withdrawn_at IS NOT NULL AND withdrawn_by IS NOT NULL AND length(btrim(withdrawal_reason)) > 0)
  )`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE director_actions DROP CONSTRAINT director_actions_withdrawal')
  await knex.schema.alterTable('director_actions', t => t.dropColumns('withdrawn_at', 'withdrawn_by', 'withdrawal_reason'))
}
