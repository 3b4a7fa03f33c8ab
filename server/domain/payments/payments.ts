// Card payments of entry fees through the payment service's SDK: the fee due, checkout
// sessions, the signed notifications (webhooks) and refunds. The SDK client is made once from
// runtime config; with real keys and no apiBase it talks to the real service, so switching
// from the local fake is a matter of keys alone.
//
// Exactly once: every notification's event id is inserted into payment_events in the same
// transaction as its effect, so a repeated notification changes nothing. Payment rows are
// locked (FOR UPDATE) while a change is applied, and a refund is recorded only for the amount
// not yet recorded, so the refund route and the refund's notification can both arrive.
import Stripe from 'stripe'
import type { Knex } from 'knex'
import type { H3Event } from 'h3'
import type { CompetitionRow, EntryRow, PaymentRow } from '#shared/types/rows'
import type { CompetitionPaymentRow, CompetitionPaymentsResponse, EntryPaymentsResponse, FeeDue, PaymentSummary } from '#shared/types/api-payments'
import type { PaymentsQuery } from '#shared/schemas/payment'
import { paymentEventSchema } from '#shared/schemas/payment'
import { MESSAGES } from '#shared/constants/messages'
import { PAYMENT_MAIL_TEMPLATES } from '#shared/constants/payments'
import { formatMoney, fromMinorUnits } from '#shared/utils/money'
import { csvSafeRows } from '#shared/utils/csv-safe'
import { stringify } from 'csv-stringify/sync'
import { audit } from '#domain/audit/audit'
import { dossierChanged } from '#domain/board/dossier-changed'
import { enqueueMail } from '#domain/mail/outbox'
import { paymentReceivedMail, refundMail } from '#domain/mail/templates'
import { iso } from '#domain/read-model/values'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { siteUrl } from '#server/utils/site-url'

let client: { key: string, stripe: Stripe } | undefined

/** The SDK client, or null when no secret key is configured. */
export function paymentClient(): Stripe | null {
  const config = useRuntimeConfig().payments
  if (!config.secretKey) return null
  if (client?.key === config.secretKey) return client.stripe
  const options: Stripe.StripeConfig = { maxNetworkRetries: 1, timeout: 15_000 }
  if (config.apiBase) {
    const base = new URL(config.apiBase)
    options.host = base.hostname
    options.port = Number(base.port || (base.protocol === 'https:' ? 443 : 80))
    options.protocol = base.protocol === 'https:' ? 'https' : 'http'
  }
  client = { key: config.secretKey, stripe: new Stripe(config.secretKey, options) }
  return client.stripe
}

function requireClient(): Stripe {
  const stripe = paymentClient()
  if (!stripe) throw httpError(503, MESSAGES.paymentsNotConfigured)
  return stripe
}

/** A failure to reach the service (or its refusal) becomes a 502 that says nothing was charged. */
async function callService<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call()
  }
  catch (error) {
    console.error('[gridmark] payment service call failed', (error as Error).message)
    throw httpError(502, MESSAGES.paymentServiceDown)
  }
}

// ---------------------------------------------------------------------------------------
// Fee due

/** The class's entry fee, plus the late fee when today, in the competition's time zone, is after late_fee_after. */
export async function feeDue(entry: EntryRow, db: Knex = useDb()): Promise<FeeDue> {
  const row = await db('entries as e')
    .join('classes as cl', 'cl.id', 'e.class_id')
    .join('competitions as c', 'c.id', 'e.competition_id')
    .where('e.id', entry.id)
    .first<{ entry_fee_minor: number, late_fee_minor: number, currency: string, late: boolean }>(
      'cl.entry_fee_minor',
      'c.late_fee_minor',
      'c.currency',
      db.raw(`coalesce((now() AT TIME ZONE c.time_zone)::date > c.late_fee_after, false) AS late`),
    )
  const lateFeeApplies = Boolean(row.late) && row.late_fee_minor > 0
  return {
    entryFeeMinor: row.entry_fee_minor,
    lateFeeMinor: row.late_fee_minor,
    lateFeeApplies,
    totalMinor: row.entry_fee_minor + (lateFeeApplies ? row.late_fee_minor : 0),
    currency: row.currency,
  }
}

