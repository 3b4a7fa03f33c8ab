// CSV exports of the scrutineering record: the log (every grid check with its answers and
// outcome, one row each) and a day's readiness (one row per tile). Cells pass through
// csvSafe so a name can never run as a spreadsheet formula.
import { stringify } from 'csv-stringify/sync'
import type { Knex } from 'knex'
import type { IsoDate } from '#shared/engine'
import { READINESS_LABELS } from '#shared/constants/readiness'
import { csvSafeRows } from '#shared/utils/csv-safe'
import type { ChecklistItem } from '#shared/constants/grid'
import type { GridCheckAnswerJson } from '#shared/types/rows-grid'
import type { BoardTile } from '#shared/types/api-board'
import { useDb } from '#server/utils/db'
import { rulesOf } from '#shared/utils/rules'
import { iso } from '#domain/read-model/values'

const RESULT_WORDS: Record<string, string> = { 'pass': 'pass', 'fail': 'fail', 'not-checked': 'not checked' }

interface LogRow {
  day: string
  checked_at: Date
  received_at: Date
  comp_id: string
  class_name: string
  pilot_name: string
  registration: string
  scrutineer_name: string
  found_by: string | null
  outcome: string
  readiness: keyof typeof READINESS_LABELS
  answers: GridCheckAnswerJson[]
  findings: { checkId: string, severity: string }[]
  notes: string
  mass_kg: string | null
  cg_arm_m: string | null
}

/** One answer as a cell: "fail — note" or "pass". */
function answerCell(a: GridCheckAnswerJson | undefined): string {
  if (!a) return ''
  const word = RESULT_WORDS[a.result] ?? a.result
  return a.note ? `${word} — ${a.note}` : word
}

/**
 * The header and rows of the scrutineering log. Checklist items get a column each, in the
 * competition's current order; answers to items since removed from the checklist go to
 * "Other answers" with their label, so nothing recorded is left out.
 */
export function gridLogRecords(checklist: readonly ChecklistItem[], rows: readonly LogRow[]): string[][] {
  const ids = new Set(checklist.map(i => i.id))
  const header = [
    'Day', 'Checked at', 'Received at', 'Competition ID', 'Class', 'Pilot', 'Registration', 'Scrutineer', 'Found by',
    'Outcome', 'Readiness', ...checklist.map(i => i.label), 'Other answers', 'Mass (kg)', 'CG (m aft of datum)',
    'Blocking findings', 'Advisory findings', 'Notes',
  ]
  const records = rows.map((r) => {
    const byId = new Map(r.answers.map(a => [a.itemId, a]))
    const other = r.answers.filter(a => !ids.has(a.itemId)).map(a => `${a.label}: ${answerCell(a)}`).join('; ')
    return [
      r.day, iso(r.checked_at), iso(r.received_at), r.comp_id, r.class_name, r.pilot_name,
      r.registration, r.scrutineer_name, r.found_by ?? '', r.outcome, READINESS_LABELS[r.readiness] ?? r.readiness,
      ...checklist.map(i => answerCell(byId.get(i.id))), other, r.mass_kg ?? '', r.cg_arm_m ?? '',
      r.findings.filter(f => f.severity === 'blocking').map(f => f.checkId).join('; '),
      r.findings.filter(f => f.severity === 'advisory').map(f => f.checkId).join('; '),
      r.notes,
    ]
  })
  return csvSafeRows([header, ...records])
}

/** Every grid check of the competition (or of one day), in the order they were made. */
export async function gridLogCsv(competition: { id: string, settings: unknown }, day?: IsoDate, db: Knex = useDb()): Promise<string> {
  const q = db('grid_checks as g')
    .join('entries as e', 'e.id', 'g.entry_id')
    .join('classes as k', 'k.id', 'e.class_id')
    .join('users as u', 'u.id', 'g.scrutineer_id')
    .leftJoin('weigh_ins as w', 'w.grid_check_id', 'g.id')
    .where('g.competition_id', competition.id)
    .orderBy([{ column: 'g.day' }, { column: 'g.checked_at' }, { column: 'g.id' }])
    .select(
      'g.day', 'g.checked_at', 'g.received_at', 'e.comp_id', 'k.name as class_name',
      'e.pilot_name', 'e.registration', 'u.name as scrutineer_name', 'g.found_by', 'g.outcome', 'g.readiness', 'g.answers',
      'g.findings', 'g.notes', 'w.mass_kg', 'w.cg_arm_m',
    )
  if (day) q.where('g.day', day)
  const rows = await q as LogRow[]
  return stringify(gridLogRecords(rulesOf(competition.settings as Record<string, unknown> | null).gridChecklist, rows))
}

export const READINESS_CSV_HEADER = [
  'Day', 'Competition ID', 'Class', 'Pilot', 'Registration', 'Glider type', 'Readiness', 'Why',
  'Blocking findings', 'Advisory findings', 'Waived findings', 'Last grid check', 'Scrutineer', 'Outcome', 'Held by', 'Hold reason',
]

export function readinessRecords(day: IsoDate, tiles: readonly BoardTile[]): string[][] {
  const records = tiles.map(t => [
    day, t.compId, t.className, t.pilotName, t.registration, t.gliderType, READINESS_LABELS[t.readiness], t.headline?.text ?? '',
    t.counts.blocking, t.counts.advisory, t.counts.waived, t.lastCheck?.at ?? '', t.lastCheck?.name ?? '', t.lastCheck?.outcome ?? '',
    t.hold?.by ?? '', t.hold?.reason ?? '',
  ])
  return csvSafeRows([READINESS_CSV_HEADER, ...records])
}
