// Row types of the grid-check tables (migrations/20261204000200_grid_checks.ts), written by hand.
import type { CheckResult, FoundBy } from '../constants/grid'
import type { Finding, ScaleReading, WeighUnits } from '../engine/types'
import type { Readiness } from '../engine/readiness'

export interface GridCheckAnswerJson {
  itemId: string
  label: string
  result: CheckResult
  note: string
}

export interface GridCheckRow {
  id: string
  competition_id: string
  entry_id: string
  /** YYYY-MM-DD (a `date` column, read as its text by the type parser in knexfile.ts) */
  day: string
  idempotency_key: string
  body_sha256: string
  scrutineer_id: string
  checked_at: Date
  received_at: Date
  answers: GridCheckAnswerJson[]
  notes: string
  outcome: 'pass' | 'fail'
  readiness: Readiness
  findings: Finding[]
  found_by: FoundBy | null
}

export interface WeighInRow {
  id: string
  competition_id: string
  entry_id: string
  grid_check_id: string | null
  /** YYYY-MM-DD (a `date` column, read as its text by the type parser in knexfile.ts) */
  weighed_on: string
  units: WeighUnits
  readings: ScaleReading[]
  /** numeric columns arrive from pg as strings */
  mass_kg: string
  cg_arm_m: string | null
  weighed_by: string
  created_at: Date
}
