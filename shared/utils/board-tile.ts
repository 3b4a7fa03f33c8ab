// What a board tile shows, from the engine's findings, the day's latest grid check and the
// director's actions: pure, so the server's tiles, the exports and the tests agree.
import { applyWaivers, isHeld, readiness, type DirectorAction, type Readiness } from '../engine/readiness'
import type { Finding, IsoDate } from '../engine/types'
import type { BoardHeadline, BoardTile } from '../types/api-board'

export interface TileEntry {
  id: string
  compId: string
  classId: string
  className: string
  pilotName: string
  registration: string
  gliderType: string
}

export interface TileCheck {
  day: IsoDate
  at: string
  initials: string
  name: string
  outcome: 'pass' | 'fail'
  /** Labels of the checklist items that failed. */
  failedItems: string[]
}

/** A director's action as the tile reads it: the engine's shape with who and when. */
export type TileAction = DirectorAction & { by: string, at: string }

export interface TileInput {
  entry: TileEntry
  /** The engine's findings, blocking first. */
  findings: readonly Finding[]
  /** The latest grid check of the day, if any. */
  check: TileCheck | null
  /** The entry's actions for the day and its competition-wide waivers, in the order taken. */
  actions: readonly TileAction[]
  day: IsoDate
}

export type TileBody = Omit<BoardTile, 'seq' | 'updatedAt'>

/** The director's standing hold of the day (the latest hold not followed by a release), if any. */
export function activeHold(actions: readonly TileAction[], day: IsoDate): TileAction | null {
  let hold: TileAction | null = null
  for (const a of actions) {
    if (a.day !== day) continue
    if (a.kind === 'hold') hold = a
    else if (a.kind === 'release') hold = null
  }
  return hold
}

export function buildTile({ entry, findings, check, actions, day }: TileInput): TileBody {
  const state: Readiness = readiness(findings, check ? { day: check.day, outcome: check.outcome } : null, actions, day)
  const open = applyWaivers(findings, actions, day)
  const hold = isHeld(actions, day) ? activeHold(actions, day) : null
  const blocking = open.filter(f => f.severity === 'blocking').length
  let headline: BoardHeadline | null = null
  if (hold) headline = { kind: 'hold', text: hold.reason ?? 'Held by the director' }
  else if (check && check.day === day && check.outcome === 'fail') {
    headline = { kind: 'checklist', text: check.failedItems.length ? `Failed on the grid: ${check.failedItems.join('; ')}` : 'Failed on the grid' }
  }
  else if (open[0]) {
    // The pilot's own blocking finding first; a document waiting for review says so.
    const first = open.find(f => f.severity === 'blocking' && f.awaiting !== 'review') ?? open[0]
    headline = { kind: 'finding', text: first.awaiting === 'review' ? `In review: ${first.reason}` : first.reason, severity: first.severity, checkId: first.checkId }
  }
  return {
    entryId: entry.id,
    compId: entry.compId,
    classId: entry.classId,
    className: entry.className,
    pilotName: entry.pilotName,
    registration: entry.registration,
    gliderType: entry.gliderType,
    readiness: state,
    headline,
    counts: { blocking, advisory: open.length - blocking, waived: findings.length - open.length },
    lastCheck: check && check.day === day ? { at: check.at, initials: check.initials, name: check.name, outcome: check.outcome } : null,
    hold: hold ? { reason: hold.reason ?? '', by: hold.by, at: hold.at } : null,
  }
}

/** Two findings are the same finding when they name the same check, unit and subject. */
export function findingKey(f: Pick<Finding, 'checkId' | 'unitId' | 'subject'>): string {
  return `${f.checkId}|${f.unitId ?? ''}|${f.subject ?? ''}`
}

export interface FindingChange {
  checkId: string
  severity: Finding['severity']
  reason: string
  unitId?: string
  subject?: string
}

/** What appeared and what went between two evaluations (a change of severity counts as both). */
export function diffFindings(before: readonly Finding[], after: readonly Finding[]): { added: FindingChange[], removed: FindingChange[] } {
  const id = (f: Finding) => `${findingKey(f)}|${f.severity}`
  const was = new Set(before.map(id))
  const now = new Set(after.map(id))
  const brief = (f: Finding): FindingChange => ({
    checkId: f.checkId,
    severity: f.severity,
    reason: f.reason,
    ...(f.unitId !== undefined ? { unitId: f.unitId } : {}),
    ...(f.subject !== undefined ? { subject: f.subject } : {}),
  })
  return {
    added: after.filter(f => !was.has(id(f))).map(brief),
    removed: before.filter(f => !now.has(id(f))).map(brief),
  }
}

/** JSON with keys sorted at every level: a value read back from jsonb (which reorders keys) compares equal. */
export function sortedJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(sortedJson).join(',')}]`
  if (value && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${sortedJson(v)}`).join(',')}}`
  }
  return JSON.stringify(value)
}

/** Whether two tiles show the same thing (the sequence number and time aside), whatever their key order. */
export function sameTile(a: TileBody, b: TileBody): boolean {
  return sortedJson(a) === sortedJson(b)
}

export type ReadinessCounts = Record<Readiness, number> & { total: number }

export function emptyCounts(): ReadinessCounts {
  return { ready: 0, caution: 0, held: 0, unchecked: 0, total: 0 }
}

/** Counters of the board: overall and per class id. */
export function countTiles(tiles: readonly Pick<BoardTile, 'readiness' | 'classId'>[]): { overall: ReadinessCounts, byClass: Record<string, ReadinessCounts> } {
  const overall = emptyCounts()
  const byClass: Record<string, ReadinessCounts> = {}
  for (const t of tiles) {
    const c = (byClass[t.classId] ??= emptyCounts())
    c[t.readiness]++
    c.total++
    overall[t.readiness]++
    overall.total++
  }
  return { overall, byClass }
}
