// What the findings routes answer. Findings come from the check engine (shared/engine).
import type { EntryStatus } from '../constants/entries'
import type { Finding, Severity } from '../engine/types'

export interface FindingCounts {
  /** Blocking findings the pilot must put right. */
  blocking: number
  advisory: number
  /** Blocking findings waiting on the staff's review (a document), counted apart from `blocking`. */
  inReview?: number
}

export interface EntryFindings extends FindingCounts {
  entryId: string
  /** Blocking first, then advisory, each in catalogue order. */
  findings: Finding[]
}

export interface CompetitionFindingsEntry extends EntryFindings {
  compId: string
  pilotName: string
  status: EntryStatus
}

export interface CompetitionFindings {
  entries: CompetitionFindingsEntry[]
  /** How many findings each check raised, by severity. */
  byCheck: Record<string, Record<Severity, number>>
  bySeverity: FindingCounts
}