function amountDue(entry: EntryRow, fee: FeeDue): number {
  if (entry.payment_status === 'paid') return 0
  return Math.max(0, fee.totalMinor - entry.paid_minor)
}

function payBlockedReason(entry: EntryRow, due: number): string | null {
  if (entry.status === 'withdrawn' || entry.status === 'rejected') return MESSAGES.entryClosedForPayment
  if (entry.payment_status === 'paid') return MESSAGES.entryAlreadyPaid
  if (due <= 0) return MESSAGES.nothingToPay
  return null
}

function toSummary(p: PaymentRow): PaymentSummary {
  return {
    id: p.id,
    amountMinor: p.amount_minor,
    currency: p.currency,
    status: p.status,
    refundedMinor: p.refunded_minor,
    createdAt: iso(p.created_at),
    paidAt: iso(p.paid_at),
    refundedAt: iso(p.refunded_at),
  }
}

export async function entryPayments(entry: EntryRow, competition: CompetitionRow, isOwner: boolean): Promise<EntryPaymentsResponse> {
  const db = useDb()
  const fee = await feeDue(entry, db)
  const due = amountDue(entry, fee)
  const blocked = payBlockedReason(entry, due)
  const payments = await db<PaymentRow>('payments').where({ entry_id: entry.id }).orderBy('created_at', 'desc')
  return {
    entry: {
      id: entry.id,
      compId: entry.comp_id,
      pilotName: entry.pilot_name,
      status: entry.status,
      paymentStatus: entry.payment_status,
      paidMinor: entry.paid_minor,
    },
    competitionName: competition.name,
    fee,
    amountDueMinor: due,
    canPay: isOwner && blocked === null,
    payBlockedReason: isOwner ? blocked : null,
    payments: payments.map(toSummary),
  }
}

// ---------------------------------------------------------------------------------------
// Checkout

export async function startCheckout(event: H3Event, entry: EntryRow, competition: CompetitionRow, user: { id: string, email: string }): Promise<{ url: string, paymentId: string }> {
  const db = useDb()
  const fee = await feeDue(entry, db)
  const due = amountDue(entry, fee)
  const blocked = payBlockedReason(entry, due)
  if (blocked) throw httpError(409, blocked)
  const stripe = requireClient()

  // A checkout still open for the same amount is offered again rather than a second one.
  const pending = await db<PaymentRow>('payments')
    .where({ entry_id: entry.id, status: 'pending', amount_minor: due, currency: fee.currency })
    .orderBy('created_at', 'desc').first()
  if (pending) {
    const session = await callService(() => stripe.checkout.sessions.retrieve(pending.session_id))
    if (session.status === 'open' && session.url) return { url: session.url, paymentId: pending.id }
  }

  const pagePath = `/competitions/${competition.id}/entries/${entry.id}/payment`
  const origin = siteUrl(event)
  const metadata = { entryId: entry.id, competitionId: competition.id }
  const session = await callService(() => stripe.checkout.sessions.create({
    mode: 'payment',
    line_items: [{
      quantity: 1,
      price_data: {
        currency: fee.currency.toLowerCase(),
        unit_amount: due,
        product_data: { name: `Entry fee: ${competition.name}, ${entry.comp_id} (${entry.pilot_name})`.slice(0, 250) },
      },
    }],
    client_reference_id: entry.id,
    customer_email: user.email,
    metadata,
    payment_intent_data: { metadata },
    success_url: `${origin}${pagePath}?return=success&session_id={CHECKOUT_SESSION_ID}`,
    cancel_url: `${origin}${pagePath}?return=cancel`,
  }))
  if (!session.url) throw httpError(502, MESSAGES.paymentServiceDown)

  const paymentId = await db.transaction(async (trx) => {
    const [row] = await trx('payments').insert({
      competition_id: competition.id,
      entry_id: entry.id,
      created_by: user.id,
      session_id: session.id,
      amount_minor: session.amount_total ?? due,
      currency: fee.currency,
      status: 'pending',
    }).returning('id')
    await audit(trx, {
      actorUserId: user.id,
      competitionId: competition.id,
      action: 'payment.checkout-started',
      subjectType: 'entry',
      subjectId: entry.id,
      details: { paymentId: row.id, amountMinor: session.amount_total ?? due, currency: fee.currency },
    })
    return row.id as string
  })
  return { url: session.url, paymentId }
}

