import type { Knex } from 'knex'

// A competition and its classes. Contest days are calendar dates in the competition's own
// time zone, so they are stored as `date`, never as instants.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('competitions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.text('slug').notNullable().unique()
    t.text('name').notNullable()
    t.text('airfield_name').notNullable()
    t.string('airfield_icao', 4)
    t.text('time_zone').notNullable()
    t.date('first_contest_day')
    t.date('last_contest_day')
    t.string('currency', 3).notNullable().defaultTo('EUR')
    // Rule settings (firmware margin, required documents, …) as later issues define them.
    t.jsonb('settings').notNullable().defaultTo('{}')
    t.uuid('created_by').references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
  })
  await knex.raw(`ALTER TABLE competitions ADD CONSTRAINT competitions_days_ordered
    CHECK (first_contest_day IS NULL OR last_contest_day IS NULL OR first_contest_day <= last_contest_day)`)

  await knex.schema.createTable('classes', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.text('name').notNullable()
    // Key of the class in our FAI class list, or 'custom'.
    t.text('code').notNullable()
    t.decimal('max_span_m', 5, 2)
    t.decimal('max_mtom_kg', 6, 1)
    t.boolean('water_ballast').notNullable().defaultTo(true)
    t.integer('entry_fee_minor').notNullable().defaultTo(0)
    t.integer('sort_order').notNullable().defaultTo(0)
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.unique(['competition_id', 'name'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('classes')
  await knex.schema.dropTable('competitions')
}
