// What the board routes answer and what the board's socket pushes.
import type { DayKind, WaiverScope } from '../schemas/board'
import type { Finding, IsoDate } from '../engine/types'
import type { Readiness } from '../engine/readiness'
import type { TileAction } from '../utils/board-tile'

/** What a tile shows under its readiness word: why it is held, what failed, or the first finding. */
export interface BoardHeadline {
  kind: 'hold' | 'checklist' | 'finding'
  text: string
  severity?: Finding['severity']
  checkId?: string
}

export interface BoardTile {
  entryId: string
  compId: string
  classId: string
  className: string
  pilotName: string
  registration: string
  gliderType: string
  readiness: Readiness
  headline: BoardHeadline | null
  /** Open findings (waivers applied), and how many were waived. */
  counts: { blocking: number, advisory: number, waived: number }
  lastCheck: { at: string, initials: string, name: string, outcome: 'pass' | 'fail' } | null
  hold: { reason: string, by: string, at: string } | null
  /** The board sequence number of the tile's last change. */
  seq: number
  updatedAt: string
}

export interface BoardDay {
  day: IsoDate
  kind: DayKind
  status: 'open' | 'closed'
  openedAt: string
  openedBy: string
  closedAt: string | null
  closedBy: string | null
}

export interface BoardClass {
  id: string
  name: string
}

/** GET …/board: the whole board of one day, at sequence number `seq`. */
export interface BoardSnapshot {
  competition: { id: string, name: string, timeZone: string }
  /** The day shown: the open day, else the latest; null before the first day is opened. */
  day: BoardDay | null
  seq: number
  classes: BoardClass[]
  tiles: BoardTile[]
  generatedAt: string
}

/** GET …/board/seq: enough to tell a screen whether it missed something. */
export interface BoardSeq {
  seq: number
  openDay: IsoDate | null
}

/** GET …/days: the competition's scheduled days and the days opened so far. */
export interface DayList {
  today: IsoDate
  timeZone: string
  scheduled: { day: IsoDate, kind: DayKind }[]
  days: BoardDay[]
  openDay: IsoDate | null
}

export type BoardCause = 'grid-check' | 'hold' | 'release' | 'waiver' | 'dossier' | 'day'

/** Pushed to a board room: one tile changed (null: the entry left the board). */
export interface BoardTileEvent {
  competitionId: string
  day: IsoDate
  seq: number
  cause: BoardCause
  entryId: string
  tile: BoardTile | null
}

/** Pushed to a board room when a day is opened or closed: fetch the board again. */
export interface BoardDayEvent {
  competitionId: string
  seq: number
  day: BoardDay
}

/** Pushed to an entrant: their own entry's readiness changed. */
export interface EntryReadinessEvent {
  competitionId: string
  entryId: string
  day: IsoDate
  readiness: Readiness
  headline: BoardHeadline | null
  hold: BoardTile['hold']
}

/** GET …/entries/:entryId/readiness: the entry on the open day's board (its entrant sees this). */
export interface EntryDayReadiness {
  /** The open day; null while none is open. */
  day: BoardDay | null
  /** Null when no day is open or the entry is not on the board (only accepted entries are). */
  readiness: Readiness | null
  headline: BoardHeadline | null
  hold: BoardTile['hold']
  lastCheck: BoardTile['lastCheck']
  /** The director's actions that count on the open day (its holds, releases and waivers, and the competition-wide waivers). */
  actions: TileAction[]
}

/** The answer to a socket's `board:join`. */
export type BoardJoinAck = { ok: true, scope: 'staff' | 'own' } | { ok: false, message: string }

export interface DirectorActionRecord {
  id: string
  kind: 'hold' | 'release' | 'waiver'
  /** Null for a waiver of the whole competition. */
  day: IsoDate | null
  scope: WaiverScope | null
  checkId: string | null
  unitId: string | null
  subject: string | null
  reason: string
  finding: { severity: Finding['severity'], reason: string } | null
  actor: { id: string, name: string }
  at: string
  /** A withdrawn waiver lifts nothing any more; who withdrew it, when and why. */
  withdrawal: { by: { id: string, name: string }, at: string, reason: string } | null
}

/** GET …/entries/:entryId/waivers: the entry's waivers, as its entrant and the staff read them. */
export interface EntryWaiver {
  id: string
  scope: WaiverScope
  /** The day of a day's waiver; null for the whole competition. */
  day: IsoDate | null
  checkId: string
  /** The check in words (its rule on the rulebook), and the finding as it read when waived. */
  checkTitle: string
  finding: { severity: Finding['severity'], reason: string } | null
  reason: string
  by: string
  at: string
  /** It counts until the end of this day (a day's waiver) or the last contest day. */
  until: IsoDate | null
  withdrawal: { by: string, at: string, reason: string } | null
}

export interface BoardFinding extends Finding {
  /** The waiver that lifts it on this day, if any. */
  waiver: { id: string, scope: WaiverScope, reason: string, by: string, at: string } | null
}

/** GET …/board/entries/:entryId: one tile with everything the director decides on. */
export interface BoardEntryDetail {
  day: BoardDay | null
  tile: BoardTile | null
  findings: BoardFinding[]
  actions: DirectorActionRecord[]
  /** The director may act (the caller is a director and the day is open). */
  canDirect: boolean
  /** The last change of the accepted entry's dossier after acceptance, or null. */
  changedAfterAcceptanceAt: string | null
}

/** POST hold / release / waiver. */
export interface DirectorActionResult {
  action: DirectorActionRecord
  tile: BoardTile | null
}

export type TimelineKind = 'grid-check' | 'findings' | 'hold' | 'release' | 'waiver' | 'day' | 'message' | 'document'

export interface TimelineItem {
  id: string
  kind: TimelineKind
  at: string
  day: IsoDate | null
  actor: { id: string, name: string } | null
  /** One line in words, e.g. "Grid check: pass — ready" or "Held: canopy crack". */
  summary: string
  details: Record<string, unknown>
}

export interface EntryTimeline {
  entryId: string
  compId: string
  items: TimelineItem[]
}

export interface AuditLogItem {
  id: number
  at: string
  action: string
  actor: { id: string, name: string } | null
  subjectType: string
  subjectId: string | null
  entry: { id: string, compId: string } | null
  details: Record<string, unknown>
}

export interface AuditPage {
  rows: AuditLogItem[]
  /** Pass as `before` for the next (older) page (the last row's time and id); null at the end. */
  nextBefore: string | null
  /** For the filters: who and what appear in this competition's log. */
  actors: { id: string, name: string }[]
  actions: string[]
}
