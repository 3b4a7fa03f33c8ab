// The weighed mass against the class limit and the glider's own MTOM.
import { faiClass } from '../../constants/classes'
import { HARDWARE_CAUTION } from '../caution'
import type { Check, CheckContext } from '../types'
import { weighIn } from '../weigh-in'
import { currentWeighIn, formatKg } from './helpers'

/** The class's maximum take-off mass: the competition's setting, else the FAI default. */
export function classMassLimit(ctx: CheckContext): number | null {
  const code = ctx.dossier.entry.classCode
  const set = ctx.competition.classLimits[code]
  if (set) return set.maxMtomKg
  return faiClass(code)?.maxMtomKg ?? null
}

/** Half a tenth of a kilogram: readings are given to 0.1 kg, so rounding noise never blocks. */
const EPSILON_KG = 0.05

export const massClassLimit: Check = {
  id: 'mass.class-limit',
  severity: 'blocking',
  source: 'FAI Sporting Code Section 3 Annex A class limits (check the current edition)',
  rule: 'The weighed mass is no more than the class’s maximum take-off mass.',
  run(ctx) {
    const w = currentWeighIn(ctx)
    const limit = classMassLimit(ctx)
    if (!w || limit == null) return []
    const { massKg } = weighIn(w.readings, w.units)
    if (massKg <= limit + EPSILON_KG) return []
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: w.id ? `weigh-in:${w.id}` : 'weigh-in',
      caution: HARDWARE_CAUTION,
      reason: `Weighed on ${w.weighedOn} at ${formatKg(massKg)}; the ${ctx.dossier.entry.className} class allows at most ${formatKg(limit)}.`,
      fixHint: `Reduce the mass by at least ${formatKg(massKg - limit)} (water ballast first), then weigh again.`,
    }]
  },
}

export const massFlightManual: Check = {
  id: 'mass.flight-manual',
  severity: 'blocking',
  source: 'flight manual',
  rule: 'The weighed mass is no more than the glider’s maximum take-off mass from its flight manual.',
  run(ctx) {
    const w = currentWeighIn(ctx)
    const mtom = ctx.dossier.entry.mtomKg
    if (!w || mtom == null) return []
    const { massKg } = weighIn(w.readings, w.units)
    if (massKg <= mtom + EPSILON_KG) return []
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: w.id ? `weigh-in:${w.id}` : 'weigh-in',
      caution: HARDWARE_CAUTION,
      reason: `Weighed on ${w.weighedOn} at ${formatKg(massKg)}; the glider’s flight manual allows at most ${formatKg(mtom)}.`,
      fixHint: `Reduce the mass by at least ${formatKg(massKg - mtom)} (water ballast first), then weigh again.`,
    }]
  },
}

export const MASS_CHECKS = [massClassLimit, massFlightManual]
