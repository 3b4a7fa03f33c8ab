// What an entry still lacks and what its entrant should do next, in plain words. Pure: the
// submit route, the dossier page and "My entries" all read the same answer.
import { DOCUMENT_KIND_LABELS, type DocumentKind, type EntryStatus, type PaymentStatus } from '../constants/entries'
import type { CompetitionRules } from '../schemas/competition'
import type { Finding } from '../engine/types'
import type { DirectorAction } from '../engine/readiness'
import { entryVerdict, type Actor } from './entry-verdict'

export interface ProgressEntry {
  status: EntryStatus
  decisionReason?: string | null
  pilotName?: string | null
  pilotNationality?: string | null
  pilotLicenceNumber?: string | null
  pilotPhone?: string | null
  emergencyContact?: string | null
  gliderType?: string | null
  registration?: string | null
  compId?: string | null
  spanM?: number | null
  mtomKg?: number | null
  emptyMassKg?: number | null
}

export interface ProgressInput {
  entry: ProgressEntry
  units: { id?: string, kind: string, model?: string, serial?: string, approvalLevel?: string | null }[]
  rules: Pick<CompetitionRules, 'recordersRequired' | 'requiredDocumentKinds' | 'acceptedApprovalLevels'>
  documents: { kind: string, status: string }[]
  igcFiles: { unitId: string | null }[]
  paymentStatus: PaymentStatus
  /** The engine's findings, so the next step says what blocks and who acts (entry-verdict.ts). */
  findings?: readonly Finding[]
  /** The open contest day and the director's actions that count on it (its waivers lift findings for that day). */
  day?: string | null
  actions?: readonly DirectorAction[]
}

export interface MissingItem {
  key: string
  text: string
  /** Needed before the entry can be submitted (the rest is needed before the event). */
  blocksSubmit: boolean
}

export interface EntryProgress {
  missing: MissingItem[]
  /** Nothing that blocks submitting is missing. */
  submittable: boolean
  nextStep: string
  /** What the findings leave open (competition-wide waivers applied) and who acts next. */
  open: { pilot: number, inReview: number, actor: Actor | null }
}

/** Fields the organiser needs before reviewing an entry, with how to ask for each. */
const REQUIRED_FIELDS: { field: keyof ProgressEntry, text: string }[] = [
  { field: 'pilotName', text: 'Enter the pilot’s name.' },
  { field: 'pilotNationality', text: 'Enter the pilot’s nationality.' },
  { field: 'pilotLicenceNumber', text: 'Enter the pilot’s licence number.' },
  { field: 'pilotPhone', text: 'Enter the pilot’s phone number.' },
  { field: 'emergencyContact', text: 'Enter an emergency contact.' },
  { field: 'gliderType', text: 'Enter the glider type.' },
  { field: 'registration', text: 'Enter the glider’s registration.' },
  { field: 'compId', text: 'Enter the competition ID.' },
  { field: 'spanM', text: 'Enter the glider’s span.' },
  { field: 'mtomKg', text: 'Enter the MTOM from the flight manual.' },
  { field: 'emptyMassKg', text: 'Enter the glider’s empty mass.' },
]

/** The entry's own fields submitting needs (a draft may be saved without them). */
export const FIELDS_NEEDED_TO_SUBMIT: readonly (keyof ProgressEntry)[] = REQUIRED_FIELDS.map(f => f.field)

function blank(v: unknown): boolean {
  return v === null || v === undefined || (typeof v === 'string' && v.trim() === '')
}

