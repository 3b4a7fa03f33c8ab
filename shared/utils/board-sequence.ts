// How a board screen applies pushed changes in order. Every change of a competition's board
// carries the next number of its sequence; the snapshot says which number it reflects. A
// change at or below that number is already shown; the next number is applied; a change
// further ahead means one was missed — it is held back for a moment in case the missing one
// is only late, and if the gap stays, the screen fetches the whole board again. Pure, so the
// rules are tested without a socket.

export interface SequencedEvent {
  seq: number
}

export interface SequenceState<E extends SequencedEvent> {
  /** The last number applied (or the snapshot's). */
  seq: number
  /** Changes that arrived ahead of a missing one, by number. */
  pending: Map<number, E>
}

export type Offer<E> =
  | { kind: 'stale' }
  | { kind: 'apply', events: E[] }
  | { kind: 'gap', missing: number }

export function sequenceState<E extends SequencedEvent>(seq: number): SequenceState<E> {
  return { seq, pending: new Map() }
}

/** Offers one pushed change; returns what to apply now, in order (the state moves on). */
export function offer<E extends SequencedEvent>(state: SequenceState<E>, event: E): Offer<E> {
  if (event.seq <= state.seq) return { kind: 'stale' }
  if (event.seq > state.seq + 1) {
    state.pending.set(event.seq, event)
    return { kind: 'gap', missing: state.seq + 1 }
  }
  const events: E[] = [event]
  state.seq = event.seq
  for (let next = state.pending.get(state.seq + 1); next; next = state.pending.get(state.seq + 1)) {
    state.pending.delete(next.seq)
    events.push(next)
    state.seq = next.seq
  }
  return { kind: 'apply', events }
}

/**
 * After a fresh snapshot at `seq` (it replaces everything shown): drop the changes it already
 * holds, then return those that follow it, in order, to apply on top.
 */
export function rebase<E extends SequencedEvent>(state: SequenceState<E>, seq: number): E[] {
  state.seq = seq
  for (const n of [...state.pending.keys()]) if (n <= state.seq) state.pending.delete(n)
  const events: E[] = []
  for (let next = state.pending.get(state.seq + 1); next; next = state.pending.get(state.seq + 1)) {
    state.pending.delete(next.seq)
    events.push(next)
    state.seq = next.seq
  }
  return events
}

/** Whether changes are waiting behind a missing one. */
export function hasGap(state: SequenceState<SequencedEvent>): boolean {
  return state.pending.size > 0
}
