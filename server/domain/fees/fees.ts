// The entry fee: what is due and whether it is paid. Paid is derived from money, never a flag
// set once: after a payment, a refund, a waiver, a change of class or of a fee, the caller
// settles the entries concerned in its transaction, and their state is read again from their
// payments. Below payments, entries and competitions, so each of them can settle what it changed.
//
// What the entry keeps: paid_minor (money received, net of refunds; waivers never count as
// money), waived_minor (waivers, net), first_paid_on (for the late fee) and payment_status:
// `paid` when nothing is owed, `refunded` when money came and went back and nothing else
// counts, `unpaid` otherwise (a part payment included: what is owed says how much).
import type { Knex } from 'knex'
import type { PaymentStatus } from '#shared/constants/entries'
import type { FeeDue } from '#shared/types/api-payments'
import { audit } from '#domain/audit/audit'
import { FEE_DUE_SQL, LATE_FEE_APPLIES_SQL, OWED_SQL } from '#domain/read-model/fees'
import { useDb } from '#server/utils/db'

export interface FeeState extends FeeDue {
  /** Money received, net of refunds. */
  paidMinor: number
  waivedMinor: number
  /** Still to pay now (0 when paid, or overpaid). */
  owedMinor: number
  paymentStatus: PaymentStatus
}

/** The fee due of one entry (class fee, plus the late fee where it applies) and what is owed. */
export async function feeState(entryId: string, db: Knex = useDb()): Promise<FeeState> {
  const row = await db('entries as e')
    .join('classes as k', 'k.id', 'e.class_id')
    .join('competitions as c', 'c.id', 'e.competition_id')
    .where('e.id', entryId)
    .first<{ entry_fee_minor: number, late_fee_minor: number, currency: string, late: boolean, total: number, owed: number, paid_minor: number, waived_minor: number, payment_status: PaymentStatus }>(
      'k.entry_fee_minor', 'c.late_fee_minor', 'c.currency', 'e.paid_minor', 'e.waived_minor', 'e.payment_status',
      db.raw(`${LATE_FEE_APPLIES_SQL} as late`),
      db.raw(`${FEE_DUE_SQL}::int as total`),
      db.raw(`${OWED_SQL}::int as owed`),
    )
  return {
    entryFeeMinor: row.entry_fee_minor,
    lateFeeMinor: row.late_fee_minor,
    lateFeeApplies: Boolean(row.late),
    totalMinor: row.total,
    currency: row.currency,
    paidMinor: row.paid_minor,
    waivedMinor: row.waived_minor,
    owedMinor: row.owed,
    paymentStatus: row.payment_status,
  }
}

export interface SettledChange {
  entryId: string
  from: PaymentStatus
  to: PaymentStatus
  owedMinor: number
  currency: string
}

/**
 * Reads the entries' payments again and brings paid_minor, waived_minor, first_paid_on and
 * payment_status up to date; a change of state is audited (who caused it, what is owed).
 * Call it in the transaction that changed a payment, a class or a fee, before dossierChanged.
 */
export async function settleEntryPayments(trx: Knex, competitionId: string, entryIds: readonly string[] | 'all', actorUserId: string | null): Promise<SettledChange[]> {
  const ids = entryIds === 'all'
    ? await trx('entries').where({ competition_id: competitionId }).pluck('id') as string[]
    : [...entryIds]
  if (!ids.length) return []
  await trx.raw(`
    with sums as (
      select e.id,
        coalesce(sum(p.amount_minor - p.refunded_minor) filter (where p.method <> 'waived'), 0)::int as received,
        coalesce(sum(p.amount_minor - p.refunded_minor) filter (where p.method = 'waived'), 0)::int as waived,
        min(coalesce(p.paid_on, (p.paid_at at time zone c.time_zone)::date)) as first_paid_on
      from entries e
      join competitions c on c.id = e.competition_id
      left join payments p on p.entry_id = e.id and p.status in ('paid', 'refunded')
      where e.id = any(?::uuid[]) and e.competition_id = ?
      group by e.id
    )
    update entries e set paid_minor = s.received, waived_minor = s.waived, first_paid_on = s.first_paid_on
    from sums s
    where s.id = e.id and (e.paid_minor, e.waived_minor, e.first_paid_on) is distinct from (s.received, s.waived, s.first_paid_on)`,
  [ids, competitionId])

  const rows = await trx('entries as e')
    .join('classes as k', 'k.id', 'e.class_id')
    .join('competitions as c', 'c.id', 'e.competition_id')
    .whereIn('e.id', ids)
    .select<{ id: string, payment_status: PaymentStatus, paid_minor: number, waived_minor: number, currency: string, owed: number, refunded: boolean }[]>(
      'e.id', 'e.payment_status', 'e.paid_minor', 'e.waived_minor', 'c.currency',
      trx.raw(`${OWED_SQL}::int as owed`),
      trx.raw(`exists (select 1 from payments p where p.entry_id = e.id and p.method <> 'waived' and p.refunded_minor > 0) as refunded`),
    )
  const changes: SettledChange[] = []
  for (const r of rows) {
    const next: PaymentStatus = r.owed <= 0
      ? 'paid'
      : r.refunded && r.paid_minor + r.waived_minor === 0 ? 'refunded' : 'unpaid'
    if (next === r.payment_status) continue
    changes.push({ entryId: r.id, from: r.payment_status, to: next, owedMinor: r.owed, currency: r.currency })
  }
  for (const c of changes) {
    await trx('entries').where({ id: c.entryId }).update({ payment_status: c.to, updated_at: trx.fn.now() })
  }
  if (changes.length) {
    await audit(trx, changes.map(c => ({
      actorUserId,
      competitionId,
      action: 'payment.status-changed',
      subjectType: 'entry',
      subjectId: c.entryId,
      details: { from: c.from, to: c.to, owedMinor: c.owedMinor, currency: c.currency },
    })))
  }
  return changes
}
