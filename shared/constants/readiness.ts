// Words for the four readiness states (DESIGN.md). The board, the phone, the badge, the e-mails
// and the CSV exports all read these, so a state is always named the same way.
import type { Readiness } from '../engine/readiness'

export type { Readiness }

export const READINESS_STATES = ['ready', 'caution', 'held', 'unchecked'] as const satisfies readonly Readiness[]

export const READINESS_LABELS: Record<Readiness, string> = {
  ready: 'Ready',
  caution: 'Caution',
  held: 'Held',
  unchecked: 'Unchecked',
}

export const READINESS_MEANINGS: Record<Readiness, string> = {
  ready: 'Grid-checked today, nothing blocking.',
  caution: 'Grid-checked today, advisory findings only.',
  held: 'A blocking finding or a director’s hold.',
  unchecked: 'No grid check yet today.',
}

/** The board's order of attention: what needs the director first. */
export const READINESS_ORDER: readonly Readiness[] = ['held', 'caution', 'unchecked', 'ready']
