import type { Knex } from 'knex'

// An entry: one glider in one class of one competition, with its pilot and crew.
// Competition IDs are kept unique by the application (409 on a clash) rather than by an
// index, so that the check engine can still report clashes that arrive another way.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('entries', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('class_id').notNullable().references('classes.id').onDelete('RESTRICT')
    t.uuid('entrant_user_id').notNullable().references('users.id').onDelete('RESTRICT')
    t.text('status').notNullable().defaultTo('draft')
    t.text('decision_reason')
    // Pilot in command, co-pilot, crew
    t.text('pilot_name').notNullable()
    t.string('pilot_nationality', 3)
    t.text('pilot_licence_number')
    t.text('pilot_phone')
    t.text('emergency_contact')
    t.text('copilot_name')
    t.specificType('crew_names', 'text[]').notNullable().defaultTo('{}')
    // Glider
    t.text('glider_type').notNullable()
    t.text('registration').notNullable()
    /** The competition ID painted on the glider (1–3 letters or digits). */
    t.string('comp_id', 3).notNullable()
    t.decimal('span_m', 5, 2)
    t.decimal('mtom_kg', 6, 1)
    t.decimal('empty_mass_kg', 6, 1)
    /** CG limits as lever arms from the datum, in metres (aft positive). */
    t.decimal('cg_forward_limit_m', 6, 3)
    t.decimal('cg_aft_limit_m', 6, 3)
    t.text('datum_description')
    t.timestamp('submitted_at', { useTz: true })
    t.timestamp('decided_at', { useTz: true })
    t.uuid('decided_by').references('users.id').onDelete('SET NULL')
    t.timestamp('withdrawn_at', { useTz: true })
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['competition_id', 'status'])
    t.index(['entrant_user_id'])
  })
  await knex.raw(`ALTER TABLE entries ADD CONSTRAINT entries_status_known
    CHECK (status IN ('draft', 'submitted', 'accepted', 'rejected', 'withdrawn'))`)
  await knex.raw('CREATE INDEX entries_comp_id ON entries (competition_id, upper(comp_id))')
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('entries')
}