// ---------------------------------------------------------------------------------------
// Notifications

/** Verifies the signature and returns the event; 400 with a clear message otherwise. */
export function verifyWebhook(rawBody: string | Buffer | undefined, signature: string | undefined): Stripe.Event {
  const secret = useRuntimeConfig().payments.webhookSecret
  if (!secret) throw httpError(503, MESSAGES.paymentsNotConfigured)
  if (!signature) throw httpError(400, MESSAGES.webhookSignatureMissing)
  if (!rawBody) throw httpError(400, MESSAGES.webhookBodyInvalid)
  let parsed: Stripe.Event
  try {
    parsed = Stripe.webhooks.constructEvent(rawBody, signature, secret)
  }
  catch (error) {
    if (error instanceof Stripe.errors.StripeSignatureVerificationError) throw httpError(400, MESSAGES.webhookSignatureInvalid)
    throw httpError(400, MESSAGES.webhookBodyInvalid)
  }
  if (!paymentEventSchema.safeParse(parsed).success) throw httpError(400, MESSAGES.webhookBodyInvalid)
  return parsed
}

interface EntryMailInfo {
  email: string
  name: string
  comp_id: string
  competition_name: string
}

/** The entrant's entry page, where a payment or a refund shows. */
function entryPageUrl(competitionId: string, entryId: string): string {
  return `${siteUrl()}/competitions/${competitionId}/entries/${entryId}`
}

async function entryMailInfo(trx: Knex, entryId: string): Promise<EntryMailInfo> {
  return trx('entries as e')
    .join('users as u', 'u.id', 'e.entrant_user_id')
    .join('competitions as c', 'c.id', 'e.competition_id')
    .where('e.id', entryId)
    .first('u.email', 'u.name', 'e.comp_id', 'c.name as competition_name')
}

async function markPaid(trx: Knex.Transaction, payment: PaymentRow, session: Stripe.Checkout.Session, eventId: string): Promise<void> {
  if (payment.status === 'paid' || payment.status === 'refunded') return // another event said so already
  const amount = session.amount_total ?? payment.amount_minor
  const paymentIntent = typeof session.payment_intent === 'string' ? session.payment_intent : session.payment_intent?.id ?? null
  await trx('payments').where({ id: payment.id }).update({
    status: 'paid', payment_intent: paymentIntent, amount_minor: amount, paid_at: trx.fn.now(), updated_at: trx.fn.now(),
  })
  await trx('entries').where({ id: payment.entry_id }).update({
    payment_status: 'paid', paid_minor: trx.raw('paid_minor + ?', [amount]), updated_at: trx.fn.now(),
  })
  await audit(trx, {
    actorUserId: null,
    competitionId: payment.competition_id,
    action: 'payment.paid',
    subjectType: 'entry',
    subjectId: payment.entry_id,
    details: { paymentId: payment.id, amountMinor: amount, currency: payment.currency, eventId },
  })
  const info = await entryMailInfo(trx, payment.entry_id)
  const money = formatMoney(amount, payment.currency)
  const mail = paymentReceivedMail({ entrantName: info.name, compId: info.comp_id, competitionName: info.competition_name, money, entryUrl: entryPageUrl(payment.competition_id, payment.entry_id) })
  await enqueueMail(trx, {
    to: info.email,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    template: PAYMENT_MAIL_TEMPLATES.received,
    competitionId: payment.competition_id,
    entryId: payment.entry_id,
  })
  // A payment can clear `entry.paid`.
  await dossierChanged(trx, payment.competition_id, [payment.entry_id], null)
}

/**
 * Records `refundedTotal` (what the service says is refunded in all) on a payment. Only
 * the part not yet recorded changes anything, so recording twice is harmless.
 */
