// Water ballast in a class that flies without it: the grid check's own item, and a weigh-in
// that declares water ballast.
import { WATER_BALLAST_EMPTY_ITEM } from '../../constants/grid'
import { HARDWARE_CAUTION } from '../caution'
import type { Check, Finding } from '../types'
import { classLimitOf, currentWeighIn, formatKg } from './helpers'

export const ballastClassRule: Check = {
  id: 'ballast.class-rule',
  severity: 'blocking',
  source: 'FAI Sporting Code Section 3 Annex A (Club class: no water ballast in flight); competition rules',
  rule: 'In a class without water ballast, the day’s grid check finds the tanks empty (its item “Water ballast tanks empty” passes) and no weigh-in declares water ballast.',
  run(ctx) {
    if (classLimitOf(ctx).waterBallast) return []
    const { dossier } = ctx
    const out: Finding[] = []
    const answer = dossier.gridCheck?.answers?.find(a => a.itemId === WATER_BALLAST_EMPTY_ITEM.id)
    if (answer?.result === 'fail') {
      out.push({
        checkId: this.id,
        severity: 'blocking',
        subject: 'grid-check',
        caution: HARDWARE_CAUTION,
        reason: `The grid check of ${dossier.gridCheck!.day} found water ballast aboard; the ${dossier.entry.className} class flies without water ballast.`,
        fixHint: 'Drain the water ballast tanks as the flight manual describes, then ask a scrutineer to check again.',
      })
    }
    const w = currentWeighIn(ctx)
    if (w && (w.declaredBallastKg ?? 0) > 0) {
      out.push({
        checkId: this.id,
        severity: 'blocking',
        subject: w.id ? `weigh-in:${w.id}` : 'weigh-in',
        caution: HARDWARE_CAUTION,
        reason: `The weigh-in of ${w.weighedOn} declares ${formatKg(w.declaredBallastKg!)} of water ballast; the ${dossier.entry.className} class flies without water ballast.`,
        fixHint: 'Fly without water ballast: drain the tanks, then weigh again without declared ballast.',
      })
    }
    return out
  },
}
