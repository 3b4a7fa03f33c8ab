// The staff entries table of a competition: sorting, filters, a case-insensitive search over
// pilot name, registration and competition ID, offset paging; and the same list as CSV.
// Indexes: migrations/20261203000500_entry_table_indexes.ts. The findings column and filter
// come from evaluating the whole competition once per request (server/domain/findings/findings.ts).
import type { Knex } from 'knex'
import { stringify } from 'csv-stringify/sync'
import type { Finding } from '#shared/engine'
import type { EntryTableFilter, EntryTableQuery, EntryTableSort, FindingsFilter } from '#shared/schemas/entry-table'
import type { FindingCounts } from '#shared/types/api-findings'
import type { EntryTableResponse, EntryTableRow } from '#shared/types/setup'
import { csvSafeRows } from '#shared/utils/csv-safe'
import { fromMinorUnits } from '#shared/utils/money'
import { countFindings, findingsByEntry } from '#domain/findings/findings'
import { useDb } from '#server/utils/db'
import { iso } from '#domain/read-model/values'

// Competition IDs sort shorter first (padded to three), so 2 comes before 10 and 10 before KM1.
const COMP_ID_KEY = `lpad(upper(e.comp_id), 3, ' ')`

// Each sort names its column(s); ties always fall back to the competition ID, then the id,
// so pages never overlap or skip a row.
const SORT_COLUMNS: Record<EntryTableSort, string[]> = {
  compId: [COMP_ID_KEY],
  pilot: ['lower(e.pilot_name)'],
  class: ['c.sort_order', 'lower(c.name)'],
  status: ['e.status'],
  payment: ['e.payment_status'],
  submitted: ['e.submitted_at'],
}

/** Escapes LIKE's wildcards so a search for "50%" finds that text. */
function likePattern(q: string): string {
  return `%${q.toLowerCase().replace(/[\\%_]/g, m => `\\${m}`)}%`
}

const NO_FINDINGS: FindingCounts = { blocking: 0, advisory: 0 }

/** Whether an entry's counts pass the findings filter. */
export function passesFindingsFilter(counts: FindingCounts, filter: FindingsFilter): boolean {
  if (filter === 'blocking') return counts.blocking > 0
  if (filter === 'advisory') return counts.advisory > 0
  if (filter === 'none') return counts.blocking + counts.advisory === 0
  return true
}

/** Every entry's finding counts, from one evaluation of the competition. */
async function findingCounts(competitionId: string, db: Knex): Promise<Map<string, FindingCounts>> {
  const byEntry: Map<string, Finding[]> = await findingsByEntry(competitionId, undefined, db)
  return new Map([...byEntry].map(([id, findings]) => [id, countFindings(findings)]))
}

function filteredEntries(db: Knex, competitionId: string, f: EntryTableFilter, counts: Map<string, FindingCounts>) {
  const q = db('entries as e')
    .join('classes as c', 'c.id', 'e.class_id')
    .where('e.competition_id', competitionId)
  if (f.findings !== 'any') {
    q.whereIn('e.id', [...counts].filter(([, c]) => passesFindingsFilter(c, f.findings)).map(([id]) => id))
  }
  if (f.class) q.where('e.class_id', f.class)
  if (f.status) q.where('e.status', f.status)
  if (f.payment) q.where('e.payment_status', f.payment)
  if (f.q) {
    const pattern = likePattern(f.q)
    q.where(w => w
      .whereRaw(`lower(e.pilot_name) LIKE ? ESCAPE '\\'`, [pattern])
      .orWhereRaw(`lower(e.registration) LIKE ? ESCAPE '\\'`, [pattern])
      .orWhereRaw(`lower(e.comp_id) LIKE ? ESCAPE '\\'`, [pattern]))
  }
  return q
}

