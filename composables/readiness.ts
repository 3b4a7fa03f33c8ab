// Words for the four readiness states (see DESIGN.md). The board, the phone and the badge all
// read these so a state is always named the same way. Move to shared/ once the server needs them.
export const READINESS_STATES = ['ready', 'caution', 'held', 'unchecked'] as const
export type Readiness = (typeof READINESS_STATES)[number]

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
