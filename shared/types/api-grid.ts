// What the grid-check routes answer, and the day's pack a scrutineer's phone keeps offline.
import type { CheckResult, ChecklistItem, FoundBy } from '../constants/grid'
import type { CompetitionForEngine, Dossier, Field, Finding, IsoDate, WeighUnits, ScaleReading } from '../engine/types'
import type { DirectorAction, Readiness } from '../engine/readiness'

export interface ChecklistAnswer {
  itemId: string
  /** The item's label when the check was made (the checklist may change later). */
  label: string
  result: CheckResult
  note: string
}

export interface GridWeighIn {
  units: WeighUnits
  readings: ScaleReading[]
  massKg: number
  cgArmM: number | null
}

export interface GridCheckRecord {
  id: string
  competitionId: string
  entryId: string
  compId: string
  day: IsoDate
  /** The phone's time of the check (ISO). */
  checkedAt: string
  /** When the server stored it (ISO); later than checkedAt for a check queued offline. */
  receivedAt: string
  scrutineer: { id: string, name: string, initials: string }
  answers: ChecklistAnswer[]
  weighIn: GridWeighIn | null
  notes: string
  outcome: 'pass' | 'fail'
  readiness: Readiness
  /** The engine's findings when it was recorded (blocking first). */
  findings: Finding[]
  foundBy: FoundBy | null
  idempotencyKey: string
}

/** POST …/grid-checks: the stored check; replayed = the same key and body came before. */
export interface GridCheckResult {
  gridCheck: GridCheckRecord
  replayed: boolean
}

export interface GridCheckList {
  gridChecks: GridCheckRecord[]
}

/** The latest check of an entry on the day, as the pack and the scanner's list show it. */
export interface GridCheckSummary {
  id: string
  checkedAt: string
  scrutineerName: string
  scrutineerInitials: string
  outcome: 'pass' | 'fail'
  readiness: Readiness
}

export interface GridPackEntry {
  dossier: Dossier
  classId: string
  /** The entry's current tag: its short code, and the SHA-256 (hex) of the QR token. */
  tag: { shortCode: string, tokenHash: string } | null
  lastCheck: GridCheckSummary | null
  /** The director's holds, releases and waivers that count on the day, in the order taken (absent in packs kept from before). */
  directorActions?: DirectorAction[]
}

/** Everything the phone needs to check the day's gliders without signal. */
export interface GridPack {
  competitionId: string
  competitionName: string
  timeZone: string
  day: IsoDate
  generatedAt: string
  /** The competition as the engine reads it; null while it has no contest days. */
  competition: CompetitionForEngine | null
  /** Every entry's competition ID and radio IDs, for the uniqueness checks. */
  field: Field
  checklist: ChecklistItem[]
  /** Accepted entries, in competition-ID order. */
  entries: GridPackEntry[]
}
