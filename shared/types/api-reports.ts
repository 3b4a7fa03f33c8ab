// What the office's paperwork routes answer: the tracking list (the glider reports are PDFs).
import type { IsoDate } from '../engine/types'

/**
 * One line of the tracking list: one collision-warning unit of an accepted entry, or the entry
 * alone with `radioId` null when it has none (so the gap shows).
 */
export interface TrackingRow {
  entryId: string
  compId: string
  registration: string
  gliderType: string
  className: string
  pilotName: string
  /** The unit's 24-bit address as six upper-case hex digits; null: the entry has no collision-warning unit. */
  radioId: string | null
}

/** GET …/tracking.json */
export interface TrackingList {
  competitionId: string
  competitionName: string
  /** The board the list is filtered to; null: every accepted entry. */
  boardDay: IsoDate | null
  generatedAt: string
  rows: TrackingRow[]
}
