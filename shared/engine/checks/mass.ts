// The take-off mass at the weigh-in against the class limit and the glider's own MTOM. The
// take-off mass is the scale readings + declared water ballast when weighed dry + the
// occupants' weighed masses with parachute (shared/engine/weigh-in.ts, takeOffMass).
import { HARDWARE_CAUTION } from '../caution'
import type { Check, CheckContext, Finding, WeighInRecord } from '../types'
import { takeOffMass, type TakeOffMass } from '../weigh-in'
import { classLimitOf, currentWeighIn, formatKg } from './helpers'

/** The class's maximum take-off mass: the competition's setting, else the FAI default. */
export function classMassLimit(ctx: CheckContext): number | null {
  return classLimitOf(ctx).maxMtomKg
}

/** Half a tenth of a kilogram: readings are given to 0.1 kg, so rounding noise never blocks. */
const EPSILON_KG = 0.05

/** "432.0 kg on the scales + pilot with parachute 88.0 kg": every term of the sum. */
export function massTermsText(t: TakeOffMass): string {
  return t.terms.map((x, i) => (i === 0 ? `${formatKg(x.massKg)} on the scales` : `${x.label.toLowerCase().replace(/ \(weighed dry\)$/, '')} ${formatKg(x.massKg)}`)).join(' + ')
}

/** The weigh-in that counts and its take-off mass, or null without a weigh-in. */
function weighed(ctx: CheckContext): { w: WeighInRecord, t: TakeOffMass } | null {
  const w = currentWeighIn(ctx)
  return w ? { w, t: takeOffMass(w, ctx.dossier.entry) } : null
}

function pilotMissing(checkId: string, w: WeighInRecord, t: TakeOffMass): Finding {
  return {
    checkId,
    severity: 'advisory',
    subject: w.id ? `weigh-in:${w.id}` : 'weigh-in',
    reason: `The pilot’s weighed mass is not recorded, so the take-off mass of ${w.weighedOn} (${formatKg(t.massKg)}) counts the glider only.`,
    fixHint: 'At the registration desk, weigh the pilot (and co-pilot) with parachute and record the masses on the entry.',
  }
}

function overLimit(checkId: string, ctx: CheckContext, w: WeighInRecord, t: TakeOffMass, limit: number, whose: string): Finding {
  return {
    checkId,
    severity: 'blocking',
    subject: w.id ? `weigh-in:${w.id}` : 'weigh-in',
    reason: `Take-off mass on ${w.weighedOn}: ${formatKg(t.massKg)} (${massTermsText(t)}); ${whose} allows at most ${formatKg(limit)}.`,
    fixHint: `Reduce the take-off mass by at least ${formatKg(t.massKg - limit)} (water ballast first), then weigh again.`,
  }
}

export const massClassLimit: Check = {
  id: 'mass.class-limit',
  severity: 'blocking / advisory',
  source: 'FAI Sporting Code Section 3 Annex A class limits (masses `from memory`: Annex A not read, see shared/constants/classes.ts)',
  rule: 'The take-off mass at the weigh-in (scale readings + declared water ballast when weighed dry + pilot and co-pilot with parachute) is no more than the class’s maximum take-off mass (blocking); a weigh-in without the pilot’s recorded mass is flagged (advisory).',
  run(ctx) {
    const x = weighed(ctx)
    const limit = classMassLimit(ctx)
    if (!x || limit == null) return []
    if (x.t.massKg > limit + EPSILON_KG) return [{ ...overLimit(this.id, ctx, x.w, x.t, limit, `the ${ctx.dossier.entry.className} class`), caution: HARDWARE_CAUTION }]
    return x.t.pilotKnown ? [] : [pilotMissing(this.id, x.w, x.t)]
  },
}

export const massFlightManual: Check = {
  id: 'mass.flight-manual',
  severity: 'blocking / advisory',
  source: 'flight manual',
  rule: 'The take-off mass at the weigh-in is no more than the glider’s maximum take-off mass from its flight manual (blocking); without a class limit, a weigh-in without the pilot’s recorded mass is flagged here (advisory).',
  run(ctx) {
    const x = weighed(ctx)
    const mtom = ctx.dossier.entry.mtomKg
    if (!x || mtom == null) return []
    if (x.t.massKg > mtom + EPSILON_KG) return [{ ...overLimit(this.id, ctx, x.w, x.t, mtom, 'the glider’s flight manual'), caution: HARDWARE_CAUTION }]
    return x.t.pilotKnown || classMassLimit(ctx) != null ? [] : [pilotMissing(this.id, x.w, x.t)]
  },
}

export const MASS_CHECKS = [massClassLimit, massFlightManual]
