// What a grid check means to the engine, the same on the server and on the phone: its outcome
// from the checklist answers, and the dossier with the check's weigh-in as the day's last.
import type { Dossier, IsoDate, ScaleReading, WeighUnits } from './types'

/** A grid check fails when any checklist item failed; unanswered items do not fail it. */
export function checkOutcome(answers: readonly { result: string }[]): 'pass' | 'fail' {
  return answers.some(a => a.result === 'fail') ? 'fail' : 'pass'
}

/** The dossier with a weigh-in taken on `day` added (a new dossier; the given one is unchanged). */
export function withWeighIn(dossier: Dossier, day: IsoDate, weigh: { units: WeighUnits, readings: ScaleReading[] } | null | undefined): Dossier {
  if (!weigh) return dossier
  return { ...dossier, weighIns: [...dossier.weighIns, { weighedOn: day, units: weigh.units, readings: weigh.readings }] }
}
