// The tracking list: every accepted entry's competition ID, registration, glider type, class and
// pilot with each collision-warning unit's radio ID — what live-tracking services and the safety
// officer need. One line per collision-warning unit; an entry without one keeps a line with an
// empty radio ID, so the gap shows. Optionally only the entries on one day's board. Read from
// the one dossier loader; staff only (the list names every glider's radio IDs).
import { stringify } from 'csv-stringify/sync'
import type { Knex } from 'knex'
import { normaliseRadioId, type Dossier, type IsoDate } from '#shared/engine'
import { MESSAGES } from '#shared/constants/messages'
import { STAFF_ROLES } from '#shared/constants/roles'
import type { TrackingQuery } from '#shared/schemas/reports'
import type { TrackingList, TrackingRow } from '#shared/types/api-reports'
import { compareCompIds } from '#shared/utils/comp-id-order'
import { csvSafeRows } from '#shared/utils/csv-safe'
import { todayIn } from '#shared/utils/grid-days'
import { boardDayOf, entryIdsOnBoard } from '#domain/board/snapshot'
import { loadCompetitionDossiers } from '#domain/read-model/dossiers'
import type { CompetitionAccess } from '#server/utils/authz'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'

/** The CSV's columns, in order: a contract with the services that read it (README lists them). */
export const TRACKING_CSV_HEADER = ['comp_id', 'registration', 'glider_type', 'class', 'pilot', 'radio_id'] as const

/** The list's lines of some dossiers: one per collision-warning unit, or one with no radio ID. */
export function trackingRows(dossiers: readonly Dossier[]): TrackingRow[] {
  const rows = dossiers.flatMap((d) => {
    const e = d.entry
    const base = { entryId: e.id, compId: e.compId, registration: e.registration, gliderType: e.gliderType, className: e.className, pilotName: e.pilotName }
    const radioIds = d.units.flatMap(u => (u.kind === 'collision-warning' ? [u.radioId ? normaliseRadioId(u.radioId) : null] : []))
    return radioIds.length ? radioIds.map(radioId => ({ ...base, radioId: radioId || null })) : [{ ...base, radioId: null }]
  })
  // Board order: competition IDs as people read them; an entry's units stay in their order.
  return rows.map((r, i) => ({ r, i })).sort((a, b) => compareCompIds(a.r.compId, b.r.compId) || a.i - b.i).map(x => x.r)
}

export function trackingCsv(list: TrackingList): string {
  return stringify([
    [...TRACKING_CSV_HEADER],
    ...csvSafeRows(list.rows.map(r => [r.compId, r.registration, r.gliderType, r.className, r.pilotName, r.radioId ?? ''])),
  ])
}

/** The file name of a download: the competition's slug, and the board's day when filtered. */
export function trackingFilename(slug: string, boardDay: IsoDate | null, ext: 'csv' | 'json'): string {
  return `${slug.replace(/[^\w-]+/g, '-')}-tracking${boardDay ? `-${boardDay}` : ''}.${ext}`
}

/**
 * The tracking list of a competition for its staff (an entrant is refused with 403: the list
 * holds every glider's radio IDs). With `board`, only the entries on that day's board; 404 when
 * that day was never opened.
 */
export async function trackingList(access: CompetitionAccess, query: TrackingQuery, now: Date = new Date(), db: Knex = useDb()): Promise<TrackingList> {
  const { competition } = access
  if (!access.roles.some(r => STAFF_ROLES.includes(r))) throw httpError(403, MESSAGES.trackingStaffOnly)
  let boardDay: IsoDate | null = null
  let entryIds: string[] | undefined
  if (query.board) {
    const day = query.board === 'today' ? todayIn(competition.time_zone, now) : query.board
    const shown = await boardDayOf(competition.id, day, db)
    if (!shown) throw httpError(404, MESSAGES.trackingNoBoard(day))
    boardDay = shown.day
    entryIds = await entryIdsOnBoard(competition.id, day, db)
  }
  const loaded = entryIds && !entryIds.length
    ? undefined
    : await loadCompetitionDossiers(competition.id, { acceptedOnly: true, ...(entryIds ? { entryIds } : {}) }, db)
  return {
    competitionId: competition.id,
    competitionName: competition.name,
    boardDay,
    generatedAt: now.toISOString(),
    rows: trackingRows(loaded?.dossiers ?? []),
  }
}
