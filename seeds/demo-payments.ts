// Demo card payments: one paid checkout for every entry the field marks paid, and a refunded
// one for the withdrawn entry, as the payment module would have recorded them. Session and
// payment ids are invented (cs_demo_…, pi_demo_…) and unknown to any payment service.
import type { Knex } from 'knex'

export async function seedDemoPayments(trx: Knex, competitionId: string): Promise<void> {
  const entries = await trx('entries as e')
    .join('classes as c', 'c.id', 'e.class_id')
    .join('competitions as k', 'k.id', 'e.competition_id')
    .where('e.competition_id', competitionId)
    .whereIn('e.payment_status', ['paid', 'refunded'])
    .select('e.id', 'e.comp_id', 'e.payment_status', 'e.entrant_user_id', 'e.submitted_at', 'c.entry_fee_minor', 'k.currency') as
    { id: string, comp_id: string, payment_status: 'paid' | 'refunded', entrant_user_id: string, submitted_at: Date | null, entry_fee_minor: number, currency: string }[]
  if (!entries.length) return
  await trx('payments').insert(entries.map((e) => {
    const paidAt = e.submitted_at ?? new Date('2027-03-01T10:00:00Z')
    const refunded = e.payment_status === 'refunded'
    return {
      competition_id: competitionId,
      entry_id: e.id,
      created_by: e.entrant_user_id,
      session_id: `cs_demo_${e.comp_id.toLowerCase()}`,
      payment_intent: `pi_demo_${e.comp_id.toLowerCase()}`,
      amount_minor: e.entry_fee_minor,
      currency: e.currency,
      status: refunded ? 'refunded' : 'paid',
      refunded_minor: refunded ? e.entry_fee_minor : 0,
      refund_id: refunded ? `re_demo_${e.comp_id.toLowerCase()}` : null,
      paid_at: paidAt,
      refunded_at: refunded ? new Date(paidAt.getTime() + 20 * 86_400_000) : null,
    }
  }))
}
