// Demo payments: a paid checkout for every entry the field marks paid — but for the first, which
// paid by bank transfer recorded by the office — and a card payment refunded in full, with its
// reason, for the withdrawn entry, as the payment module would have recorded them. Session and
// payment ids are invented (cs_demo_…, pi_demo_…) and unknown to any payment service.
import type { Knex } from 'knex'

export async function seedDemoPayments(trx: Knex, competitionId: string, organiserId: string | null = null): Promise<void> {
  const entries = await trx('entries as e')
    .join('classes as c', 'c.id', 'e.class_id')
    .join('competitions as k', 'k.id', 'e.competition_id')
    .where('e.competition_id', competitionId)
    .whereIn('e.payment_status', ['paid', 'refunded'])
    .orderBy('e.comp_id')
    .select('e.id', 'e.comp_id', 'e.payment_status', 'e.entrant_user_id', 'e.submitted_at', 'c.entry_fee_minor', 'k.currency') as
    { id: string, comp_id: string, payment_status: 'paid' | 'refunded', entrant_user_id: string, submitted_at: Date | null, entry_fee_minor: number, currency: string }[]
  if (!entries.length) return
  const bankTransfer = organiserId ? entries.find(e => e.payment_status === 'paid')?.id : undefined
  const rows = await trx('payments').insert(entries.map((e) => {
    const paidAt = e.submitted_at ?? new Date('2027-03-01T10:00:00Z')
    const refunded = e.payment_status === 'refunded'
    const common = {
      competition_id: competitionId,
      entry_id: e.id,
      amount_minor: e.entry_fee_minor,
      currency: e.currency,
      status: refunded ? 'refunded' : 'paid',
      paid_at: paidAt,
    }
    if (e.id === bankTransfer) {
      return {
        ...common, created_by: organiserId, recorded_by: organiserId, method: 'bank-transfer',
        reference: `KM27-${e.comp_id}`, paid_on: paidAt.toISOString().slice(0, 10),
      }
    }
    return {
      ...common,
      created_by: e.entrant_user_id,
      session_id: `cs_demo_${e.comp_id.toLowerCase()}`,
      payment_intent: `pi_demo_${e.comp_id.toLowerCase()}`,
      refunded_minor: refunded ? e.entry_fee_minor : 0,
      refund_id: refunded ? `re_demo_${e.comp_id.toLowerCase()}` : null,
      refunded_at: refunded ? new Date(paidAt.getTime() + 20 * 86_400_000) : null,
    }
  })).returning(['id', 'entry_id', 'amount_minor', 'refunded_minor', 'refund_id', 'refunded_at']) as
    { id: string, entry_id: string, amount_minor: number, refunded_minor: number, refund_id: string | null, refunded_at: Date | null }[]
  const refunds = rows.filter(r => r.refunded_minor > 0).map(r => ({
    competition_id: competitionId,
    entry_id: r.entry_id,
    payment_id: r.id,
    amount_minor: r.refunded_minor,
    reason: 'Withdrew before the event; the fee is refunded in full.',
    recorded_by: organiserId,
    status: 'succeeded',
    service_refund_id: r.refund_id,
    created_at: r.refunded_at,
    completed_at: r.refunded_at,
  }))
  if (refunds.length) await trx('payment_refunds').insert(refunds)
  await trx.raw(`update entries e set first_paid_on = (p.paid_at at time zone c.time_zone)::date
    from payments p join competitions c on c.id = p.competition_id where p.entry_id = e.id and e.competition_id = ?`, [competitionId])
}