async function recordRefund(trx: Knex.Transaction, paymentId: string, refundedTotal: number, refundId: string | null, actorUserId: string | null): Promise<boolean> {
  const payment = await trx<PaymentRow>('payments').where({ id: paymentId }).forUpdate().first()
  if (!payment) return false
  const total = Math.min(refundedTotal, payment.amount_minor)
  const delta = total - payment.refunded_minor
  if (delta <= 0) return false
  const full = total >= payment.amount_minor
  await trx('payments').where({ id: payment.id }).update({
    refunded_minor: total,
    status: full ? 'refunded' : payment.status,
    refund_id: refundId ?? payment.refund_id,
    refunded_at: trx.fn.now(),
    updated_at: trx.fn.now(),
  })
  const [entry] = await trx('entries').where({ id: payment.entry_id }).update({
    paid_minor: trx.raw('greatest(paid_minor - ?, 0)', [delta]),
    updated_at: trx.fn.now(),
  }).returning(['paid_minor'])
  if (entry.paid_minor === 0) await trx('entries').where({ id: payment.entry_id }).update({ payment_status: 'refunded' })
  await audit(trx, {
    actorUserId,
    competitionId: payment.competition_id,
    action: 'payment.refunded',
    subjectType: 'entry',
    subjectId: payment.entry_id,
    details: { paymentId: payment.id, refundedMinor: delta, currency: payment.currency, refundId },
  })
  const info = await entryMailInfo(trx, payment.entry_id)
  const money = formatMoney(delta, payment.currency)
  const mail = refundMail({
    entrantName: info.name, compId: info.comp_id, competitionName: info.competition_name, money,
    full: entry.paid_minor === 0, entryUrl: entryPageUrl(payment.competition_id, payment.entry_id),
  })
  await enqueueMail(trx, {
    to: info.email,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    template: PAYMENT_MAIL_TEMPLATES.refund,
    competitionId: payment.competition_id,
    entryId: payment.entry_id,
  })
  await dossierChanged(trx, payment.competition_id, [payment.entry_id], actorUserId)
  return true
}

export interface WebhookOutcome {
  received: true
  duplicate: boolean
  handled: boolean
}

/** Applies one verified event, exactly once. Unknown types and unknown payments are acknowledged and ignored. */
export async function processPaymentEvent(evt: Stripe.Event): Promise<WebhookOutcome> {
  return useDb().transaction(async (trx): Promise<WebhookOutcome> => {
    const inserted = await trx('payment_events').insert({ event_id: evt.id, type: evt.type }).onConflict('event_id').ignore().returning('event_id')
    if (inserted.length === 0) return { received: true, duplicate: true, handled: false }

    let paymentId: string | null = null
    switch (evt.type) {
      case 'checkout.session.completed':
      case 'checkout.session.async_payment_succeeded': {
        const session = evt.data.object as Stripe.Checkout.Session
        const payment = await trx<PaymentRow>('payments').where({ session_id: session.id }).forUpdate().first()
        if (payment && session.payment_status === 'paid') {
          await markPaid(trx, payment, session, evt.id)
          paymentId = payment.id
        }
        break
      }
      case 'checkout.session.expired':
      case 'checkout.session.async_payment_failed': {
        const session = evt.data.object as Stripe.Checkout.Session
        const updated = await trx('payments').where({ session_id: session.id, status: 'pending' })
          .update({ status: 'failed', updated_at: trx.fn.now() }).returning('id')
        paymentId = updated[0]?.id ?? null
        break
      }
      case 'charge.refunded': {
        const charge = evt.data.object as Stripe.Charge
        const pi = typeof charge.payment_intent === 'string' ? charge.payment_intent : charge.payment_intent?.id
        const payment = pi ? await trx<PaymentRow>('payments').where({ payment_intent: pi }).first() : undefined
        if (payment) {
          await recordRefund(trx, payment.id, charge.amount_refunded, null, null)
          paymentId = payment.id
        }
        break
      }
    }
    if (paymentId) await trx('payment_events').where({ event_id: evt.id }).update({ payment_id: paymentId })
    return { received: true, duplicate: false, handled: paymentId !== null }
  })
}