export function entryProgress(input: ProgressInput): EntryProgress {
  const missing: MissingItem[] = []
  const { entry, rules } = input

  for (const { field, text } of REQUIRED_FIELDS) {
    if (blank(entry[field])) missing.push({ key: `field:${field}`, text, blocksSubmit: true })
  }

  if (!input.units.some(u => u.kind === 'collision-warning')) {
    missing.push({ key: 'unit:collision-warning', text: 'Add the collision-warning unit.', blocksSubmit: true })
  }
  const recorders = input.units.filter(u => u.kind === 'flight-recorder')
  if (recorders.length < rules.recordersRequired) {
    const lacking = rules.recordersRequired - recorders.length
    missing.push({
      key: 'unit:flight-recorder',
      text: rules.recordersRequired === 1
        ? 'Add a flight recorder.'
        : `Add ${lacking === 1 ? 'one more flight recorder' : `${lacking} flight recorders`}: this competition requires ${rules.recordersRequired}.`,
      blocksSubmit: true,
    })
  }
  for (const r of recorders) {
    if (r.approvalLevel && !rules.acceptedApprovalLevels.includes(r.approvalLevel as never)) {
      missing.push({
        key: `recorder-approval:${r.id ?? r.serial}`,
        text: `Recorder ${describe(r)} has an approval level this competition does not accept: fit an approved recorder.`,
        blocksSubmit: false,
      })
    }
  }

  for (const kind of rules.requiredDocumentKinds) {
    const label = DOCUMENT_KIND_LABELS[kind as DocumentKind] ?? kind
    const docs = input.documents.filter(d => d.kind === kind)
    if (docs.length === 0) {
      missing.push({ key: `document:${kind}`, text: `Upload the ${label.toLowerCase()}.`, blocksSubmit: false })
    }
    else if (docs.every(d => d.status === 'rejected')) {
      missing.push({ key: `document:${kind}`, text: `Your ${label.toLowerCase()} was rejected: upload a new one.`, blocksSubmit: false })
    }
  }

  for (const r of recorders) {
    if (r.id && !input.igcFiles.some(f => f.unitId === r.id)) {
      missing.push({ key: `igc:${r.id}`, text: `Upload a recent IGC file from recorder ${describe(r)}.`, blocksSubmit: false })
    }
  }

  if (input.paymentStatus !== 'paid') {
    missing.push({ key: 'payment', text: 'Pay the entry fee.', blocksSubmit: false })
  }

  const submittable = !missing.some(m => m.blocksSubmit)
  const verdict = entryVerdict({ status: entry.status, findings: input.findings ?? [], day: input.day ?? null, actions: input.actions ?? [] })
  return {
    missing: entry.status === 'withdrawn' ? [] : missing,
    submittable,
    nextStep: nextStep(entry, missing, submittable, verdict),
    open: { pilot: verdict.pilot.length, inReview: verdict.inReview.length, actor: verdict.actor },
  }
}

function describe(u: { model?: string, serial?: string }): string {
  return [u.model, u.serial && `(${u.serial})`].filter(Boolean).join(' ') || 'without a name'
}

function nextStep(entry: ProgressEntry, missing: MissingItem[], submittable: boolean, verdict: ReturnType<typeof entryVerdict>): string {
  const first = missing[0]?.text
  const toFix = verdict.pilot[0]
  const count = verdict.pilot.length
  const reviewing = verdict.inReview.length
    ? ` ${verdict.inReview.length === 1 ? 'One document waits' : `${verdict.inReview.length} documents wait`} for a scrutineer’s review; nothing for you to do there.`
    : ''
  switch (entry.status) {
    case 'draft':
      if (!submittable) return `Complete the entry, then submit it. Next: ${missing.find(m => m.blocksSubmit)!.text}`
      return 'Submit the entry so the organiser can review it.'
    case 'rejected':
      return `The organiser rejected the entry${entry.decisionReason ? ` with the reason “${entry.decisionReason}”` : ''}. Put it right, then submit it again.`
    case 'submitted':
      if (toFix) return `Wait for the organiser to accept the entry. Meanwhile put right (${count === 1 ? '1 finding' : `${count} findings`}): ${toFix.fixHint}${reviewing}`
      return first
        ? `Wait for the organiser to accept the entry. Meanwhile: ${first}${reviewing}`
        : `Wait for the organiser to accept the entry.${reviewing}`
    case 'accepted':
      if (toFix) return `The entry is accepted, but ${count === 1 ? '1 finding keeps' : `${count} findings keep`} the glider from flying. Put right first: ${toFix.fixHint}${reviewing}`
      if (verdict.waived.some(f => f.severity === 'blocking')) {
        const waived = verdict.waived.filter(f => f.severity === 'blocking')
        return `The entry is accepted and nothing blocks today: the contest director waived ${waived.length === 1 ? '1 finding' : `${waived.length} findings`} (see Findings). Put ${waived.length === 1 ? 'it' : 'them'} right before the waiver ends: ${waived[0]!.fixHint}${reviewing}`
      }
      if (first) return `The entry is accepted. Before the event: ${first}${reviewing}`
      if (reviewing) return `The entry is accepted.${reviewing}`
      return 'The entry is accepted and nothing blocks. Bring the glider to scrutineering.'
    case 'withdrawn':
      return 'This entry is withdrawn. Nothing more to do.'
  }
}
