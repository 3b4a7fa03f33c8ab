// An entry's readiness on a contest day (DESIGN.md, vocabulary "readiness"):
//   held      — a director's hold for the day; or, once grid-checked, a failed check or a
//               blocking finding that is not waived;
//   unchecked — no grid check for the day yet (and no hold): every entry starts the day so,
//               while its standing findings carry over and show beside it on the board;
//   caution   — grid-checked today, advisory findings remain;
//   ready     — grid-checked today, nothing remains.
// A director's hold wins over everything. A release ends an earlier hold of the same day; a
// blocking finding needs its own waiver.
import type { Finding, GridCheck, IsoDate } from './types'

export type Readiness = 'ready' | 'caution' | 'held' | 'unchecked'

export type DirectorAction =
  | { kind: 'hold', day: IsoDate, reason?: string }
  | { kind: 'release', day: IsoDate, reason?: string }
  | {
    kind: 'waiver'
    /** The day the waiver is for; null waives for the whole competition. */
    day: IsoDate | null
    checkId: string
    /** Narrows the waiver to one unit's or one subject's finding. */
    unitId?: string
    subject?: string
    reason?: string
  }

type Waiver = Extract<DirectorAction, { kind: 'waiver' }>

function waives(w: Waiver, f: Finding, day: IsoDate): boolean {
  if (w.day !== null && w.day !== day) return false
  if (w.checkId !== f.checkId) return false
  if (w.unitId !== undefined && w.unitId !== f.unitId) return false
  if (w.subject !== undefined && w.subject !== f.subject) return false
  return true
}

/** The findings that remain once the day's waivers are applied (never more than given). */
export function applyWaivers(findings: readonly Finding[], actions: readonly DirectorAction[], day: IsoDate): Finding[] {
  const waivers = actions.filter((a): a is Waiver => a.kind === 'waiver')
  if (waivers.length === 0) return [...findings]
  return findings.filter(f => !waivers.some(w => waives(w, f, day)))
}

/** Whether the director's latest hold or release of the day (in the order taken) is a hold. */
export function isHeld(actions: readonly DirectorAction[], day: IsoDate): boolean {
  let held = false
  for (const a of actions) {
    if (a.day !== day) continue
    if (a.kind === 'hold') held = true
    else if (a.kind === 'release') held = false
  }
  return held
}

export function readiness(findings: readonly Finding[], gridCheck: GridCheck | null | undefined, directorActions: readonly DirectorAction[], day: IsoDate): Readiness {
  if (isHeld(directorActions, day)) return 'held'
  if (gridCheck == null || gridCheck.day !== day) return 'unchecked'
  if (gridCheck.outcome === 'fail') return 'held'
  const open = applyWaivers(findings, directorActions, day)
  if (open.some(f => f.severity === 'blocking')) return 'held'
  return open.length > 0 ? 'caution' : 'ready'
}
