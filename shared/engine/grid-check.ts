// What a grid check means to the engine, the same on the server and on the phone: its outcome
// from the checklist answers, and the dossier with the check's weigh-in as the day's last.
import type { Dossier, IsoDate, ScaleReading, WeighUnits } from './types'

/** A weigh-in as the grid check sends it. */
export interface GridWeighIn { units: WeighUnits, readings: ScaleReading[], declaredBallastKg?: number | null }

/** A grid check fails when any checklist item failed; unanswered items do not fail it. */
export function checkOutcome(answers: readonly { result: string }[]): 'pass' | 'fail' {
  return answers.some(a => a.result === 'fail') ? 'fail' : 'pass'
}

/** The dossier with a weigh-in taken on `day` added (a new dossier; the given one is unchanged). */
export function withWeighIn(dossier: Dossier, day: IsoDate, weigh: GridWeighIn | null | undefined): Dossier {
  if (!weigh) return dossier
  return { ...dossier, weighIns: [...dossier.weighIns, { weighedOn: day, units: weigh.units, readings: weigh.readings, declaredBallastKg: weigh.declaredBallastKg ?? 0 }] }
}

/**
 * The dossier as this grid check leaves it: the check as the day's latest (its answers are what
 * `ballast.class-rule` reads) and its weigh-in as the day's last. A new dossier.
 */
export function withGridCheck(dossier: Dossier, check: { day: IsoDate, answers: readonly { itemId: string, result: string }[], weighIn?: GridWeighIn | null }): Dossier {
  const answers = check.answers.map(a => ({ itemId: a.itemId, result: a.result }))
  return { ...withWeighIn(dossier, check.day, check.weighIn), gridCheck: { day: check.day, outcome: checkOutcome(answers), answers } }
}
