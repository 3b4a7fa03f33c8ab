import type { Knex } from 'knex'

// What an organiser sets up: registration window, late fee, practice and contest days.
// Rule settings stay in competitions.settings (jsonb, shape: shared/schemas/competition.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('competitions', (t) => {
    t.date('registration_opens_on')
    t.date('registration_closes_on')
    t.date('late_fee_after')
    t.integer('late_fee_minor').notNullable().defaultTo(0)
  })
  await knex.schema.createTable('competition_days', (t) => {
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.date('day').notNullable()
    t.text('kind').notNullable()
    t.primary(['competition_id', 'day'])
  })
  await knex.raw(`ALTER TABLE competition_days ADD CONSTRAINT competition_days_kind
    CHECK (kind IN ('practice', 'contest'))`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('competition_days')
  await knex.schema.alterTable('competitions', (t) => {
    t.dropColumns('registration_opens_on', 'registration_closes_on', 'late_fee_after', 'late_fee_minor')
  })
}
