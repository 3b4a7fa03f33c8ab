// The glider report: the printable record of one entry (or of every accepted entry of a class)
// — its dossier (pilot, glider, units, documents with their state and validity), every finding
// with its rule and its state (open, waiting for review, waived, fixed), every grid check with
// its answers, every weigh-in with each term of its take-off mass, and the director's actions.
// Read through the one dossier loader and the areas that own each part; laid out as a PDF by
// entry-report-pdf.ts. Never a document's content: only its kind, state and validity (a medical
// certificate is health data, DESIGN.md).
import type { Knex } from 'knex'
import { blockingFirst, checkById, evaluate, takeOffMass, type CompetitionForEngine, type Dossier, type EngineUnit, type IsoDate, type MassTerm, type ScaleReading, type Severity, type WeighUnits } from '#shared/engine'
import { DOCUMENT_KIND_LABELS, MOTOR_GLIDER_LABELS, type DocumentKind } from '#shared/constants/entries'
import { DOCUMENT_STATUS_LABELS } from '#shared/constants/files'
import { MESSAGES } from '#shared/constants/messages'
import type { BoardDay, BoardFinding, DirectorActionRecord } from '#shared/types/api-board'
import type { GridCheckRecord } from '#shared/types/api-grid'
import { findingKey, type FindingChange } from '#shared/utils/board-tile'
import { compareCompIds } from '#shared/utils/comp-id-order'
import { findingChangesOf, type FindingChangeRecord } from '#domain/audit/audit-log'
import { directorActionsOf, withWaivers } from '#domain/board/director'
import { boardDayOf } from '#domain/board/snapshot'
import { gridChecksOf } from '#domain/grid/grid-checks'
import { loadCompetitionDossiers, type FindingsEntryRow } from '#domain/read-model/dossiers'
import { STAFF_ROLES } from '#shared/constants/roles'
import type { CompetitionRow } from '#shared/types/rows'
import type { CompetitionAccess } from '#server/utils/authz'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'

// ---------------------------------------------------------------------------------------
// The report's model (pure data, what the layout prints)

export type ReportFindingState = 'open' | 'waiting for review' | 'waived' | 'fixed'

export interface ReportFinding {
  checkId: string
  /** The check's rule, as the rulebook states it. */
  title: string
  severity: Severity
  state: ReportFindingState
  reason: string
  /** The waiver, or when and how it was fixed, in words. */
  detail: string | null
  /** The hardware caution of its fix, where there is one. */
  caution: string | null
}

export interface ReportDocument {
  kind: DocumentKind
  label: string
  /** Its review state in words; "Not uploaded" for a required kind with no document. */
  state: string
  validUntil: IsoDate | null
  /** Valid through the last contest day; null when there is no date or no contest days. */
  validThroughContest: boolean | null
  required: boolean
}

export interface ReportWeighIn {
  weighedOn: IsoDate
  units: WeighUnits
  readings: ScaleReading[]
  terms: MassTerm[]
  massKg: number
  cgArmM: number | null
  armsMissing: MassTerm['term'][]
}

export interface EntryReport {
  entry: {
    id: string
    compId: string
    status: string
    paymentStatus: string
    className: string
    pilotName: string
    copilotName: string | null
    gliderType: string
    registration: string
    spanM: number | null
    mtomKg: number | null
    /** The class's maximum take-off mass, where it has one. */
    classMaxMtomKg: number | null
    cgForwardLimitM: number | null
    cgAftLimitM: number | null
    motorGlider: string
  }
  units: EngineUnit[]
  documents: ReportDocument[]
  findings: ReportFinding[]
  gridChecks: GridCheckRecord[]
  weighIns: ReportWeighIn[]
  actions: DirectorActionRecord[]
}

export interface GliderReport {
  competition: { name: string, timeZone: string, firstContestDay: IsoDate | null, lastContestDay: IsoDate | null }
  /** The board day the findings were evaluated for (the open day, else the latest); null: today, no day opened yet. */
  day: Pick<BoardDay, 'day' | 'kind' | 'status'> | null
  /** What the report covers: one entry, or a class. */
  title: string
  generatedAt: string
  entries: EntryReport[]
}

const CAUSE_WORDS: Record<string, string> = {
  'grid-check': 'at a grid check',
  'hold': 'at a hold',
  'release': 'at a release',
  'waiver': 'at a waiver',
  'dossier': 'by a change to the dossier',
  'day': 'when the day was opened',
}

/**
 * The findings of an entry with their state: those the checks give now (open, waiting for
 * review, or waived with the waiver that lifts them), then those that came and went — removed
 * in a `findings.changed` row, or waived earlier — and are not found any more: fixed.
 */
