import type { Knex } from 'knex'

// The live board. A contest (or practice) day is opened and closed by the director; while it
// is open every accepted entry has a tile: the readiness and what the board shows of it, kept
// up to date in the transaction of each change (grid check, director's action, dossier edit),
// so the wall screen reads one table instead of running the engine over every dossier. Each
// change of a competition's board takes the next number of its sequence, so a screen that
// missed a pushed change sees the gap and fetches the board again.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('board_days', (t) => {
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.date('day').notNullable()
    t.text('kind').notNullable().checkIn(['practice', 'contest'])
    t.timestamp('opened_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.uuid('opened_by').notNullable().references('users.id').onDelete('RESTRICT')
    t.timestamp('closed_at', { useTz: true })
    t.uuid('closed_by').references('users.id').onDelete('RESTRICT')
    t.primary(['competition_id', 'day'])
  })
  // One open day per competition: the board always knows which day it shows.
  await knex.raw('CREATE UNIQUE INDEX board_days_one_open ON board_days (competition_id) WHERE closed_at IS NULL')

  await knex.schema.createTable('board_sequences', (t) => {
    t.uuid('competition_id').primary().references('competitions.id').onDelete('CASCADE')
    t.bigInteger('seq').notNullable().defaultTo(0)
  })

  // Tiles are kept as the text they were written (json, not jsonb, which would reorder keys):
  // a tile read back compares equal with the same tile built again, so an unchanged tile is
  // neither renumbered nor pushed; and a 1,000-tile board is sent by joining stored text.
  await knex.schema.createTable('board_tiles', (t) => {
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.date('day').notNullable()
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    /** The board sequence number of the tile's last change. */
    t.bigInteger('seq').notNullable()
    t.text('readiness').notNullable().checkIn(['ready', 'caution', 'held', 'unchecked'])
    /** The tile as the board shows it (shared/types/api-board.ts, BoardTile without seq and time). */
    t.json('tile').notNullable()
    /** The tile as the board sends it: with its number and the time of its last change. */
    t.json('shown').notNullable()
    /** The engine's findings the tile was made from, to record what changed next time. */
    t.json('findings').notNullable().defaultTo('[]')
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.primary(['competition_id', 'day', 'entry_id'])
  })
  // Competition IDs in the order people read them: 3, 7, 12, A2, A10, AB (ICU, numbers by value).
  await knex.raw(`CREATE COLLATION IF NOT EXISTS comp_id_order (provider = icu, locale = 'und-u-kn-true')`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP COLLATION IF EXISTS comp_id_order')
  await knex.schema.dropTable('board_tiles')
  await knex.schema.dropTable('board_sequences')
  await knex.schema.dropTable('board_days')
}
