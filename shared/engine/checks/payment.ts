// The entry fee, as kept on the entry by the payment module.
import type { Check } from '../types'

export const entryPaid: Check = {
  id: 'entry.paid',
  severity: 'blocking',
  source: 'organiser setting',
  rule: 'The entry fee is paid before the first contest day.',
  run({ dossier, competition }) {
    const status = dossier.payment.status
    if (status === 'paid') return []
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: 'payment',
      reason: status === 'refunded'
        ? 'The entry fee was refunded, so the entry is not paid.'
        : `The entry fee is not paid yet; it is due before the first contest day (${competition.firstContestDay}).`,
      fixHint: 'Pay the entry fee from your entry page, or ask the competition office if you have paid another way.',
    }]
  },
}
