// Row types of the board tables (migrations/20261205000100_board.ts, …200_director_actions.ts).
import type { DayKind } from '../schemas/board'
import type { Finding } from '../engine/types'
import type { Readiness } from '../engine/readiness'
import type { BoardTile } from './api-board'

export interface BoardDayRow {
  competition_id: string
  /** YYYY-MM-DD (a `date` column, read as its text by the type parser in knexfile.ts) */
  day: string
  kind: DayKind
  opened_at: Date
  opened_by: string
  closed_at: Date | null
  closed_by: string | null
}

export interface BoardTileRow {
  competition_id: string
  day: string
  entry_id: string
  /** bigint arrives from pg as a string */
  seq: string
  readiness: Readiness
  /** json (kept as written, so a tile read back compares equal key for key with one built again) */
  tile: Omit<BoardTile, 'seq' | 'updatedAt'>
  findings: Finding[]
  updated_at: Date
  /** The tile as the board sends it (with seq and updatedAt), written with it. */
  shown: BoardTile
  /** Its place on the board: its class's sort order, then its competition ID (in number order). */
  class_order: number
  comp_id: string
}

export interface DirectorActionRow {
  id: string
  competition_id: string
  entry_id: string
  kind: 'hold' | 'release' | 'waiver'
  /** YYYY-MM-DD, or null for a waiver of the whole competition */
  day: string | null
  check_id: string | null
  unit_id: string | null
  subject: string | null
  reason: string
  finding: { severity: Finding['severity'], reason: string } | null
  actor_id: string
  created_at: Date
  withdrawn_at: Date | null
  withdrawn_by: string | null
  withdrawal_reason: string | null
}
