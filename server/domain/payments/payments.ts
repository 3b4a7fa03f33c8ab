// Entry fees, taken any way: card payments through the payment service's SDK (checkout
// sessions, signed notifications), payments the office records (bank transfer, cash, another
// way), waivers of the fee, and refunds of any part of any payment, each with its reason. The
// SDK client is made once from runtime config; with real keys and no apiBase it talks to the
// real service, so switching from the local fake is a matter of keys alone.
//
// Paid is derived from money: every change ends with settleEntryPayments (#domain/fees/fees)
// in its transaction, then dossierChanged, so `entry.paid` follows at once.
//
// Exactly once: every notification's event id is inserted into payment_events in the same
// transaction as its effect. Locks are taken entry first, then payment, everywhere. A card
// refund is a row first (pending), then the service is asked with that row's id as the
// idempotency key, then the row is completed; the service's own notification completes pending
// rows too, so whichever arrives first counts and the other changes nothing. The office's form
// sends a key of its own per submission, so a double click records or refunds once.
import Stripe from 'stripe'
import type { Knex } from 'knex'
import type { H3Event } from 'h3'
import type { CompetitionRow, EntryRow, PaymentRefundRow, PaymentRow } from '#shared/types/rows'
import type {
  CompetitionPaymentRow, CompetitionPaymentsResponse, EntryPaymentsResponse, FeeDue, PaymentSummary, RecordPaymentResponse, RefundSummary,
} from '#shared/types/api-payments'
import type { PaymentRecordBody, PaymentsQuery, RefundBody } from '#shared/schemas/payment'
import { paymentEventSchema } from '#shared/schemas/payment'
import { MESSAGES } from '#shared/constants/messages'
import { PAYMENT_MAIL_TEMPLATES, RECORDED_PAYMENT_MAIL_TEMPLATES, type PaymentMethod, type RecordedPaymentMethod } from '#shared/constants/payments'
import { formatMoney, fromMinorUnits } from '#shared/utils/money'
import { csvSafeRows } from '#shared/utils/csv-safe'
import { stringify } from 'csv-stringify/sync'
import { audit } from '#domain/audit/audit'
import { dossierChanged } from '#domain/board/dossier-changed'
import { feeState, settleEntryPayments } from '#domain/fees/fees'
import { enqueueMail } from '#domain/mail/outbox'
import { mailDay, paymentReceivedMail, paymentRecordedMail, refundMail } from '#domain/mail/templates'
import { iso } from '#domain/read-model/values'
import type { EntryAccess } from '#server/utils/authz'
import { useDb } from '#server/utils/db'
import { fieldError, httpError } from '#server/utils/errors'
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

/** The class's entry fee, plus the late fee when it applies (see #domain/read-model/fees). */
export async function feeDue(entry: EntryRow, db: Knex = useDb()): Promise<FeeDue> {
  const { entryFeeMinor, lateFeeMinor, lateFeeApplies, totalMinor, currency } = await feeState(entry.id, db)
  return { entryFeeMinor, lateFeeMinor, lateFeeApplies, totalMinor, currency }
}

function payBlockedReason(entry: EntryRow, owed: number): string | null {
  if (entry.status === 'withdrawn' || entry.status === 'rejected') return MESSAGES.entryClosedForPayment
  if (owed <= 0 && entry.payment_status === 'paid') return MESSAGES.entryAlreadyPaid
  if (owed <= 0) return MESSAGES.nothingToPay
  return null
}

async function competitionToday(db: Knex, competitionId: string): Promise<string> {
  const row = await db('competitions').where({ id: competitionId }).first(db.raw('(now() at time zone time_zone)::date as today'))
  return row.today as string
}

// ---------------------------------------------------------------------------------------
// Reading payments and refunds

interface PaymentDbRow extends PaymentRow {
  paid_day: string | null
  recorded_by_name: string | null
}
interface RefundDbRow extends PaymentRefundRow {
  recorded_by_name: string | null
}