function orderBy(f: EntryTableFilter): string {
  const dir = f.direction === 'desc' ? 'DESC' : 'ASC'
  // Unsubmitted entries (no date) go last whichever way the dates run.
  const nulls = f.sort === 'submitted' ? ' NULLS LAST' : ''
  const primary = SORT_COLUMNS[f.sort].map(c => `${c} ${dir}${nulls}`)
  return [...primary, `${COMP_ID_KEY} ASC`, 'e.id ASC'].join(', ')
}

const ROW_COLUMNS = [
  'e.id', 'e.comp_id', 'e.pilot_name', 'e.class_id', 'c.name as class_name', 'e.glider_type', 'e.registration',
  'e.status', 'e.payment_status', 'e.paid_minor', 'e.submitted_at', 'e.copilot_name', 'e.pilot_nationality',
  'e.changed_after_acceptance_at',
]

interface RawRow {
  id: string
  comp_id: string
  pilot_name: string
  class_id: string
  class_name: string
  glider_type: string
  registration: string
  status: EntryTableRow['status']
  payment_status: EntryTableRow['paymentStatus']
  paid_minor: number
  submitted_at: Date | null
  copilot_name: string | null
  pilot_nationality: string | null
  changed_after_acceptance_at: Date | null
}

function toRow(r: RawRow, findings: FindingCounts): EntryTableRow {
  return {
    id: r.id,
    compId: r.comp_id,
    pilotName: r.pilot_name,
    classId: r.class_id,
    className: r.class_name,
    gliderType: r.glider_type,
    registration: r.registration,
    status: r.status,
    paymentStatus: r.payment_status,
    paidMinor: r.paid_minor,
    submittedAt: iso(r.submitted_at),
    changedAfterAcceptanceAt: iso(r.changed_after_acceptance_at),
    findings,
  }
}

export async function entryTablePage(competitionId: string, query: EntryTableQuery, currency: string, db: Knex = useDb()): Promise<EntryTableResponse> {
  const counts = await findingCounts(competitionId, db)
  const [rows, counted] = await Promise.all([
    filteredEntries(db, competitionId, query, counts)
      .select(ROW_COLUMNS)
      .orderByRaw(orderBy(query))
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize) as Promise<RawRow[]>,
    filteredEntries(db, competitionId, query, counts).count('* as total').first() as Promise<{ total: string } | undefined>,
  ])
  return { rows: rows.map(r => toRow(r, counts.get(r.id) ?? NO_FINDINGS)), total: Number(counted?.total ?? 0), page: query.page, pageSize: query.pageSize, currency }
}

export const ENTRY_CSV_HEADER = [
  'Competition ID', 'Pilot', 'Co-pilot', 'Nationality', 'Class', 'Glider type', 'Registration',
  'Status', 'Payment', 'Paid', 'Currency', 'Submitted at', 'Blocking findings', 'Advisory findings', 'Findings',
]

/** Every entry that matches the filters, in the table's order, as CSV text (header first). */
export async function entryTableCsv(competitionId: string, filter: EntryTableFilter, currency: string, db: Knex = useDb()): Promise<string> {
  const byEntry = await findingsByEntry(competitionId, undefined, db)
  const counts = new Map([...byEntry].map(([id, findings]) => [id, countFindings(findings)]))
  const rows: RawRow[] = await filteredEntries(db, competitionId, filter, counts).select(ROW_COLUMNS).orderByRaw(orderBy(filter))
  const records = rows.map((r) => {
    const findings = byEntry.get(r.id) ?? []
    const c = counts.get(r.id) ?? NO_FINDINGS
    return [
      r.comp_id, r.pilot_name, r.copilot_name ?? '', r.pilot_nationality ?? '', r.class_name, r.glider_type, r.registration,
      r.status, r.payment_status, fromMinorUnits(r.paid_minor), currency, r.submitted_at ? r.submitted_at.toISOString() : '',
      c.blocking, c.advisory, findings.map(f => `${f.severity}: ${f.checkId}`).join('; '),
    ]
  })
  return stringify([ENTRY_CSV_HEADER, ...csvSafeRows(records)])
}
