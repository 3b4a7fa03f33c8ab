import type { Knex } from 'knex'

// What the checks of a scrutineering team read beside the first catalogue:
// - entries: a motor glider's means of propulsion; the pilot's and co-pilot's mass with
//   parachute (kg, from the registration weighing, entered by staff); the flight manual's lever
//   arms of the seats and of the water ballast (m from the datum, aft positive);
// - units: a flight recorder's IGC recorder ID (the A record's manufacturer code and serial id);
// - igc_files: the A record's recorder ID and the I record's extension codes;
// - weigh_ins: water ballast declared but not on the scales (weighed dry), kg.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('entries', (t) => {
    t.text('motor_glider').notNullable().defaultTo('none')
    t.decimal('pilot_mass_kg', 5, 1)
    t.decimal('copilot_mass_kg', 5, 1)
    t.decimal('pilot_arm_m', 6, 3)
    t.decimal('copilot_arm_m', 6, 3)
    t.decimal('ballast_arm_m', 6, 3)
  })
  await knex.raw(`ALTER TABLE entries ADD CONSTRAINT entries_motor_glider_known
    CHECK (motor_glider IN ('none', 'self-launching', 'sustainer', 'electric'))`)
  await knex.schema.alterTable('units', (t) => {
    t.string('igc_recorder_id', 6)
  })
  await knex.schema.alterTable('igc_files', (t) => {
    t.string('recorder_id', 6)
    t.specificType('extensions', 'text[]').notNullable().defaultTo('{}')
  })
  await knex.schema.alterTable('weigh_ins', (t) => {
    t.decimal('declared_ballast_kg', 5, 1).notNullable().defaultTo(0)
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('weigh_ins', t => t.dropColumn('declared_ballast_kg'))
  await knex.schema.alterTable('igc_files', t => t.dropColumns('recorder_id', 'extensions'))
  await knex.schema.alterTable('units', t => t.dropColumn('igc_recorder_id'))
  await knex.raw('ALTER TABLE entries DROP CONSTRAINT entries_motor_glider_known')
  await knex.schema.alterTable('entries', t => t.dropColumns('motor_glider', 'pilot_mass_kg', 'copilot_mass_kg', 'pilot_arm_m', 'copilot_arm_m', 'ballast_arm_m'))
}
