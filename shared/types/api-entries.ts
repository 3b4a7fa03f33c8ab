// What the entries API answers: an entry's dossier, its units, and the entrant's summaries.
import type { ApprovalLevel, EntryStatus, PaymentStatus, UnitKind } from '../constants/entries'
import type { Role } from '../constants/roles'
import type { CompetitionRules } from '../schemas/competition'
import type { CompetitionClassSummary } from './api'
import type { EntryProgress } from '../utils/entry-progress'
import type { Finding } from '../engine/types'
import type { FindingCounts } from './api-findings'

export interface EntryView {
  id: string
  competitionId: string
  classId: string
  entrantUserId: string
  entrantName: string
  status: EntryStatus
  decisionReason: string | null
  pilotName: string
  pilotNationality: string | null
  pilotLicenceNumber: string | null
  pilotPhone: string | null
  emergencyContact: string | null
  copilotName: string | null
  crewNames: string[]
  gliderType: string
  registration: string
  compId: string
  spanM: number | null
  mtomKg: number | null
  emptyMassKg: number | null
  cgForwardLimitM: number | null
  cgAftLimitM: number | null
  datumDescription: string | null
  motorGlider: 'none' | 'self-launching' | 'sustainer' | 'electric'
  /** The last change of the dossier after acceptance (fields, units, files), or null. */
  changedAfterAcceptanceAt: string | null
  /** The pilot's and co-pilot's mass with parachute, kg (registration weighing, staff). */
  pilotMassKg: number | null
  copilotMassKg: number | null
  /** The flight manual's lever arms, m from the datum. */
  pilotArmM: number | null
  copilotArmM: number | null
  ballastArmM: number | null
  paymentStatus: PaymentStatus
  submittedAt: string | null
  decidedAt: string | null
  withdrawnAt: string | null
  updatedAt: string
}

export interface UnitView {
  id: string
  entryId: string
  kind: UnitKind
  model: string
  serial: string
  firmwareVersion: string | null
  radioId: string | null
  firmwareExpiresOn: string | null
  firmwareUpdatedOn: string | null
  obstacleDbVersion: string | null
  obstacleDbExpiresOn: string | null
  approvalLevel: ApprovalLevel | null
  /** A flight recorder's IGC recorder ID ("XXXABC"). */
  igcRecorderId: string | null
}

/** Documents, IGC files and payments of an entry, as other areas' tables provide them. */
export interface DossierDocument { id: string, kind: string, status: string }
export interface DossierIgcFile { id: string, unitId: string | null }
export interface DossierPayment { id: string, status: string, amountMinor: number }

export interface EntryCompetitionInfo {
  id: string
  name: string
  timeZone: string
  firstContestDay: string | null
  lastContestDay: string | null
  registrationOpensOn: string | null
  registrationClosesOn: string | null
  /** Today falls within the registration window (in the competition's time zone). */
  registrationOpen: boolean
  currency: string
}

/** What the asking user may do with this entry now, and why not when they may not. */
export interface EntryPermissions {
  edit: boolean
  /** Shown when edit is false, or to explain until when editing stays possible. */
  editNote: string
  submit: boolean
  /** The entrant withdraws their own entry. */
  withdraw: boolean
  /** The organiser withdraws someone else's entry for the pilot, with a reason. */
  withdrawForPilot: boolean
  decide: boolean
}

export interface EntryDossier {
  entry: EntryView
  competition: EntryCompetitionInfo
  entryClass: CompetitionClassSummary
  classes: CompetitionClassSummary[]
  units: UnitView[]
  rules: CompetitionRules
  documents: DossierDocument[]
  igcFiles: DossierIgcFile[]
  payments: DossierPayment[]
  progress: EntryProgress
  /** The check engine's findings, blocking first (shared/engine; server/domain/findings/findings.ts). */
  findings: Finding[]
  can: EntryPermissions
  /** The caller's roles in the competition (site administrators count as organisers). */
  roles: Role[]
  isOwner: boolean
}

export interface MyEntrySummary {
  id: string
  competitionId: string
  competitionName: string
  firstContestDay: string | null
  lastContestDay: string | null
  className: string
  compId: string
  gliderType: string
  registration: string
  pilotName: string
  status: EntryStatus
  paymentStatus: PaymentStatus
  missing: string[]
  nextStep: string
  /** How many blocking and advisory findings the check engine raises on the entry. */
  findings: FindingCounts
}

export interface OpenCompetition {
  competitionId: string
  name: string
  airfieldName: string
  firstContestDay: string | null
  lastContestDay: string | null
  registrationClosesOn: string | null
  classes: CompetitionClassSummary[]
  /** How many entries the caller already has here (not withdrawn). */
  myEntries: number
}

export interface FirmwareSuggestion {
  expiresOn: string | null
  unitFamily: string | null
  version: string | null
}

/** A message between the entrant and the office about an entry. */
export interface EntryMessage {
  id: string
  fromOffice: boolean
  authorName: string
  body: string
  at: string
}
