import type { Knex } from 'knex'

// Who holds which role in which competition; one row per role held.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('memberships', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.text('role').notNullable()
    t.uuid('granted_by').references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.unique(['user_id', 'competition_id', 'role'])
    t.index(['competition_id', 'role'])
  })
  await knex.raw(`ALTER TABLE memberships ADD CONSTRAINT memberships_role_known
    CHECK (role IN ('organiser', 'scrutineer', 'director', 'entrant'))`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('memberships')
}
