// API response shapes of competition set-up, the firmware catalogue and the staff entries table.
import type { CompetitionRules } from '../schemas/competition'
import type { EntryStatus, PaymentStatus } from '../constants/entries'
import type { FindingCounts } from './api-findings'

export interface SetupClass {
  id: string
  name: string
  code: string
  maxSpanM: number | null
  maxMtomKg: number | null
  waterBallast: boolean
  entryFeeMinor: number
  sortOrder: number
  /** Entries in this class; a class with entries cannot be deleted. */
  entryCount: number
}

/** GET /api/competitions/:id/setup — everything the set-up form shows. */
export interface CompetitionSetupResponse {
  id: string
  slug: string
  name: string
  airfieldName: string
  airfieldIcao: string | null
  timeZone: string
  currency: string
  firstContestDay: string | null
  lastContestDay: string | null
  practiceDays: string[]
  contestDays: string[]
  registrationOpensOn: string | null
  registrationClosesOn: string | null
  lateFeeAfter: string | null
  lateFeeMinor: number
  /** Days before the first contest day on which reminders go out, largest first (shared/utils/reminder-schedule.ts). */
  reminderDays: number[]
  /** Where people write about their data (the privacy notice names it); null: the notice names the organisers. */
  privacyContactEmail: string | null
  rules: CompetitionRules
  classes: SetupClass[]
}

export interface FirmwareRelease {
  id: string
  unitFamily: string
  version: string
  expiresOn: string
}

export interface FirmwareCatalogueResponse {
  releases: FirmwareRelease[]
  /** Whether the caller may change the catalogue (organisers and site administrators). */
  canEdit: boolean
}

export interface FirmwareImportResult {
  added: number
  updated: number
  total: number
}

/** One line of a refused CSV import: its line number in the file and what is wrong. */
export interface CsvLineError {
  line: number
  messages: string[]
}

export interface EntryTableRow {
  id: string
  compId: string
  pilotName: string
  classId: string
  className: string
  gliderType: string
  registration: string
  status: EntryStatus
  paymentStatus: PaymentStatus
  paidMinor: number
  submittedAt: string | null
  /** The last change of the accepted entry's dossier (fields, units, files), or null. */
  changedAfterAcceptanceAt: string | null
  /** The check engine's findings on the entry, counted by severity. */
  findings: FindingCounts
}

export interface EntryTableResponse {
  rows: EntryTableRow[]
  total: number
  page: number
  pageSize: number
  currency: string
}
