// What a day's tiles are made of besides the dossiers, read by the board, the grid check and
// the phone's grid pack with the same statements: each entry's latest grid check of the day,
// the director's actions that count that day, each tile as it stands and its entrant, the
// order of the classes and the competition's last sequence number.
import type { Knex } from 'knex'
import type { IsoDate } from '#shared/engine'
import type { BoardTileRow } from '#shared/types/rows-board'
import type { GridCheckAnswerJson } from '#shared/types/rows-grid'
import type { TileAction } from '#shared/utils/board-tile'
import { iso } from './values'

/** A timestamp as the driver reads a column (Date), or as JSON text when read inside a JSON value. */
export type Instant = Date | string

/** A subquery: the id of each entry's latest check of the day (the one that sets its readiness). */
export function latestGridCheckIds(db: Knex, competitionId: string, day: IsoDate) {
  return db('grid_checks').where({ competition_id: competitionId, day })
    .distinctOn('entry_id')
    .orderBy([{ column: 'entry_id' }, { column: 'checked_at', order: 'desc' }, { column: 'received_at', order: 'desc' }, { column: 'id', order: 'desc' }])
    .select('id')
}

export interface CheckRow {
  entry_id: string
  day: string
  checked_at: Instant
  outcome: 'pass' | 'fail'
  answers: GridCheckAnswerJson[]
  scrutineer_name: string
}

export interface BoardActionRow {
  id: string
  entry_id: string
  kind: 'hold' | 'release' | 'waiver'
  day: string | null
  check_id: string | null
  unit_id: string | null
  subject: string | null
  reason: string
  actor_name: string
  /** A Date as the driver reads the column; its text when read inside a JSON value. */
  created_at: Instant
}

export interface EntrantRow {
  id: string
  comp_id: string
  entrant_user_id: string
  entrant_email: string
  entrant_name: string
}

/**
 * The director's actions that count on `day` (that day's, and waivers for the whole
 * competition), in the order taken. A withdrawn waiver counts nowhere, so it is left out here,
 * where the board, the grid check and the phone's pack all read them.
 */
export function actionsQuery(db: Knex, competitionId: string, day: IsoDate, entryIds?: readonly string[]) {
  const q = db('director_actions as a').join('users as u', 'u.id', 'a.actor_id')
    .where('a.competition_id', competitionId)
    .where(w => w.where('a.day', day).orWhereNull('a.day'))
    .whereNull('a.withdrawn_at')
    .orderBy([{ column: 'a.created_at' }, { column: 'a.id' }])
    .select('a.id', 'a.entry_id', 'a.kind', 'a.check_id', 'a.unit_id', 'a.subject', 'a.reason', 'a.created_at', 'u.name as actor_name',
      'a.day')
  if (entryIds) q.whereIn('a.entry_id', [...entryIds])
  return q
}

export type ExistingTileRow = Pick<BoardTileRow, 'entry_id' | 'readiness' | 'tile' | 'findings' | 'class_order'> & { seq: string | number, updated_at: Instant }

/** What refreshTiles reads besides the dossiers and the director's actions (see `tileInputsStatement`). */
export interface TileInputs {
  checks: CheckRow[]
  existing: ExistingTileRow[]
  entrants: EntrantRow[]
  class_orders: Record<string, number>
  /** The competition's last sequence number (0 before the first). */
  seq: string | number
}

/**
 * What refreshTiles reads besides the dossiers and the director's actions, as one statement
 * whose one row is `TileInputs`, with its named bindings: each entry's latest grid check of the
 * day (with its scrutineer's name), its tile as it stands, and its entrant — of every entry,
 * or of `entryIds` — the order of the classes and the competition's last sequence number.
 */
export function tileInputsStatement(db: Knex, competitionId: string, day: IsoDate, entryIds?: readonly string[]): { sql: string, bindings: Record<string, unknown> } {
  const only = (column: string) => (entryIds ? `and ${column} = any(:ids::uuid[])` : '')
  const sql = `select
      (select coalesce(json_agg(json_build_object('entry_id', g.entry_id, 'checked_at', g.checked_at, 'outcome', g.outcome,
          'answers', g.answers, 'scrutineer_name', u.name, 'day', g.day)), '[]')
        from grid_checks g join users u on u.id = g.scrutineer_id
        where g.id in (:latestChecks) ${only('g.entry_id')}) as checks,
      (select coalesce(json_agg(json_build_object('entry_id', t.entry_id, 'seq', t.seq, 'readiness', t.readiness,
          'tile', t.tile, 'findings', t.findings, 'updated_at', t.updated_at, 'class_order', t.class_order)), '[]')
        from board_tiles t where t.competition_id = :competitionId and t.day = :day ${only('t.entry_id')}) as existing,
      (select coalesce(json_agg(json_build_object('id', e.id, 'comp_id', e.comp_id, 'entrant_user_id', e.entrant_user_id,
          'entrant_email', u.email, 'entrant_name', u.name)), '[]')
        from entries e join users u on u.id = e.entrant_user_id
        where e.competition_id = :competitionId ${only('e.id')}) as entrants,
      (select coalesce(json_object_agg(k.id, k.sort_order), '{}') from classes k where k.competition_id = :competitionId) as class_orders,
      coalesce((select seq from board_sequences where competition_id = :competitionId), 0) as seq`
  return {
    sql,
    bindings: {
      competitionId,
      day,
      latestChecks: latestGridCheckIds(db, competitionId, day),
      ...(entryIds ? { ids: [...entryIds] } : {}),
    },
  }
}

export async function tileInputs(db: Knex, competitionId: string, day: IsoDate, entryIds?: readonly string[]): Promise<TileInputs> {
  const { sql, bindings } = tileInputsStatement(db, competitionId, day, entryIds)
  const { rows: [row] } = await db.raw(sql, bindings) as { rows: TileInputs[] }
  return row!
}

/** A director's action row as the tiles and the engine read it (with who took it and when). */
export function toTileAction(r: BoardActionRow): TileAction {
  const common = { by: r.actor_name, at: iso(r.created_at), reason: r.reason }
  if (r.kind === 'waiver') {
    return {
      kind: 'waiver',
      day: r.day,
      checkId: r.check_id!,
      ...(r.unit_id !== null ? { unitId: r.unit_id } : {}),
      ...(r.subject !== null ? { subject: r.subject } : {}),
      ...common,
    }
  }
  return { kind: r.kind, day: r.day!, ...common }
}
