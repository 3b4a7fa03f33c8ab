import type { Knex } from 'knex'

// Each tile carries its place on the board — its class's order and its competition ID — so a
// wall screen's board is read from board_tiles alone, without joining entries and classes for
// every one of 1,000 tiles on every read. refreshTiles keeps both up to date (a competition ID
// is on the tile; a class moved rewrites its tiles).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`ALTER TABLE board_tiles
    ADD COLUMN class_order integer NOT NULL DEFAULT 0,
    ADD COLUMN comp_id varchar(3) NOT NULL DEFAULT ''`)
  await knex.raw(`UPDATE board_tiles t SET class_order = k.sort_order, comp_id = e.comp_id
    FROM entries e JOIN classes k ON k.id = e.class_id WHERE e.id = t.entry_id`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE board_tiles DROP COLUMN class_order, DROP COLUMN comp_id')
}
