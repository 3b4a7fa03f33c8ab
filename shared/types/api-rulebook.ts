// What the rulebook route answers: every check of the engine's catalogue, by family, with the
// competition's settings that change it.
import type { Check } from '../engine/types'
import type { CheckFamilyId } from '../constants/rulebook'

/** One setting of the competition that changes a check, with its current value. */
export interface RuleSetting {
  /** The rule setting's name (`firmwareMarginDays`), or `class.<limit>` for a class's limit. */
  key: string
  /** What it is, in words ("Standard: maximum take-off mass"). */
  label: string
  /** The value as stored (null: the class sets no limit). */
  value: number | boolean | string[] | null
  /** The value in words ("30 days", "525 kg", "None required"). */
  text: string
}

export interface RulebookCheck {
  id: string
  severity: Check['severity']
  rule: string
  source: string
  /** Its fix touches hardware: its findings carry the caution. */
  touchesHardware: boolean
  settings: RuleSetting[]
}

export interface RulebookFamily {
  id: CheckFamilyId
  title: string
  lead: string
  checks: RulebookCheck[]
}

/** GET /api/competitions/:id/checks */
export interface Rulebook {
  competitionId: string
  families: RulebookFamily[]
}
