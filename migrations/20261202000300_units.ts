import type { Knex } from 'knex'

// Units fitted to an entry's glider: collision-warning units and flight recorders.
// competition_id is repeated here so radio IDs can be looked up across a competition.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('units', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.text('kind').notNullable()
    t.text('model').notNullable()
    t.text('serial').notNullable()
    t.text('firmware_version')
    // collision-warning
    t.string('radio_id', 6)
    t.date('firmware_expires_on')
    t.date('firmware_updated_on')
    t.text('obstacle_db_version')
    t.date('obstacle_db_expires_on')
    // flight-recorder
    t.text('approval_level')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['entry_id'])
    t.index(['competition_id', 'radio_id'])
  })
  await knex.raw(`ALTER TABLE units ADD CONSTRAINT units_kind_known
    CHECK (kind IN ('collision-warning', 'flight-recorder'))`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('units')
}