export function reportFindings(current: readonly BoardFinding[], changes: readonly FindingChangeRecord[], actions: readonly DirectorActionRecord[]): ReportFinding[] {
  const title = (checkId: string) => checkById(checkId)?.rule ?? checkId
  const now: ReportFinding[] = current.map(f => ({
    checkId: f.checkId,
    title: title(f.checkId),
    severity: f.severity,
    state: f.waiver ? 'waived' : f.awaiting === 'review' ? 'waiting for review' : 'open',
    reason: f.reason,
    detail: f.waiver
      ? `Waived ${f.waiver.scope === 'competition' ? 'for the whole competition' : 'for the day'} by ${f.waiver.by}: ${f.waiver.reason}`
      : null,
    caution: f.caution ?? null,
  }))
  const standing = new Set(current.map(findingKey))
  const gone = new Map<string, { change: FindingChange, detail: string }>()
  for (const c of changes) {
    for (const r of c.removed) gone.set(findingKey(r), { change: r, detail: `No longer found from ${c.day ?? c.at.slice(0, 10)}${c.cause && CAUSE_WORDS[c.cause] ? `, ${CAUSE_WORDS[c.cause]}` : ''}.` })
    // A change of severity is removed and added in one row: it still stands.
    for (const a of c.added) gone.delete(findingKey(a))
  }
  // A waived finding that the checks no longer give was put right (or its cause went away).
  for (const a of actions) {
    if (a.kind !== 'waiver' || !a.checkId || !a.finding) continue
    const key = findingKey({ checkId: a.checkId, unitId: a.unitId ?? undefined, subject: a.subject ?? undefined })
    if (!gone.has(key)) {
      gone.set(key, {
        change: { checkId: a.checkId, severity: a.finding.severity, reason: a.finding.reason, ...(a.unitId ? { unitId: a.unitId } : {}), ...(a.subject ? { subject: a.subject } : {}) },
        detail: 'Waived earlier; no longer found.',
      })
    }
  }
  const fixed: ReportFinding[] = [...gone.entries()]
    .filter(([key]) => !standing.has(key))
    .map(([, { change, detail }]) => ({ checkId: change.checkId, title: title(change.checkId), severity: change.severity, state: 'fixed', reason: change.reason, detail, caution: null }))
  return [...now, ...fixed]
}

/** The current documents of a dossier, with the required kinds that have none. */
export function reportDocuments(dossier: Dossier, competition: CompetitionForEngine | null): ReportDocument[] {
  const required = new Set<DocumentKind>(competition?.rules.requiredDocumentKinds ?? [])
  const last = competition?.lastContestDay ?? null
  const docs: ReportDocument[] = dossier.documents.map(d => ({
    kind: d.kind,
    label: DOCUMENT_KIND_LABELS[d.kind] ?? d.kind,
    state: DOCUMENT_STATUS_LABELS[d.status] ?? d.status,
    validUntil: d.expiresOn,
    validThroughContest: d.expiresOn && last ? d.expiresOn >= last : null,
    required: required.has(d.kind),
  }))
  for (const kind of required) {
    if (!docs.some(d => d.kind === kind)) {
      docs.push({ kind, label: DOCUMENT_KIND_LABELS[kind] ?? kind, state: 'Not uploaded', validUntil: null, validThroughContest: null, required: true })
    }
  }
  const order = Object.keys(DOCUMENT_KIND_LABELS)
  return docs.sort((a, b) => order.indexOf(a.kind) - order.indexOf(b.kind))
}

/** The weigh-ins of a dossier, each with the terms of its take-off mass (shared/engine/weigh-in.ts). */
export function reportWeighIns(dossier: Dossier): ReportWeighIn[] {
  const e = dossier.entry
  return dossier.weighIns.map((w) => {
    const t = takeOffMass(w, { copilotName: e.copilotName, pilotMassKg: e.pilotMassKg, copilotMassKg: e.copilotMassKg, pilotArmM: e.pilotArmM, copilotArmM: e.copilotArmM, ballastArmM: e.ballastArmM })
    return { weighedOn: w.weighedOn, units: w.units, readings: w.readings, terms: t.terms, massKg: t.massKg, cgArmM: t.cgArmM, armsMissing: t.armsMissing }
  })
}

