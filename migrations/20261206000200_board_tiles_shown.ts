import type { Knex } from 'knex'

// Each tile also as the board sends it — with its number and the time of its last change —
// written with the tile, so a wall screen's poll of a 1,000-tile board joins stored text and
// builds nothing per tile. A row without it (written some other way) is built in the query.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE board_tiles ADD COLUMN shown json')
  await knex.raw(`UPDATE board_tiles SET shown = (left(rtrim(tile::text), -1) || ',"seq":' || seq
    || ',"updatedAt":"' || to_char(updated_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') || '"}')::json`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE board_tiles DROP COLUMN shown')
}
