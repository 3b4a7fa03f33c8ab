// Reading the live board: the day it shows, the snapshot a screen fetches (the tiles as they
// were stored, in board order, at one sequence number), one entry's tile, and the open day's
// readiness of one entry as its entrant may see it.
import type { Knex } from 'knex'
import type { IsoDate } from '#shared/engine'
import type { BoardDay, BoardSnapshot, BoardTile, EntryDayReadiness } from '#shared/types/api-board'
import type { BoardDayRow, BoardTileRow } from '#shared/types/rows-board'
import { compareCompIds } from '#shared/utils/comp-id-order'
import { prepared, useDb } from '#server/utils/db'
import { actionsQuery, type BoardActionRow, type Instant, toTileAction } from '#domain/read-model/day-inputs'
import { iso } from '#domain/read-model/values'

// ---------------------------------------------------------------------------------------
// Days

const DAY_COLUMNS = [
  'd.competition_id', 'd.kind', 'd.opened_at', 'd.closed_at', 'd.opened_by', 'd.closed_by',
  'd.day',
  'o.name as opened_by_name', 'c.name as closed_by_name',
]

export type BoardDayJoinedRow = BoardDayRow & { opened_by_name: string, closed_by_name: string | null }

export function dayQuery(db: Knex, competitionId: string) {
  return db('board_days as d')
    .join('users as o', 'o.id', 'd.opened_by')
    .leftJoin('users as c', 'c.id', 'd.closed_by')
    .where('d.competition_id', competitionId)
    .select(DAY_COLUMNS)
}

export function toBoardDay(r: Omit<BoardDayJoinedRow, 'opened_at' | 'closed_at'> & { opened_at: Instant, closed_at: Instant | null }): BoardDay {
  return {
    day: r.day,
    kind: r.kind,
    status: r.closed_at ? 'closed' : 'open',
    openedAt: iso(r.opened_at),
    openedBy: r.opened_by_name,
    closedAt: iso(r.closed_at),
    closedBy: r.closed_by_name,
  }
}

/** The day the board shows: the one asked for, else the open day, else the latest opened. */
export async function boardDayOf(competitionId: string, day: IsoDate | undefined, db: Knex = useDb()): Promise<BoardDay | null> {
  const q = dayQuery(db, competitionId)
  if (day) q.where('d.day', day)
  else q.orderByRaw('d.closed_at is null desc, d.day desc')
  const row = await q.first() as BoardDayJoinedRow | undefined
  return row ? toBoardDay(row) : null
}

// ---------------------------------------------------------------------------------------
// Reading the board

export function toBoardTile(r: Pick<BoardTileRow, 'tile'> & { seq: string | number, updated_at: Instant }): BoardTile {
  return { ...r.tile, seq: Number(r.seq), updatedAt: iso(r.updated_at) }
}

/**
 * The board of one day at one sequence number, as the JSON text of a `BoardSnapshot`: what a
 * wall screen polls, so it is read in one statement and hardly touched on the way out. The
 * statement's parts share one snapshot, so the number and the tiles agree (a pushed change
 * numbered above it is news to the screen). Each tile is the text stored with it as the board
 * sends it (board_tiles.shown: the tile with `seq` and `updatedAt`, as `toBoardTile` makes it),
 * in board order (each tile's class order and competition ID are kept beside it); nothing
 * here parses a tile or serialises it again. The tiles come as rows beside one head row (day,
 * number, classes): a 1,000-tile board as one aggregated value is a single 400 KB message,
 * which the driver reassembles at twice the cost of 1,000 small rows.
 * The day is the one asked for, else the open day, else the latest opened (as `boardDayOf`).
 * The tiles' text read last is kept (`tilesRead`) and read again only when the board changed.
 */
