import type { Knex } from 'knex'

// IGC files an entrant uploads from each flight recorder, with the parsed header (IGC GNSS FR
// specification Appendix A, H records) kept beside the stored file for the declaration checks.
// A newer file from the same recorder (or, without a recorder, of the entry) supersedes the
// current one, which stays as history.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('igc_files', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('unit_id').references('units.id').onDelete('SET NULL')
    t.text('original_filename').notNullable()
    t.text('storage_key').notNullable().unique()
    t.string('sha256', 64).notNullable()
    t.integer('size_bytes').notNullable()
    t.date('flight_date')
    t.text('pilot')
    t.text('copilot')
    t.text('glider_type')
    /** HFGID: the glider's registration as the recorder declares it. */
    t.text('glider_id')
    /** HFCID: the competition ID as declared. */
    t.text('declared_comp_id')
    /** HFCCL: the competition class as declared. */
    t.text('declared_class')
    t.text('recorder_type')
    t.text('firmware_version')
    t.boolean('has_g_record').notNullable().defaultTo(false)
    /** Lenient-mode parse errors: [{ line, message }]. */
    t.jsonb('parse_errors').notNullable().defaultTo('[]')
    t.uuid('uploaded_by').notNullable().references('users.id').onDelete('RESTRICT')
    t.timestamp('uploaded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.uuid('replaced_by').references('igc_files.id').onDelete('SET NULL')
    t.boolean('superseded').notNullable().defaultTo(false)
    t.index(['entry_id'])
  })
  await knex.raw(`CREATE UNIQUE INDEX igc_files_current_unit ON igc_files (entry_id, coalesce(unit_id, '00000000-0000-0000-0000-000000000000'::uuid))
    WHERE NOT superseded`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('igc_files')
}
