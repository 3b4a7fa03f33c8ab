// The glider's span against its class's maximum span.
import type { Check } from '../types'
import { classLimitOf } from './helpers'

/** Half a centimetre: spans are given to the centimetre. */
const EPSILON_M = 0.005

export const spanClassLimit: Check = {
  id: 'span.class-limit',
  severity: 'blocking',
  source: 'FAI Sporting Code Section 3, class definitions (ch. 7.7: “a maximum span of 18,000 mm”, 15,000 mm); Annex A',
  rule: 'The entry’s wing span is no more than its class’s maximum span, where the class sets one.',
  run(ctx) {
    const { entry } = ctx.dossier
    const limit = classLimitOf(ctx).maxSpanM
    const span = entry.spanM ?? null
    if (limit == null || span == null || span <= limit + EPSILON_M) return []
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: 'span',
      reason: `The entry gives a span of ${span.toFixed(2)} m; the ${entry.className} class allows at most ${limit.toFixed(2)} m.`,
      fixHint: `Enter in a class that admits a ${span.toFixed(2)} m span, or correct the span if it was mistyped (wing tips as flown in the competition).`,
    }]
  },
}
