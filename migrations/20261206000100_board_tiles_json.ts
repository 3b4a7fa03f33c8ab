import type { Knex } from 'knex'

// Board tiles are written once per change and read by every screen's poll, so they are kept as
// the text they were written (json), not re-encoded (jsonb): PostgreSQL hands a 1,000-tile
// board over without converting each tile back to text, the snapshot splices the stored text
// into its answer, and a tile read back compares equal, key for key, with the same tile built
// again (jsonb reorders keys, so an unchanged tile looked changed and was written and pushed
// again). Nothing queries inside these columns.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE board_tiles ALTER COLUMN tile TYPE json USING tile::json, ALTER COLUMN findings TYPE json USING findings::json')
  await knex.raw(`ALTER TABLE board_tiles ALTER COLUMN findings SET DEFAULT '[]'::json`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE board_tiles ALTER COLUMN tile TYPE jsonb USING tile::jsonb, ALTER COLUMN findings TYPE jsonb USING findings::jsonb')
  await knex.raw(`ALTER TABLE board_tiles ALTER COLUMN findings SET DEFAULT '[]'::jsonb`)
}