// ---------------------------------------------------------------------------------------
// Refunds (organiser)

export async function refundEntry(entry: EntryRow, actorUserId: string): Promise<PaymentSummary> {
  if (entry.status !== 'withdrawn') throw httpError(409, MESSAGES.refundNeedsWithdrawal)
  const db = useDb()
  const payment = await db<PaymentRow>('payments')
    .where({ entry_id: entry.id }).whereIn('status', ['paid', 'refunded'])
    .orderBy('paid_at', 'desc').first()
  if (!payment || !payment.payment_intent) throw httpError(409, MESSAGES.refundNothingPaid)
  if (payment.refunded_minor >= payment.amount_minor) throw httpError(409, MESSAGES.refundAlreadyDone)
  const stripe = requireClient()
  // One idempotency key per payment and amount: a double click refunds once.
  const remaining = payment.amount_minor - payment.refunded_minor
  const refund = await callService(() => stripe.refunds.create(
    { payment_intent: payment.payment_intent!, amount: remaining, metadata: { entryId: entry.id, paymentId: payment.id } },
    { idempotencyKey: `refund-${payment.id}-${payment.refunded_minor}` },
  ))
  await db.transaction(trx => recordRefund(trx, payment.id, payment.refunded_minor + refund.amount, refund.id, actorUserId))
  const after = await db<PaymentRow>('payments').where({ id: payment.id }).first()
  return toSummary(after!)
}

// ---------------------------------------------------------------------------------------
// The organiser's table

interface CompetitionPaymentDbRow extends PaymentRow {
  comp_id: string
  pilot_name: string
  entrant_name: string
  entry_status: string
  entry_payment_status: EntryRow['payment_status']
}

export async function competitionPayments(competition: CompetitionRow, query: PaymentsQuery): Promise<CompetitionPaymentsResponse> {
  const db = useDb()
  const rows = await db('payments as p')
    .join('entries as e', 'e.id', 'p.entry_id')
    .join('users as u', 'u.id', 'e.entrant_user_id')
    .where('p.competition_id', competition.id)
    .modify((q) => {
      if (query.status) q.where('p.status', query.status)
    })
    .orderBy([{ column: 'p.created_at', order: 'desc' }])
    .select<CompetitionPaymentDbRow[]>('p.*', 'e.comp_id', 'e.pilot_name', 'u.name as entrant_name', 'e.status as entry_status', 'e.payment_status as entry_payment_status')
  const out: CompetitionPaymentRow[] = rows.map(r => ({
    ...toSummary(r),
    entryId: r.entry_id,
    compId: r.comp_id,
    pilotName: r.pilot_name,
    entrantName: r.entrant_name,
    entryStatus: r.entry_status,
    entryPaymentStatus: r.entry_payment_status,
    refundable: r.entry_status === 'withdrawn' && r.status === 'paid' && r.refunded_minor < r.amount_minor,
  }))
  const collected = out.filter(r => r.status === 'paid' || r.status === 'refunded').reduce((s, r) => s + r.amountMinor, 0)
  const refunded = out.reduce((s, r) => s + r.refundedMinor, 0)
  return {
    currency: competition.currency,
    rows: out,
    totals: { collectedMinor: collected, refundedMinor: refunded, netMinor: collected - refunded, count: out.length },
  }
}

/** The payments table as CSV: amounts in major units with a dot, dates in ISO 8601. */
export async function competitionPaymentsCsv(competition: CompetitionRow, query: PaymentsQuery): Promise<string> {
  const { rows } = await competitionPayments(competition, query)
  return stringify([
    ['competition_id', 'pilot', 'entrant', 'entry_status', 'amount', 'refunded', 'currency', 'status', 'created_at', 'paid_at', 'refunded_at'],
    ...csvSafeRows(rows.map(r => [
      r.compId, r.pilotName, r.entrantName, r.entryStatus, fromMinorUnits(r.amountMinor), fromMinorUnits(r.refundedMinor),
      r.currency, r.status, r.createdAt, r.paidAt ?? '', r.refundedAt ?? '',
    ])),
  ])
}
