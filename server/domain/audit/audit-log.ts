// Reading the audit log: the organiser's and director's audit page (filter by day, entry,
// actor and action; paged back by (time, id)) and an entry's timeline (every grid check, finding
// change, hold, release and waiver, with who and when), and the findings of some entries that
// came and went (the glider report). The log itself is written by `audit()` in the transaction
// of each change (audit.ts) and is append-only.
import type { Knex } from 'knex'
import type { IsoDate } from '#shared/engine'
import { AUDIT_PAGE_SIZE, auditCursorOf, type AuditQuery } from '#shared/schemas/board'
import type { AuditPage, AuditLogItem, EntryTimeline, TimelineItem, TimelineKind } from '#shared/types/api-board'
import { READINESS_LABELS, type Readiness } from '#shared/constants/readiness'
import { useDb } from '#server/utils/db'
import type { FindingChange } from '#shared/utils/board-tile'
import { iso } from '#domain/read-model/values'
import type { DocumentKind } from '#shared/constants/entries'
import type { FileDeletionReason } from '#shared/constants/files'
import { fileDeletedSentence } from '#shared/utils/document-retention'

export interface AuditJoinedRow {
  id: string | number
  at: Date
  action: string
  actor_user_id: string | null
  actor_name: string | null
  subject_type: string
  subject_id: string | null
  details: Record<string, unknown>
  entry_id: string | null
  comp_id: string | null
}

/** The entry an audit row speaks of: its subject, or the entry named in its details. */
const ENTRY_OF_ROW = `coalesce(a.details->>'entryId', case when a.subject_type = 'entry' then a.subject_id end)`

function auditQuery(db: Knex, competitionId: string): Knex.QueryBuilder {
  return db('audit_log as a')
    .leftJoin('users as u', 'u.id', 'a.actor_user_id')
    .leftJoin('entries as e', j => j.on(db.raw(`e.id::text = ${ENTRY_OF_ROW}`)))
    .where('a.competition_id', competitionId)
    .select('a.id', 'a.at', 'a.action', 'a.actor_user_id', 'a.subject_type', 'a.subject_id', 'a.details', 'u.name as actor_name', 'e.id as entry_id', 'e.comp_id')
}

function forEntry(q: Knex.QueryBuilder, entryId: string) {
  return q.where(w => w.whereRaw(`a.details->>'entryId' = ?`, [entryId]).orWhere(x => x.where('a.subject_type', 'entry').where('a.subject_id', entryId)))
}

export function toAuditRow(r: AuditJoinedRow): AuditLogItem {
  return {
    id: Number(r.id),
    at: iso(r.at),
    action: r.action,
    actor: r.actor_user_id ? { id: r.actor_user_id, name: r.actor_name ?? 'Someone' } : null,
    subjectType: r.subject_type,
    subjectId: r.subject_id,
    entry: r.entry_id ? { id: r.entry_id, compId: r.comp_id ?? '' } : null,
    details: r.details ?? {},
  }
}

/** A page of the competition's audit log, newest first, with the facets of its filters. */
export async function auditPage(competition: { id: string, time_zone: string }, query: AuditQuery, db: Knex = useDb()): Promise<AuditPage> {
  const limit = query.limit ?? AUDIT_PAGE_SIZE
  const q = auditQuery(db, competition.id)
  if (query.day) {
    // The day of the event in the competition's time zone, or the contest day it was about.
    const day = query.day
    q.where(w => w.whereRaw(`(a.at at time zone ?)::date = ?::date`, [competition.time_zone, day]).orWhereRaw(`a.details->>'day' = ?`, [day]))
  }
  if (query.entryId) forEntry(q, query.entryId)
  if (query.actorId) q.where('a.actor_user_id', query.actorId)
  if (query.action) q.where('a.action', query.action)
  // Keyset paging on (time, id): stable while new rows arrive, and cheap however far back.
  if (query.before) q.whereRaw('(a.at, a.id) < (?::timestamptz, ?)', [query.before.at, query.before.id])
  // The cursor keeps the microseconds PostgreSQL stores (a JavaScript Date would drop them).
  q.select(db.raw(`to_char(a.at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') as cursor_at`))
  const [rows, actors, actions] = await Promise.all([
    q.orderBy([{ column: 'a.at', order: 'desc' }, { column: 'a.id', order: 'desc' }]).limit(limit + 1) as Promise<(AuditJoinedRow & { cursor_at: string })[]>,
    db('audit_log as a').join('users as u', 'u.id', 'a.actor_user_id').where('a.competition_id', competition.id)
      .distinct('u.id', 'u.name').orderBy('u.name') as Promise<{ id: string, name: string }[]>,
    db('audit_log').where({ competition_id: competition.id }).distinct('action').orderBy('action') as Promise<{ action: string }[]>,
  ])
  const page = rows.slice(0, limit)
  return {
    rows: page.map(toAuditRow),
    nextBefore: rows.length > limit ? auditCursorOf({ at: page[page.length - 1]!.cursor_at, id: Number(page[page.length - 1]!.id) }) : null,
    actors: actors.map(a => ({ id: a.id, name: a.name })),
    actions: actions.map(a => a.action),
  }
}

// ---------------------------------------------------------------------------------------
// An entry's timeline

export const TIMELINE_ACTIONS: Record<string, TimelineKind> = {
  'grid-check.recorded': 'grid-check',
  'findings.changed': 'findings',
  'director.hold': 'hold',
  'director.release': 'release',
  'director.waiver': 'waiver',
  'director.waiver-withdrawn': 'waiver',
  'document.file-deleted': 'document',
}

interface Change { checkId: string, severity: string, reason?: string }

const word = (r: unknown) => (typeof r === 'string' && r in READINESS_LABELS ? READINESS_LABELS[r as Readiness] : String(r ?? ''))

