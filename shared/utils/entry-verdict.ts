// One answer to "what keeps this entry from flying, and who acts next", computed once from the
// engine's findings, the director's actions and the day, and read by every screen and e-mail
// that says it: the next step on the entry page and My entries, the organiser's decision, the
// readiness card, the grid result card and the held e-mail. Pure.
import type { EntryStatus } from '../constants/entries'
import { applyWaivers, isHeld, readiness, type DirectorAction, type Readiness } from '../engine/readiness'
import type { Finding, GridCheck, IsoDate } from '../engine/types'

/** Who must act: the pilot (entrant), the office (a scrutineer's review), the grid's scrutineers, the director. */
export type Actor = 'pilot' | 'office' | 'scrutineer' | 'director'

export interface VerdictInput {
  status: EntryStatus
  /** The engine's findings on the entry (before waivers). */
  findings: readonly Finding[]
  /** The director's actions that count (the day's and the competition-wide ones). */
  actions?: readonly DirectorAction[]
  /** The contest day the verdict is for; without one, waivers for the whole competition only. */
  day?: IsoDate | null
  /** The day's latest grid check. */
  gridCheck?: GridCheck | null
  /** A failed checklist item's label, to name it. */
  failedItem?: string | null
}

export interface Verdict {
  /** Blocking findings the pilot must put right. */
  pilot: Finding[]
  /** Blocking findings that wait on the staff's review. */
  inReview: Finding[]
  /** Findings a director's waiver lifts. */
  waived: Finding[]
  /** Advisory findings that remain. */
  advisory: Finding[]
  /** The director holds the glider on the day. */
  held: boolean
  /** The day's grid check failed. */
  gridFailed: boolean
  /** The readiness on the day, when a day is given. */
  readiness: Readiness | null
  /** Who acts next; null when nothing is open. */
  actor: Actor | null
  /** What decides it, in one sentence for the person reading. */
  summary: string
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`

export function entryVerdict(input: VerdictInput): Verdict {
  const day = input.day ?? null
  const actions = input.actions ?? []
  // Without a day only the competition-wide waivers count (a day's waiver is for that day).
  const open = applyWaivers(input.findings, day ? actions : actions.filter(a => a.kind !== 'waiver' || a.day === null), day ?? '')
  const waived = input.findings.filter(f => !open.includes(f))
  const blocking = open.filter(f => f.severity === 'blocking')
  const pilot = blocking.filter(f => f.awaiting !== 'review')
  const inReview = blocking.filter(f => f.awaiting === 'review')
  const advisory = open.filter(f => f.severity === 'advisory')
  const held = day ? isHeld(actions, day) : false
  const gridFailed = Boolean(day && input.gridCheck && input.gridCheck.day === day && input.gridCheck.outcome === 'fail')
  const state = day ? readiness(input.findings, input.gridCheck, actions, day) : null

  let actor: Actor | null = null
  let summary: string
  if (input.status === 'withdrawn') {
    summary = 'The entry is withdrawn.'
  }
  else if (held) {
    actor = 'director'
    summary = 'Held by the contest director: see the director before launch.'
  }
  else if (pilot.length) {
    actor = 'pilot'
    summary = `${plural(pilot.length, 'finding', 'findings')} for the pilot to put right: ${pilot[0]!.reason}`
  }
  else if (gridFailed) {
    actor = 'scrutineer'
    summary = `The grid check failed${input.failedItem ? ` (${input.failedItem})` : ''}: put it right and ask a scrutineer to check again.`
  }
  else if (inReview.length) {
    actor = 'office'
    summary = `Waiting for the office: ${plural(inReview.length, 'document waits', 'documents wait')} for a scrutineer’s review.`
  }
  else if (day && state === 'unchecked') {
    actor = 'scrutineer'
    summary = 'Nothing blocks: bring the glider to a scrutineer on the grid.'
  }
  else {
    summary = advisory.length
      ? `Nothing blocks; ${plural(advisory.length, 'advisory finding', 'advisory findings')} to look at.`
      : 'Nothing blocks.'
  }
  if (waived.length && input.status !== 'withdrawn') summary += ` ${plural(waived.length, 'finding is', 'findings are')} waived by the director.`
  return { pilot, inReview, waived, advisory, held, gridFailed, readiness: state, actor, summary }
}