export async function boardSnapshotJson(competition: { id: string, name: string, time_zone: string }, day?: IsoDate, db: Knex = useDb()): Promise<string> {
  const key = `${competition.id}/${day ?? ''}`
  const known = tilesRead.get(key)
  // Read by every screen as it connects and by every polling one: prepared once per connection.
  const { rows } = await prepared(db.raw(`with shown as (
      select d.competition_id, d.kind, d.opened_at, d.closed_at, d.opened_by, d.closed_by, d.day as day_date,
        d.day as day, o.name as opened_by_name, c.name as closed_by_name
      from board_days d join users o on o.id = d.opened_by left join users c on c.id = d.closed_by
      where d.competition_id = :competitionId ${day ? 'and d.day = :day' : ''}
      order by d.closed_at is null desc, d.day desc
      limit 1
    ),
    numbered as (
      select coalesce((select seq from board_sequences where competition_id = :competitionId), 0) as seq
    ),
    -- The board as it was when its tiles were read last: the same day, opened at the same time,
    -- at the same number (then its tiles are left out, and the ones kept are sent).
    same as (
      select ${known ? 's.day_date = :knownDay::date and s.opened_at = :knownOpenedAt::timestamptz and n.seq = :knownSeq' : 'false'} as unchanged
      from shown s, numbered n
    )
    select 0 as part, coalesce((select unchanged from same), false) as unchanged,
      (select json_build_object('competition_id', s.competition_id, 'kind', s.kind, 'opened_at', s.opened_at, 'closed_at', s.closed_at,
          'opened_by', s.opened_by, 'closed_by', s.closed_by, 'day', s.day, 'opened_by_name', s.opened_by_name, 'closed_by_name', s.closed_by_name)
        from shown s) as shown,
      (select seq from numbered) as seq,
      (select coalesce(json_agg(json_build_object('id', k.id, 'name', k.name) order by k.sort_order, k.name), '[]')
        from classes k where k.competition_id = :competitionId) as classes,
      null::text as tile, null::int as class_order, null::text as comp_id
    union all
    select 1, null, null, null, null, t.shown::text, t.class_order, t.comp_id
      from shown s join board_tiles t on t.competition_id = s.competition_id and t.day = s.day_date
      where not coalesce((select unchanged from same), false)`, {
    competitionId: competition.id,
    ...day ? { day } : {},
    ...known ? { knownDay: known.day, knownOpenedAt: known.openedAt, knownSeq: known.seq } : {},
  })) as {
    rows: {
      part: number
      unchanged: boolean | null
      // Timestamps inside JSON values arrive as text; toBoardDay reads them as instants.
      shown: (Omit<BoardDayJoinedRow, 'opened_at' | 'closed_at'> & { opened_at: string, closed_at: string | null }) | null
      seq: string | null
      classes: { id: string, name: string }[] | null
      tile: string | null
      class_order: number | null
      comp_id: string | null
    }[]
  }
  const top = rows.find(r => r.part === 0)
  const head: Omit<BoardSnapshot, 'tiles' | 'generatedAt'> = {
    competition: { id: competition.id, name: competition.name, timeZone: competition.time_zone },
    day: top!.shown ? toBoardDay(top!.shown) : null,
    seq: Number(top!.seq),
    classes: top!.classes ?? [],
  }
  const shown = top!.shown
  const now = shown ? { day: shown.day, openedAt: shown.opened_at, seq: head.seq } : null
  let tiles: string
  if (known && top!.unchanged) {
    // The statement sent no tiles: the board is as it was when they were read last.
    tiles = known.tiles
  }
  else {
    // In board order: here rather than in PostgreSQL, whose sort of 1,000 rows carrying their
    // tiles' text costs several times this one over the keys (the same order: comp-id-order.ts).
    const placed = rows.filter(r => r.part === 1)
    placed.sort((a, b) => a.class_order! - b.class_order! || compareCompIds(a.comp_id!, b.comp_id!))
    tiles = placed.map(r => r.tile!).join(',')
    if (now) keepTiles(key, { ...now, tiles })
  }
  // The keys in BoardSnapshot's order, with the tiles' text as it came.
  return `${JSON.stringify(head).slice(0, -1)},"tiles":[${tiles}],"generatedAt":${JSON.stringify(new Date().toISOString())}}`
}

/**
 * The tiles' text of the boards read last (by competition and the day asked for, in board
 * order, joined), with the day and the sequence number they were read at. Every change of a
 * day's tiles takes the competition's next number (transaction.ts, tiles.ts), so while the day
 * and the number are the same, so are the tiles (the day's opening time is compared too, should
 * the database be reset under a running server): the statement then leaves them out, and a
 * board of 1,000 tiles (some 400 KB) is not read again for every screen that asks while nothing
 * changed — the wall screens reconnecting after a restart, the polling ones. The statement
 * reads the number in the same snapshot as the rest, and each server keeps its own, so several
 * servers agree.
 */
const tilesRead = new Map<string, { day: string, openedAt: string, seq: number, tiles: string }>()
/** Boards kept at most (the oldest read goes first): a few competitions' days. */
const TILES_KEPT = 16

function keepTiles(key: string, value: { day: string, openedAt: string, seq: number, tiles: string }): void {
  tilesRead.delete(key)
  tilesRead.set(key, value)
  if (tilesRead.size > TILES_KEPT) tilesRead.delete(tilesRead.keys().next().value!)
}

/** The board of one day at one sequence number (see boardSnapshotJson), as an object. */
export async function boardSnapshot(competition: { id: string, name: string, time_zone: string }, day?: IsoDate, db: Knex = useDb()): Promise<BoardSnapshot> {
  return JSON.parse(await boardSnapshotJson(competition, day, db)) as BoardSnapshot
}

/** One entry's tile on a day, if it has one. */
export async function boardTileOf(competitionId: string, day: IsoDate, entryId: string, db: Knex = useDb()): Promise<BoardTile | null> {
  const row = await db('board_tiles').where({ competition_id: competitionId, day, entry_id: entryId }).first('seq', 'tile', 'updated_at')
  return row ? toBoardTile(row) : null
}

/** One entry on the open day's board, as its entrant may see it. */
export async function entryDayReadiness(competitionId: string, entryId: string, db: Knex = useDb()): Promise<EntryDayReadiness> {
  const row = await dayQuery(db, competitionId).whereNull('d.closed_at').first() as BoardDayJoinedRow | undefined
  const day = row ? toBoardDay(row) : null
  const [tile, actionRows] = day
    ? await Promise.all([boardTileOf(competitionId, day.day, entryId, db), actionsQuery(db, competitionId, day.day, [entryId]) as Promise<BoardActionRow[]>])
    : [null, []]
  // The director's actions that count today, so the entry page groups its findings as the board does.
  const actions = actionRows.map(toTileAction)
  return { day, readiness: tile?.readiness ?? null, headline: tile?.headline ?? null, hold: tile?.hold ?? null, lastCheck: tile?.lastCheck ?? null, actions }
}

/** The entries with a tile on a day's board (the accepted entries when the day was last refreshed). */
export async function entryIdsOnBoard(competitionId: string, day: IsoDate, db: Knex = useDb()): Promise<string[]> {
  const rows = await db('board_tiles').where({ competition_id: competitionId, day }).select('entry_id') as { entry_id: string }[]
  return rows.map(r => r.entry_id)
}
