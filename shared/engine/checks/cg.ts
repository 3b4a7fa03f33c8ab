// The CG from the weigh-in against the glider's CG limits, where the entry gives them.
import { HARDWARE_CAUTION } from '../caution'
import type { Check } from '../types'
import { takeOffMass } from '../weigh-in'
import { currentWeighIn, formatM } from './helpers'

/** Half a millimetre: arms are measured to the millimetre. */
const EPSILON_M = 0.0005

export const cgWithinLimits: Check = {
  id: 'cg.within-limits',
  severity: 'blocking',
  source: 'flight manual; mass × arm method (FAA AC 43.13-1B ch. 10, FAA-H-8083-1)',
  rule: 'The take-off CG, Σ(W·arm)/ΣW over the scale readings, declared water ballast and the occupants at the flight manual’s lever arms, lies within the glider’s CG limits, where the limits and arms are given.',
  run(ctx) {
    const { entry } = ctx.dossier
    const fwd = entry.cgForwardLimitM ?? null
    const aft = entry.cgAftLimitM ?? null
    const w = currentWeighIn(ctx)
    if (!w || (fwd == null && aft == null)) return []
    const { cgArmM } = takeOffMass(w, entry)
    if (cgArmM == null) return []
    const range = `${fwd == null ? '…' : formatM(fwd)} to ${aft == null ? '…' : formatM(aft)} aft of the datum`
    const base = { checkId: this.id, severity: 'blocking' as const, subject: w.id ? `weigh-in:${w.id}` : 'weigh-in', caution: HARDWARE_CAUTION }
    if (fwd != null && cgArmM < fwd - EPSILON_M) {
      return [{ ...base, reason: `Weighed on ${w.weighedOn}, the take-off CG is ${formatM(cgArmM)} aft of the datum, ${formatM(fwd - cgArmM)} ahead of the forward limit (${range}).`, fixHint: 'Move the CG aft as the flight manual allows (tail ballast or less nose ballast), then weigh again.' }]
    }
    if (aft != null && cgArmM > aft + EPSILON_M) {
      return [{ ...base, reason: `Weighed on ${w.weighedOn}, the take-off CG is ${formatM(cgArmM)} aft of the datum, ${formatM(cgArmM - aft)} behind the aft limit (${range}).`, fixHint: 'Move the CG forward as the flight manual allows (nose ballast or less tail ballast), then weigh again.' }]
    }
    return []
  },
}
