import type { Knex } from 'knex'

// The organiser's list of known firmware releases, used to suggest and cross-check expiry dates.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('firmware_releases', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.text('unit_family').notNullable()
    t.text('version').notNullable()
    t.date('expires_on').notNullable()
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
  })
  await knex.raw(`CREATE UNIQUE INDEX firmware_releases_unique
    ON firmware_releases (competition_id, lower(unit_family), lower(version))`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('firmware_releases')
}