export function buildEntryReport(input: {
  dossier: Dossier
  row: FindingsEntryRow
  competition: CompetitionForEngine | null
  findings: readonly BoardFinding[]
  changes: readonly FindingChangeRecord[]
  actions: readonly DirectorActionRecord[]
  gridChecks: readonly GridCheckRecord[]
}): EntryReport {
  const { dossier, row } = input
  const e = dossier.entry
  return {
    entry: {
      id: e.id,
      compId: e.compId,
      status: row.status,
      paymentStatus: row.payment_status,
      className: e.className,
      pilotName: e.pilotName,
      copilotName: e.copilotName ?? null,
      gliderType: e.gliderType,
      registration: e.registration,
      spanM: e.spanM ?? null,
      mtomKg: e.mtomKg ?? null,
      classMaxMtomKg: input.competition?.classLimits[e.classCode]?.maxMtomKg ?? null,
      cgForwardLimitM: e.cgForwardLimitM ?? null,
      cgAftLimitM: e.cgAftLimitM ?? null,
      motorGlider: MOTOR_GLIDER_LABELS[(e.motorGlider ?? 'none') as keyof typeof MOTOR_GLIDER_LABELS] ?? String(e.motorGlider),
    },
    units: dossier.units,
    documents: reportDocuments(dossier, input.competition),
    findings: reportFindings(input.findings, input.changes, input.actions),
    gridChecks: [...input.gridChecks],
    weighIns: reportWeighIns(dossier),
    actions: [...input.actions],
  }
}

// ---------------------------------------------------------------------------------------
// Loading

/**
 * The glider report of some entries of a competition, in board order: each evaluated for the
 * board's day (the open day, else the latest opened; today when none was), as the director's
 * desk shows it.
 */
export async function gliderReport(competition: CompetitionRow, entryIds: readonly string[], title: string, now: Date = new Date(), db: Knex = useDb()): Promise<GliderReport> {
  const shown = await boardDayOf(competition.id, undefined, db)
  const day = shown?.day
  const [loaded, actions, changes, gridChecks] = await Promise.all([
    entryIds.length ? loadCompetitionDossiers(competition.id, { entryIds, day }, db) : Promise.resolve(undefined),
    directorActionsOf(competition.id, entryIds, db),
    findingChangesOf(competition.id, entryIds, db),
    gridChecksOf(competition.id, entryIds, db),
  ])
  const entries: EntryReport[] = (loaded?.dossiers ?? []).map((dossier, i) => {
    const id = dossier.entry.id
    const own = actions.filter(a => a.entryId === id)
    // The actions that count on the day evaluated: that day's, and waivers for the competition.
    const counting = own.filter(a => a.day === null || a.day === day)
    const findings = loaded?.competition ? blockingFirst(evaluate(dossier, loaded.competition, loaded.field, day)) : []
    return buildEntryReport({
      dossier,
      row: loaded!.rows[i]!,
      competition: loaded?.competition ?? null,
      findings: withWaivers(findings, counting),
      changes: changes.filter(c => c.entryId === id),
      actions: own,
      gridChecks: gridChecks.filter(g => g.entryId === id),
    })
  }).sort((a, b) => compareCompIds(a.entry.compId, b.entry.compId))
  return {
    competition: { name: competition.name, timeZone: competition.time_zone, firstContestDay: competition.first_contest_day, lastContestDay: competition.last_contest_day },
    day: shown ? { day: shown.day, kind: shown.kind, status: shown.status } : null,
    title,
    generatedAt: now.toISOString(),
    entries,
  }
}

/** One entry's report. */
export async function entryReport(competition: CompetitionRow, entry: { id: string, comp_id: string }, now: Date = new Date(), db: Knex = useDb()): Promise<GliderReport> {
  return gliderReport(competition, [entry.id], `Glider report — ${entry.comp_id}`, now, db)
}

/**
 * The report of every accepted entry of a class, one after another, for the competition's staff
 * (403 for an entrant, who prints their own entry's); 404 for a class not of this competition.
 */
export async function classReport(access: CompetitionAccess, classId: string, now: Date = new Date(), db: Knex = useDb()): Promise<{ report: GliderReport, className: string }> {
  const { competition } = access
  if (!access.roles.some(r => STAFF_ROLES.includes(r))) throw httpError(403, MESSAGES.reportClassStaffOnly)
  const klass = await db('classes').where({ id: classId, competition_id: competition.id }).first('name') as { name: string } | undefined
  if (!klass) throw httpError(404, MESSAGES.classNotFound)
  const ids = (await db('entries').where({ competition_id: competition.id, class_id: classId, status: 'accepted' }).select('id') as { id: string }[]).map(r => r.id)
  return { report: await gliderReport(competition, ids, `Glider reports — ${klass.name}`, now, db), className: klass.name }
}

/** The file name of a report download. */
export function reportFilename(slug: string, what: string): string {
  return `report-${slug}-${what}`.replace(/[^\w-]+/g, '-').replace(/-+/g, '-').replace(/-$/, '') + '.pdf'
}