/** Payments with the day they were paid (a card's in the competition's time zone) and who recorded them. */
function paymentsQuery(db: Knex) {
  return db('payments as p')
    .join('competitions as c', 'c.id', 'p.competition_id')
    .leftJoin('users as r', 'r.id', 'p.recorded_by')
    .select('p.*', 'r.name as recorded_by_name', db.raw('coalesce(p.paid_on, (p.paid_at at time zone c.time_zone)::date) as paid_day'))
}

function refundsQuery(db: Knex) {
  return db('payment_refunds as f')
    .leftJoin('users as r', 'r.id', 'f.recorded_by')
    .select('f.*', 'r.name as recorded_by_name')
    .orderBy([{ column: 'f.created_at', order: 'asc' }, { column: 'f.id', order: 'asc' }])
}

function toRefundSummary(f: RefundDbRow, showRecorder: boolean): RefundSummary {
  return {
    id: f.id,
    amountMinor: f.amount_minor,
    reason: f.reason,
    status: f.status,
    recordedByName: showRecorder ? f.recorded_by_name : null,
    createdAt: iso(f.created_at)!,
    completedAt: iso(f.completed_at),
  }
}

function toSummary(p: PaymentDbRow, refunds: RefundDbRow[], showRecorder: boolean): PaymentSummary {
  const pending = refunds.filter(f => f.status === 'pending').reduce((sum, f) => sum + f.amount_minor, 0)
  const settled = p.status === 'paid' || p.status === 'refunded'
  return {
    id: p.id,
    amountMinor: p.amount_minor,
    currency: p.currency,
    status: p.status,
    refundedMinor: p.refunded_minor,
    createdAt: iso(p.created_at)!,
    paidAt: iso(p.paid_at),
    refundedAt: iso(p.refunded_at),
    method: p.method,
    reference: p.reference,
    reason: p.reason,
    paidOn: p.paid_day,
    recordedByName: showRecorder ? p.recorded_by_name : null,
    refundableMinor: settled ? Math.max(0, p.amount_minor - p.refunded_minor - pending) : 0,
    refunds: refunds.map(f => toRefundSummary(f, showRecorder)),
  }
}

function refundsByPayment(refunds: RefundDbRow[]): Map<string, RefundDbRow[]> {
  const out = new Map<string, RefundDbRow[]>()
  for (const f of refunds) {
    const list = out.get(f.payment_id)
    if (list) list.push(f)
    else out.set(f.payment_id, [f])
  }
  return out
}

async function paymentSummary(db: Knex, paymentId: string, showRecorder = true): Promise<PaymentSummary> {
  const payment = await paymentsQuery(db).where('p.id', paymentId).first() as PaymentDbRow
  const refunds = await refundsQuery(db).where('f.payment_id', paymentId) as RefundDbRow[]
  return toSummary(payment, refunds, showRecorder)
}

export async function entryPayments(access: EntryAccess): Promise<EntryPaymentsResponse> {
  const { entry, competition, isOwner, isStaff } = access
  const db = useDb()
  const state = await feeState(entry.id, db)
  const blocked = payBlockedReason(entry, state.owedMinor)
  const payments = await paymentsQuery(db).where('p.entry_id', entry.id).orderBy([{ column: 'p.created_at', order: 'desc' }, { column: 'p.id', order: 'desc' }]) as PaymentDbRow[]
  const refunds = refundsByPayment(await refundsQuery(db).where('f.entry_id', entry.id) as RefundDbRow[])
  return {
    entry: {
      id: entry.id,
      compId: entry.comp_id,
      pilotName: entry.pilot_name,
      status: entry.status,
      paymentStatus: state.paymentStatus,
      paidMinor: state.paidMinor,
      waivedMinor: state.waivedMinor,
    },
    competitionName: competition.name,
    fee: { entryFeeMinor: state.entryFeeMinor, lateFeeMinor: state.lateFeeMinor, lateFeeApplies: state.lateFeeApplies, totalMinor: state.totalMinor, currency: state.currency },
    // A withdrawn entry owes nothing more, whatever its class's fee.
    amountDueMinor: entry.status === 'withdrawn' ? 0 : state.owedMinor,
    canPay: isOwner && blocked === null,
    payBlockedReason: isOwner ? blocked : null,
    canRecord: access.roles.includes('organiser'),
    today: await competitionToday(db, competition.id),
    payments: payments.map(p => toSummary(p, refunds.get(p.id) ?? [], isStaff)),
  }
}

