// The entry fee, as kept on the entry by the payment module: paid when the payments recorded
// (card, bank transfer, cash, another way, net of refunds) and the office's waivers reach the
// fee due. A change to a dearer class leaves the difference owed.
import type { Check } from '../types'
import { formatMoney } from '../../utils/money'

export const entryPaid: Check = {
  id: 'entry.paid',
  severity: 'blocking',
  source: 'organiser setting',
  rule: 'The entry fee is paid before the first contest day.',
  run({ dossier, competition }) {
    const { status, owedMinor, currency } = dossier.payment
    if (status === 'paid') return []
    const owed = owedMinor !== undefined && owedMinor > 0 && currency ? formatMoney(owedMinor, currency) : null
    const due = `it is due before the first contest day (${competition.firstContestDay})`
    let reason: string
    if (status === 'refunded') reason = owed ? `The entry fee was refunded, so ${owed} is owed again; ${due}.` : 'The entry fee was refunded, so the entry is not paid.'
    else reason = owed ? `${owed} of the entry fee is still to pay; ${due}.` : `The entry fee is not paid yet; ${due}.`
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: 'payment',
      reason,
      fixHint: `Pay${owed ? ` the ${owed}` : ' the entry fee'} from your entry page, or ask the competition office if you have paid another way (bank transfer, cash): they record it.`,
    }]
  },
}