/** One line in words for a timeline row (pure; the details are what `audit()` stored). */
export function timelineSummary(kind: TimelineKind, d: Record<string, unknown>): string {
  switch (kind) {
    case 'grid-check': {
      const blocking = Array.isArray(d.blocking) && d.blocking.length ? ` — blocking: ${(d.blocking as string[]).join(', ')}` : ''
      const mass = typeof d.massKg === 'number' ? `, weighed ${d.massKg} kg` : ''
      return `Grid check: ${d.outcome === 'fail' ? 'failed' : 'passed'}${mass}; ${word(d.readiness).toLowerCase()}${blocking}`
    }
    case 'findings': {
      const added = (d.added as Change[] | undefined) ?? []
      const removed = (d.removed as Change[] | undefined) ?? []
      const parts: string[] = []
      if (added.length) parts.push(`new: ${added.map(c => `${c.checkId} (${c.severity})`).join(', ')}`)
      if (removed.length) parts.push(`cleared: ${removed.map(c => `${c.checkId} (${c.severity})`).join(', ')}`)
      const r = d.readiness as { from?: string, to?: string } | undefined
      const moved = r && r.from !== r.to ? ` — ${word(r.from)} → ${word(r.to)}` : ''
      return `Findings changed: ${parts.join('; ') || 'details only'}${moved}`
    }
    case 'hold': return `Held by the director: ${String(d.reason ?? '')}`
    case 'release': return `Released by the director: ${String(d.reason ?? '')}`
    case 'waiver': return d.withdrawn
      ? `Waiver of ${String(d.checkId ?? '')} withdrawn: ${String(d.reason ?? '')}`
      : `Waived ${String(d.checkId ?? '')} ${d.scope === 'competition' ? 'for the whole competition' : `for ${String(d.day ?? 'the day')}`}: ${String(d.reason ?? '')}`
    case 'day': return String(d.day ?? '')
    case 'message': return d.fromOffice ? 'The office answered' : 'Asked the office'
    case 'document': return fileDeletedSentence(d.kind as DocumentKind, d.reason as FileDeletionReason, Number(d.keptDays))
  }
}

export function toTimelineItem(r: AuditJoinedRow): TimelineItem {
  const kind = TIMELINE_ACTIONS[r.action] ?? 'day'
  const details = r.details ?? {}
  return {
    id: String(r.id),
    kind,
    at: iso(r.at),
    day: typeof details.day === 'string' ? details.day as IsoDate : null,
    actor: r.actor_user_id ? { id: r.actor_user_id, name: r.actor_name ?? 'Someone' } : null,
    summary: timelineSummary(kind, details),
    details,
  }
}

/**
 * Every grid check, finding change, hold, release and waiver of one entry, each of its document
 * files deleted on the retention schedule, and the messages between its entrant and the office,
 * newest first.
 */
export async function entryTimeline(competitionId: string, entry: { id: string, comp_id: string }, db: Knex = useDb()): Promise<EntryTimeline> {
  const [rows, messages] = await Promise.all([
    forEntry(auditQuery(db, competitionId), entry.id)
      .whereIn('a.action', Object.keys(TIMELINE_ACTIONS))
      .orderBy('a.id', 'desc') as Promise<AuditJoinedRow[]>,
    db('entry_messages as m').join('users as u', 'u.id', 'm.author_id').where('m.entry_id', entry.id)
      .select('m.id', 'm.from_office', 'm.body', 'm.created_at', 'm.author_id', 'u.name as author_name') as Promise<{ id: string, from_office: boolean, body: string, created_at: Date, author_id: string, author_name: string }[]>,
  ])
  const items: TimelineItem[] = [
    ...rows.map(toTimelineItem),
    ...messages.map(m => ({
      id: `message:${m.id}`,
      kind: 'message' as const,
      at: iso(m.created_at)!,
      day: null,
      actor: { id: m.author_id, name: m.author_name },
      summary: `${m.from_office ? 'The office answered' : 'Asked the office'}: ${m.body}`,
      details: { fromOffice: m.from_office },
    })),
  ]
  items.sort((a, b) => (a.at < b.at ? 1 : a.at > b.at ? -1 : 0))
  return { entryId: entry.id, compId: entry.comp_id, items }
}

// ---------------------------------------------------------------------------------------
// Findings that came and went

/** One `findings.changed` row of an entry: what appeared and what went, when and why. */
export interface FindingChangeRecord {
  entryId: string
  at: string
  day: IsoDate | null
  cause: string | null
  added: FindingChange[]
  removed: FindingChange[]
}

/**
 * The `findings.changed` rows of some entries (written while a day is open, as the board's
 * tiles change), oldest first: what the glider report reads to name the findings fixed since.
 */
export async function findingChangesOf(competitionId: string, entryIds: readonly string[], db: Knex = useDb()): Promise<FindingChangeRecord[]> {
  if (!entryIds.length) return []
  const rows = await db('audit_log').where({ competition_id: competitionId, action: 'findings.changed', subject_type: 'entry' })
    .whereIn('subject_id', [...entryIds]).orderBy([{ column: 'at' }, { column: 'id' }])
    .select('subject_id', 'at', 'details') as { subject_id: string, at: Date, details: Record<string, unknown> | null }[]
  return rows.map((r) => {
    const d = r.details ?? {}
    return {
      entryId: r.subject_id,
      at: iso(r.at),
      day: typeof d.day === 'string' ? d.day as IsoDate : null,
      cause: typeof d.cause === 'string' ? d.cause : null,
      added: Array.isArray(d.added) ? d.added as FindingChange[] : [],
      removed: Array.isArray(d.removed) ? d.removed as FindingChange[] : [],
    }
  })
}