// ---------------------------------------------------------------------------------------
// Checkout

export async function startCheckout(event: H3Event, entry: EntryRow, competition: CompetitionRow, user: { id: string, email: string }): Promise<{ url: string, paymentId: string }> {
  const db = useDb()
  const { owedMinor: due, currency } = await feeState(entry.id, db)
  const blocked = payBlockedReason(entry, due)
  if (blocked) throw httpError(409, blocked)
  const stripe = requireClient()

  // A checkout still open for the same amount is offered again rather than a second one.
  const pending = await db<PaymentRow>('payments')
    .where({ entry_id: entry.id, method: 'card', status: 'pending', amount_minor: due, currency })
    .orderBy('created_at', 'desc').first()
  if (pending?.session_id) {
    const session = await callService(() => stripe.checkout.sessions.retrieve(pending.session_id!))
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
        currency: currency.toLowerCase(),
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
      method: 'card',
      session_id: session.id,
      amount_minor: session.amount_total ?? due,
      currency,
      status: 'pending',
    }).returning('id')
    await audit(trx, {
      actorUserId: user.id,
      competitionId: competition.id,
      action: 'payment.checkout-started',
      subjectType: 'entry',
      subjectId: entry.id,
      details: { paymentId: row.id, amountMinor: session.amount_total ?? due, currency },
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
  status: string
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
    .first('u.email', 'u.name', 'e.comp_id', 'e.status', 'c.name as competition_name')
}

async function mailEntrant(trx: Knex, payment: Pick<PaymentRow, 'competition_id' | 'entry_id'>, template: string, mail: { subject: string, text: string, html: string }, to: string) {
  await enqueueMail(trx, {
    to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    template,
    competitionId: payment.competition_id,
    entryId: payment.entry_id,
  })
}

/** Locks the entry, then the payment (the order every change here keeps). */
async function lockPayment(trx: Knex, where: Partial<Pick<PaymentRow, 'id' | 'session_id' | 'payment_intent'>>): Promise<PaymentRow | undefined> {
  const found = await trx<PaymentRow>('payments').where(where).first('id', 'entry_id')
  if (!found) return undefined
  await trx('entries').where({ id: found.entry_id }).forUpdate().first('id')
  return trx<PaymentRow>('payments').where({ id: found.id }).forUpdate().first()
}

async function markPaid(trx: Knex.Transaction, payment: PaymentRow, session: Stripe.Checkout.Session, eventId: string): Promise<void> {
  if (payment.status === 'paid' || payment.status === 'refunded') return // another event said so already
  const amount = session.amount_total ?? payment.amount_minor
  const paymentIntent = typeof session.payment_intent === 'string' ? session.payment_intent : session.payment_intent?.id ?? null
  await trx('payments').where({ id: payment.id }).update({
    status: 'paid', payment_intent: paymentIntent, amount_minor: amount, paid_at: trx.fn.now(), updated_at: trx.fn.now(),
  })
  await settleEntryPayments(trx, payment.competition_id, [payment.entry_id], null)
  await audit(trx, {
    actorUserId: null,
    competitionId: payment.competition_id,
    action: 'payment.paid',
    subjectType: 'entry',
    subjectId: payment.entry_id,
    details: { paymentId: payment.id, method: 'card', amountMinor: amount, currency: payment.currency, eventId },
  })
  const info = await entryMailInfo(trx, payment.entry_id)
  const money = formatMoney(amount, payment.currency)
  const mail = paymentReceivedMail({ entrantName: info.name, compId: info.comp_id, competitionName: info.competition_name, money, entryUrl: entryPageUrl(payment.competition_id, payment.entry_id) })
  await mailEntrant(trx, payment, PAYMENT_MAIL_TEMPLATES.received, mail, info.email)
  // A payment can clear `entry.paid`.
  await dossierChanged(trx, payment.competition_id, [payment.entry_id], null)
}

/**
 * Applies one completed refund row to its payment (locked by the caller): the amount refunded,
 * the entry's state settled again, one audit row, the entrant's e-mail, the checks.
 */
async function applyRefund(trx: Knex.Transaction, payment: PaymentRow, refund: PaymentRefundRow, actorUserId: string | null): Promise<void> {
  const total = Math.min(payment.refunded_minor + refund.amount_minor, payment.amount_minor)
  const full = total >= payment.amount_minor
  await trx('payments').where({ id: payment.id }).update({
    refunded_minor: total,
    status: full ? 'refunded' : payment.status,
    refund_id: refund.service_refund_id ?? payment.refund_id,
    refunded_at: trx.fn.now(),
    updated_at: trx.fn.now(),
  })
  await settleEntryPayments(trx, payment.competition_id, [payment.entry_id], actorUserId)
  await audit(trx, {
    actorUserId,
    competitionId: payment.competition_id,
    action: payment.method === 'waived' ? 'payment.waiver-withdrawn' : 'payment.refunded',
    subjectType: 'entry',
    subjectId: payment.entry_id,
    details: {
      paymentId: payment.id, refundId: refund.id, method: payment.method, refundedMinor: refund.amount_minor, currency: payment.currency,
      ...(refund.reason ? { reason: refund.reason } : {}), ...(refund.service_refund_id ? { serviceRefundId: refund.service_refund_id } : {}),
    },
  })
  const info = await entryMailInfo(trx, payment.entry_id)
  const state = await feeState(payment.entry_id, trx)
  const live = info.status !== 'withdrawn' && info.status !== 'rejected'
  const mail = refundMail({
    entrantName: info.name,
    compId: info.comp_id,
    competitionName: info.competition_name,
    money: formatMoney(refund.amount_minor, payment.currency),
    method: payment.method,
    reason: refund.reason,
    full: state.paidMinor + state.waivedMinor === 0,
    owed: live && state.owedMinor > 0 ? formatMoney(state.owedMinor, state.currency) : null,
    entryUrl: entryPageUrl(payment.competition_id, payment.entry_id),
  })
  await mailEntrant(trx, payment, PAYMENT_MAIL_TEMPLATES.refund, mail, info.email)
  await dossierChanged(trx, payment.competition_id, [payment.entry_id], actorUserId)
}

/**
 * The service says `refundedTotal` of a card payment is refunded in all. What is not yet
 * counted completes the pending refund rows (oldest first) it covers; anything beyond them
 * was refunded at the service itself and gets a row without a reason.
 */
async function reconcileCardRefunds(trx: Knex.Transaction, payment: PaymentRow, refundedTotal: number): Promise<boolean> {
  let delta = Math.min(refundedTotal, payment.amount_minor) - payment.refunded_minor
  if (delta <= 0) return false
  const pending = await trx<PaymentRefundRow>('payment_refunds').where({ payment_id: payment.id, status: 'pending' }).orderBy('created_at')
  let current = payment
  for (const row of pending) {
    if (row.amount_minor > delta) continue
    const [done] = await trx('payment_refunds').where({ id: row.id, status: 'pending' })
      .update({ status: 'succeeded', completed_at: trx.fn.now() }).returning('*') as PaymentRefundRow[]
    if (!done) continue
    await applyRefund(trx, current, done, done.recorded_by)
    delta -= done.amount_minor
    current = (await trx<PaymentRow>('payments').where({ id: payment.id }).first())!
  }
  if (delta > 0) {
    const [row] = await trx('payment_refunds').insert({
      competition_id: payment.competition_id, entry_id: payment.entry_id, payment_id: payment.id,
      amount_minor: delta, status: 'succeeded', completed_at: trx.fn.now(),
    }).returning('*') as PaymentRefundRow[]
    await applyRefund(trx, current, row!, null)
  }
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
        const payment = await lockPayment(trx, { session_id: session.id })
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
        const payment = pi ? await lockPayment(trx, { payment_intent: pi }) : undefined
        if (payment) {
          await reconcileCardRefunds(trx, payment, charge.amount_refunded)
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
// Payments the office records, and waivers

/**
 * The organiser records a payment made by bank transfer, in cash or another way, or waives
 * (part of) the fee. A waiver counts towards paid but is no money: it never raises paid_minor.
 * The same idempotency key twice answers the first payment (created: false).
 */
export async function recordPayment(access: EntryAccess, body: PaymentRecordBody): Promise<RecordPaymentResponse> {
  const { competition, user } = access
  const db = useDb()
  const paymentId = await db.transaction(async (trx): Promise<{ id: string, created: boolean }> => {
    const entry: EntryRow = await trx('entries').where({ id: access.entry.id }).forUpdate().first()
    if (body.idempotencyKey) {
      const again = await trx<PaymentRow>('payments').where({ entry_id: entry.id, idempotency_key: body.idempotencyKey }).first('id')
      if (again) return { id: again.id, created: false }
    }
    const today = await competitionToday(trx, competition.id)
    if (body.date > today) throw fieldError('date', MESSAGES.paymentDateInFuture(today))
    const before = await feeState(entry.id, trx)
    if (body.method === 'waived') {
      if (before.owedMinor <= 0) throw httpError(409, MESSAGES.nothingToWaive)
      if (body.amountMinor > before.owedMinor) throw fieldError('amountMinor', MESSAGES.waiverTooLarge(formatMoney(before.owedMinor, before.currency)))
    }
    const [row] = await trx('payments').insert({
      competition_id: competition.id,
      entry_id: entry.id,
      created_by: user.id,
      recorded_by: user.id,
      method: body.method,
      amount_minor: body.amountMinor,
      currency: competition.currency,
      status: 'paid',
      paid_at: trx.fn.now(),
      paid_on: body.date,
      reference: body.reference || null,
      reason: body.reason || null,
      idempotency_key: body.idempotencyKey ?? null,
    }).returning('*') as PaymentRow[]
    const payment = row!
    await settleEntryPayments(trx, competition.id, [entry.id], user.id)
    await audit(trx, {
      actorUserId: user.id,
      competitionId: competition.id,
      action: body.method === 'waived' ? 'payment.waived' : 'payment.recorded',
      subjectType: 'entry',
      subjectId: entry.id,
      details: {
        paymentId: payment.id, method: body.method, amountMinor: body.amountMinor, currency: payment.currency, paidOn: body.date,
        ...(body.method === 'waived' ? { reason: body.reason } : {}),
      },
    })
    const after = await feeState(entry.id, trx)
    const info = await entryMailInfo(trx, entry.id)
    const mail = paymentRecordedMail({
      entrantName: info.name,
      compId: info.comp_id,
      competitionName: info.competition_name,
      money: formatMoney(body.amountMinor, payment.currency),
      method: body.method as RecordedPaymentMethod,
      day: mailDay(body.date) ?? body.date,
      reference: payment.reference,
      reason: payment.reason,
      owed: after.owedMinor > 0 ? formatMoney(after.owedMinor, after.currency) : null,
      entryUrl: entryPageUrl(competition.id, entry.id),
    })
    await mailEntrant(trx, payment, body.method === 'waived' ? RECORDED_PAYMENT_MAIL_TEMPLATES.waived : RECORDED_PAYMENT_MAIL_TEMPLATES.recorded, mail, info.email)
    await dossierChanged(trx, competition.id, [entry.id], user.id)
    return { id: payment.id, created: true }
  })
  return { payment: await paymentSummary(db, paymentId.id), created: paymentId.created }
}

// ---------------------------------------------------------------------------------------
// Refunds (organiser): any part of what remains of one payment

/**
 * Refunds `amountMinor` of one payment, with a reason. A card payment's refund goes through
 * the payment service (a pending row first, its id the service's idempotency key); any other
 * is recorded at once; a waiver's "refund" withdraws that much of the waiver. Never more than
 * what remains of the payment; the same idempotency key twice refunds once.
 */
export async function refundPayment(access: EntryAccess, paymentId: string, body: RefundBody): Promise<PaymentSummary> {
  const { competition, user } = access
  const db = useDb()
  const step = await db.transaction(async (trx): Promise<{ card: PaymentRefundRow & { payment_intent: string } } | { done: true }> => {
    await trx('entries').where({ id: access.entry.id }).forUpdate().first('id')
    const payment = await trx<PaymentRow>('payments').where({ id: paymentId, entry_id: access.entry.id }).forUpdate().first()
    if (!payment) throw httpError(404, MESSAGES.paymentNotFound)
    if (body.idempotencyKey) {
      const again = await trx<PaymentRefundRow>('payment_refunds').where({ payment_id: payment.id, idempotency_key: body.idempotencyKey }).first('id')
      if (again) return { done: true }
    }
    if (payment.status !== 'paid' && payment.status !== 'refunded') throw httpError(409, MESSAGES.refundNotPaid)
    const { pending } = await trx('payment_refunds').where({ payment_id: payment.id, status: 'pending' })
      .first(trx.raw('coalesce(sum(amount_minor), 0)::int as pending')) as { pending: number }
    const remaining = payment.amount_minor - payment.refunded_minor - pending
    if (remaining <= 0) throw httpError(409, MESSAGES.refundAlreadyDone)
    if (body.amountMinor > remaining) throw httpError(409, MESSAGES.refundTooMuch(formatMoney(remaining, payment.currency)))
    const card = payment.method === 'card'
    if (card && (!payment.payment_intent || !paymentClient())) throw httpError(503, MESSAGES.paymentsNotConfigured)
    const [row] = await trx('payment_refunds').insert({
      competition_id: competition.id,
      entry_id: payment.entry_id,
      payment_id: payment.id,
      amount_minor: body.amountMinor,
      reason: body.reason,
      recorded_by: user.id,
      status: card ? 'pending' : 'succeeded',
      completed_at: card ? null : trx.fn.now(),
      idempotency_key: body.idempotencyKey ?? null,
    }).returning('*') as PaymentRefundRow[]
    if (card) return { card: { ...row!, payment_intent: payment.payment_intent! } }
    await applyRefund(trx, payment, row!, user.id)
    return { done: true }
  })

  if ('card' in step) {
    const row = step.card
    let serviceRefundId: string
    try {
      const refund = await requireClient().refunds.create(
        { payment_intent: row.payment_intent, amount: row.amount_minor, metadata: { entryId: row.entry_id, paymentId: row.payment_id, refundId: row.id } },
        { idempotencyKey: `refund-${row.id}` },
      )
      serviceRefundId = refund.id
    }
    catch (error) {
      console.error('[gridmark] payment service refund failed', (error as Error).message)
      await db('payment_refunds').where({ id: row.id, status: 'pending' }).update({ status: 'failed', completed_at: db.fn.now() })
      throw httpError(502, MESSAGES.refundServiceDown)
    }
    await db.transaction(async (trx) => {
      const payment = (await lockPayment(trx, { id: row.payment_id }))!
      const [done] = await trx('payment_refunds').where({ id: row.id, status: 'pending' })
        .update({ status: 'succeeded', service_refund_id: serviceRefundId, completed_at: trx.fn.now() }).returning('*') as PaymentRefundRow[]
      // The service's notification may have completed it first: then only its id is kept.
      if (!done) await trx('payment_refunds').where({ id: row.id }).whereNull('service_refund_id').update({ service_refund_id: serviceRefundId })
      else await applyRefund(trx, payment, done, user.id)
    })
  }
  return paymentSummary(db, paymentId)
}

// ---------------------------------------------------------------------------------------
// The organiser's table

interface CompetitionPaymentDbRow extends PaymentDbRow {
  comp_id: string
  pilot_name: string
  entrant_name: string
  entry_status: string
  entry_payment_status: EntryRow['payment_status']
}

export async function competitionPayments(competition: CompetitionRow, query: PaymentsQuery): Promise<CompetitionPaymentsResponse> {
  const db = useDb()
  const rows = await paymentsQuery(db)
    .join('entries as e', 'e.id', 'p.entry_id')
    .join('users as u', 'u.id', 'e.entrant_user_id')
    .where('p.competition_id', competition.id)
    .modify((q) => {
      if (query.status) q.where('p.status', query.status)
      if (query.method) q.where('p.method', query.method)
    })
    .orderBy([{ column: 'p.created_at', order: 'desc' }, { column: 'p.id', order: 'desc' }])
    .select('e.comp_id', 'e.pilot_name', 'u.name as entrant_name', 'e.status as entry_status', 'e.payment_status as entry_payment_status') as CompetitionPaymentDbRow[]
  const refunds = refundsByPayment(await refundsQuery(db).where('f.competition_id', competition.id) as RefundDbRow[])
  const out: CompetitionPaymentRow[] = rows.map((r) => {
    const summary = toSummary(r, refunds.get(r.id) ?? [], true)
    return {
      ...summary,
      entryId: r.entry_id,
      compId: r.comp_id,
      pilotName: r.pilot_name,
      entrantName: r.entrant_name,
      entryStatus: r.entry_status,
      entryPaymentStatus: r.entry_payment_status,
      refundable: summary.refundableMinor > 0,
    }
  })
  const settled = out.filter(r => r.status === 'paid' || r.status === 'refunded')
  const money = settled.filter(r => r.method !== 'waived')
  const collected = money.reduce((s, r) => s + r.amountMinor, 0)
  const refunded = money.reduce((s, r) => s + r.refundedMinor, 0)
  const waived = settled.filter(r => r.method === 'waived').reduce((s, r) => s + r.amountMinor - r.refundedMinor, 0)
  return {
    currency: competition.currency,
    rows: out,
    totals: { collectedMinor: collected, refundedMinor: refunded, netMinor: collected - refunded, waivedMinor: waived, count: out.length },
  }
}

const CSV_KIND = (method: PaymentMethod) => (method === 'waived' ? 'waiver' : 'payment')

/**
 * The payments table as CSV: a line per payment or waiver, then a line per refund of it
 * (kind `refund`, its payment's id and method); amounts in major units with a dot, dates
 * as YYYY-MM-DD, times in ISO 8601.
 */
export async function competitionPaymentsCsv(competition: CompetitionRow, query: PaymentsQuery): Promise<string> {
  const { rows } = await competitionPayments(competition, query)
  const lines: string[][] = []
  for (const r of rows) {
    const entry = [r.compId, r.pilotName, r.entrantName, r.entryStatus]
    lines.push([
      ...entry, CSV_KIND(r.method), r.id, r.method, fromMinorUnits(r.amountMinor), fromMinorUnits(r.refundedMinor), r.currency, r.status,
      r.paidOn ?? '', r.reference ?? '', r.reason ?? '', r.recordedByName ?? '', r.createdAt,
    ])
    for (const f of r.refunds) {
      lines.push([
        ...entry, 'refund', r.id, r.method, fromMinorUnits(f.amountMinor), '', r.currency, f.status,
        (f.completedAt ?? f.createdAt).slice(0, 10), '', f.reason ?? '', f.recordedByName ?? '', f.createdAt,
      ])
    }
  }
  return stringify([
    ['competition_id', 'pilot', 'entrant', 'entry_status', 'kind', 'payment_id', 'method', 'amount', 'refunded', 'currency', 'status', 'date', 'reference', 'reason', 'recorded_by', 'created_at'],
    ...csvSafeRows(lines),
  ])
}
