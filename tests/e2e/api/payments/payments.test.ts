// Card payments against the local payment fake and the real SDK: checkout, the signed
// notification, exactly-once processing, a full refund with its reason, the organiser's table,
// and every refusal. (Recorded payments, waivers and part refunds: recorded-payments.test.ts.)
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createEntry, testDb } from '../../../support/db'
import {
  auditFor, entryRow, fakeEvents, fakePost, mailFor, payOnFake, paymentRows, paymentScene, postWebhook,
  signature, waitFor, type PaymentScene,
} from '../../../support/payments'

const baseUrl = inject('baseUrl')
const serviceEnv = inject('serviceEnv')
const webhookSecret = serviceEnv.NUXT_PAYMENTS_WEBHOOK_SECRET!
afterAll(closeTestDb)

const paths = (s: PaymentScene, entryId = s.entryId) => ({
  checkout: `/api/competitions/${s.competitionId}/entries/${entryId}/checkout`,
  payments: `/api/competitions/${s.competitionId}/entries/${entryId}/payments`,
  refunds: (paymentId: string) => `/api/competitions/${s.competitionId}/entries/${entryId}/payments/${paymentId}/refunds`,
  table: `/api/competitions/${s.competitionId}/payments`,
})

/** Checkout and pay on the fake; resolves once the app has answered the notification. */
async function payEntry(s: PaymentScene, entryId = s.entryId) {
  const checkout = await s.entrant.post(paths(s, entryId).checkout)
  expect(checkout.status).toBe(201)
  const paid = await payOnFake(serviceEnv, checkout.body.url)
  expect(paid.status).toBe(200)
  expect(paid.body.webhookStatus).toBe(200)
  return { checkout: checkout.body, eventId: paid.body.eventId as string }
}

describe('payment happy path', () => {
  let s: PaymentScene
  beforeAll(async () => {
    s = await paymentScene(baseUrl, { feeMinor: 30000 })
  })

  it('shows the entrant the fee due before paying', async () => {
    const res = await s.entrant.get(paths(s).payments)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({
      fee: { entryFeeMinor: 30000, lateFeeApplies: false, totalMinor: 30000, currency: 'EUR' },
      amountDueMinor: 30000,
      canPay: true,
      entry: { paymentStatus: 'unpaid', paidMinor: 0 },
      payments: [],
    })
  })

  it('opens a checkout on the payment service for the fee and records it as pending', async () => {
    const res = await s.entrant.post(paths(s).checkout)
    expect(res.status).toBe(201)
    expect(res.body.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/pay\/cs_test_/)
    const [payment] = await paymentRows(s.entryId)
    expect(payment).toMatchObject({ status: 'pending', amount_minor: 30000, currency: 'EUR', payment_intent: null })
    // Asking again while the checkout is open offers the same one.
    const again = await s.entrant.post(paths(s).checkout)
    expect(again.body.url).toBe(res.body.url)
    expect(await paymentRows(s.entryId)).toHaveLength(1)
  })

  it('marks the entry paid on the signed notification, audits it and queues the e-mail', async () => {
    const [pending] = await paymentRows(s.entryId)
    const paid = await payOnFake(serviceEnv, `http://x/pay/${pending.session_id}`)
    expect(paid.body.webhookStatus).toBe(200)
    const entry = await entryRow(s.entryId)
    expect(entry).toMatchObject({ payment_status: 'paid', paid_minor: 30000 })
    const [payment] = await paymentRows(s.entryId)
    expect(payment).toMatchObject({ status: 'paid', amount_minor: 30000 })
    expect(payment.payment_intent).toMatch(/^pi_test_/)
    expect(payment.paid_at).not.toBeNull()
    expect(await auditFor(s.entryId, 'payment.paid')).toHaveLength(1)
    const mails = await mailFor(s.entryId)
    expect(mails.map(m => m.template)).toEqual(['payment-received'])
    expect(mails[0].text_body).toContain('€300.00')
    expect(mails[0].text_body).toContain(`Open your entry:\n${baseUrl}/competitions/${s.competitionId}/entries/${s.entryId}`)
    const event = await testDb()('payment_events').where({ event_id: paid.body.eventId }).first()
    expect(event).toMatchObject({ type: 'checkout.session.completed', payment_id: payment.id })
  })

  it('shows the entry as paid with nothing left to pay, to the entrant and to staff', async () => {
    for (const client of [s.entrant, s.organiser, s.scrutineer]) {
      const res = await client.get(paths(s).payments)
      expect(res.status).toBe(200)
      expect(res.body).toMatchObject({ amountDueMinor: 0, canPay: false, entry: { paymentStatus: 'paid', paidMinor: 30000 } })
      expect(res.body.payments).toHaveLength(1)
      expect(res.body.payments[0]).toMatchObject({ status: 'paid', amountMinor: 30000 })
    }
  })

  it('refuses a second checkout for a paid entry with 409', async () => {
    const res = await s.entrant.post(paths(s).checkout)
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('This entry’s fee is already paid.')
  })

  it('processes a repeated notification once: one paid payment, one audit, one e-mail', async () => {
    const events = await fakeEvents(serviceEnv)
    const [payment] = await paymentRows(s.entryId)
    const event = events.find(e => e.type === 'checkout.session.completed' && e.payload.data.object.id === payment.session_id)
    expect(event).toBeTruthy()
    for (let i = 0; i < 2; i++) {
      const again = await fakePost(serviceEnv, '/__test/deliver', { eventId: event.id })
      expect(again.body.webhookStatus).toBe(200)
    }
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 30000 })
    expect(await paymentRows(s.entryId)).toHaveLength(1)
    expect(await auditFor(s.entryId, 'payment.paid')).toHaveLength(1)
    expect(await mailFor(s.entryId)).toHaveLength(1)
  })

  it('answers a duplicate with 200 and says it was already processed', async () => {
    const [payment] = await paymentRows(s.entryId)
    const events = await fakeEvents(serviceEnv)
    const event = events.find(e => e.payload.data.object.id === payment.session_id)
    const payload = JSON.stringify(event.payload)
    const res = await postWebhook(baseUrl, payload, signature(payload, webhookSecret))
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ received: true, duplicate: true })
  })
})

describe('fee due', () => {
  it('adds the late fee when today, in the competition’s time zone, is after the late-fee date', async () => {
    const s = await paymentScene(baseUrl, { feeMinor: 20000 })
    await testDb()('competitions').where({ id: s.competitionId }).update({ late_fee_after: '2020-01-01', late_fee_minor: 5000 })
    const res = await s.entrant.get(paths(s).payments)
    expect(res.body.fee).toMatchObject({ entryFeeMinor: 20000, lateFeeMinor: 5000, lateFeeApplies: true, totalMinor: 25000 })
    expect(res.body.amountDueMinor).toBe(25000)
    await testDb()('competitions').where({ id: s.competitionId }).update({ late_fee_after: '2999-01-01' })
    const before = await s.entrant.get(paths(s).payments)
    expect(before.body.fee).toMatchObject({ lateFeeApplies: false, totalMinor: 20000 })
  })

  it('refuses a checkout when the class has no fee', async () => {
    const s = await paymentScene(baseUrl, { feeMinor: 0 })
    const res = await s.entrant.post(paths(s).checkout)
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('There is no entry fee to pay for this entry.')
    expect(await paymentRows(s.entryId)).toHaveLength(0)
  })
})

describe('webhook signature', () => {
  let s: PaymentScene
  beforeAll(async () => {
    s = await paymentScene(baseUrl)
  })

  async function completedPayload() {
    const checkout = await s.entrant.post(paths(s).checkout)
    const sessionId = new URL(checkout.body.url).pathname.split('/').pop()
    return JSON.stringify({
      id: `evt_forged_${Math.random().toString(36).slice(2)}`,
      object: 'event',
      type: 'checkout.session.completed',
      data: { object: { id: sessionId, object: 'checkout.session', payment_status: 'paid', amount_total: 30000, payment_intent: 'pi_forged' } },
    })
  }

  it('refuses a notification signed with another secret: 400, nothing recorded', async () => {
    const payload = await completedPayload()
    const res = await postWebhook(baseUrl, payload, signature(payload, 'whsec_not_the_right_one'))
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('The signature on this notification does not match the payment service’s, so it was not processed.')
    expect(await testDb()('payment_events').where({ event_id: JSON.parse(payload).id })).toHaveLength(0)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid', paid_minor: 0 })
    expect((await paymentRows(s.entryId)).every(p => p.status === 'pending')).toBe(true)
    expect(await auditFor(s.entryId, 'payment.paid')).toHaveLength(0)
    expect(await mailFor(s.entryId)).toHaveLength(0)
  })

  it('refuses a tampered body, an old signature and a missing header', async () => {
    const payload = await completedPayload()
    const good = signature(payload, webhookSecret)
    const tampered = payload.replace('30000', '1')
    expect((await postWebhook(baseUrl, tampered, good)).status).toBe(400)
    const old = signature(payload, webhookSecret, Math.floor(Date.now() / 1000) - 3600)
    expect((await postWebhook(baseUrl, payload, old)).status).toBe(400)
    const missing = await postWebhook(baseUrl, payload)
    expect(missing.status).toBe(400)
    expect(missing.body.message).toBe('This notification has no payment service signature, so it was not processed.')
    expect((await postWebhook(baseUrl, payload, 'garbage')).status).toBe(400)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid' })
  })

  it('refuses a correctly signed body that is not an event', async () => {
    const payload = JSON.stringify({ hello: 'world' })
    const res = await postWebhook(baseUrl, payload, signature(payload, webhookSecret))
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('This notification is not a payment service event.')
  })

  it('acknowledges a signed event of a type it does not use, once', async () => {
    const payload = JSON.stringify({ id: `evt_other_${Date.now()}`, object: 'event', type: 'customer.created', data: { object: { id: 'cus_1' } } })
    const res = await postWebhook(baseUrl, payload, signature(payload, webhookSecret))
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ received: true, duplicate: false, handled: false })
  })
})

describe('a failed card payment', () => {
  it('leaves no paid row, no e-mail and the entry unpaid; a good card then pays', async () => {
    const s = await paymentScene(baseUrl)
    const checkout = await s.entrant.post(paths(s).checkout)
    const declined = await payOnFake(serviceEnv, checkout.body.url, '4000 0000 0000 0002')
    expect(declined.status).toBe(402)
    expect(declined.body.message).toMatch(/declined/)
    const rows = await paymentRows(s.entryId)
    expect(rows).toHaveLength(1)
    expect(rows[0].status).toBe('pending')
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid', paid_minor: 0 })
    expect(await mailFor(s.entryId)).toHaveLength(0)
    expect(await auditFor(s.entryId, 'payment.paid')).toHaveLength(0)

    const retry = await payOnFake(serviceEnv, checkout.body.url)
    expect(retry.status).toBe(200)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 30000 })
  })

  it('marks a checkout that expired as not completed, and the entry stays unpaid', async () => {
    const s = await paymentScene(baseUrl)
    const checkout = await s.entrant.post(paths(s).checkout)
    const sessionId = new URL(checkout.body.url).pathname.split('/').pop()
    const payload = JSON.stringify({ id: `evt_exp_${Date.now()}`, object: 'event', type: 'checkout.session.expired', data: { object: { id: sessionId, object: 'checkout.session', status: 'expired', payment_status: 'unpaid' } } })
    expect((await postWebhook(baseUrl, payload, signature(payload, webhookSecret))).status).toBe(200)
    expect((await paymentRows(s.entryId))[0].status).toBe('failed')
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid' })
    // A new checkout can be opened.
    const next = await s.entrant.post(paths(s).checkout)
    expect(next.status).toBe(201)
    expect(next.body.url).not.toBe(checkout.body.url)
  })
})

describe('refund of a card payment in full', () => {
  let s: PaymentScene
  let paymentId: string
  const reason = 'Withdrew before the event.'
  beforeAll(async () => {
    s = await paymentScene(baseUrl, { feeMinor: 25000 })
    await payEntry(s)
    paymentId = (await paymentRows(s.entryId))[0].id
    await testDb()('entries').where({ id: s.entryId }).update({ status: 'withdrawn', withdrawn_at: new Date() })
  })

  it('refuses the entrant, the scrutineer and others, and a body without a reason', async () => {
    const path = paths(s).refunds(paymentId)
    const body = { amountMinor: 25000, reason }
    expect((await s.entrant.post(path, body)).status).toBe(403)
    expect((await s.scrutineer.post(path, body)).status).toBe(403)
    expect((await s.otherEntrant.post(path, body)).status).toBe(404)
    expect((await new ApiClient(baseUrl).post(path, body)).status).toBe(401)
    const stranger = await signedUpClient(baseUrl, 'Stranger')
    expect((await stranger.client.post(path, body)).status).toBe(404)
    const noReason = await s.organiser.post(path, { amountMinor: 25000 })
    expect(noReason.status).toBe(400)
    expect(noReason.body.message).toContain('Give the reason for the refund')
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 25000 })
  })

  it('refunds the withdrawn entry in full: refunded, paid 0, audited and e-mailed once with the reason', async () => {
    const res = await s.organiser.post(paths(s).refunds(paymentId), { amountMinor: 25000, reason })
    expect(res.status).toBe(200)
    expect(res.body.payment).toMatchObject({ status: 'refunded', refundedMinor: 25000, refundableMinor: 0, method: 'card' })
    expect(res.body.payment.refunds).toHaveLength(1)
    expect(res.body.payment.refunds[0]).toMatchObject({ amountMinor: 25000, reason, status: 'succeeded', recordedByName: 'Office Organiser' })
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'refunded', paid_minor: 0 })
    // The service's own notification of the refund follows; it changes nothing more.
    const [payment] = await paymentRows(s.entryId)
    const isOurs = (e: { type: string, payload: { data: { object: { payment_intent?: string } } } }) =>
      e.type === 'charge.refunded' && e.payload.data.object.payment_intent === payment.payment_intent
    const events = await waitFor(() => fakeEvents(serviceEnv), evs => evs.some(e => isOurs(e) && e.attempts.length > 0), 3000)
    const refundEvent = events.find(isOurs)
    expect(refundEvent).toBeTruthy()
    await waitFor(() => testDb()('payment_events').where({ event_id: refundEvent.id }), r => r.length === 1, 3000)
    expect(await fakePost(serviceEnv, '/__test/deliver', { eventId: refundEvent.id })).toMatchObject({ body: { webhookStatus: 200 } })
    expect(payment).toMatchObject({ status: 'refunded', refunded_minor: 25000 })
    expect(await testDb()('payment_refunds').where({ payment_id: paymentId })).toHaveLength(1)
    const audits = await auditFor(s.entryId, 'payment.refunded')
    expect(audits).toHaveLength(1)
    expect(audits[0].actor_user_id).not.toBeNull()
    expect(audits[0].details).toMatchObject({ paymentId, method: 'card', refundedMinor: 25000, reason })
    const refundMails = await mailFor(s.entryId)
    expect(refundMails.map(m => m.template)).toEqual(['payment-received', 'payment-refund'])
    expect(refundMails[1].text_body).toContain('Nothing of the fee remains paid.')
    expect(refundMails[1].text_body).toContain(`Reason: ${reason}`)
    expect(refundMails[1].text_body).toContain(`Open your entry:\n${baseUrl}/competitions/${s.competitionId}/entries/${s.entryId}`)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'refunded', paid_minor: 0 })
    // The withdrawn entry owes nothing more.
    expect((await s.entrant.get(paths(s).payments)).body).toMatchObject({ amountDueMinor: 0, canPay: false, entry: { paymentStatus: 'refunded' } })
  })

  it('refuses a second refund', async () => {
    const res = await s.organiser.post(paths(s).refunds(paymentId), { amountMinor: 100, reason })
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('This payment has already been refunded in full.')
  })

  it('refuses to refund a checkout that was never paid, and a payment of another entry', async () => {
    const other = await createEntry({ competitionId: s.competitionId, classId: s.classId, entrantUserId: (await entryRow(s.entryId)).entrant_user_id, status: 'submitted' })
    expect((await s.entrant.post(paths(s, other).checkout)).status).toBe(201)
    const [pending] = await paymentRows(other)
    const res = await s.organiser.post(paths(s, other).refunds(pending.id), { amountMinor: 100, reason })
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('This payment was never completed, so there is nothing to refund.')
    const elsewhere = await s.organiser.post(paths(s, other).refunds(paymentId), { amountMinor: 100, reason })
    expect(elsewhere.status).toBe(404)
    expect(elsewhere.body.message).toBe('No such payment on this entry.')
  })

  it('refuses a checkout for the withdrawn entry', async () => {
    const res = await s.entrant.post(paths(s).checkout)
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('A withdrawn or rejected entry cannot be paid.')
  })
})

describe('access and bad input', () => {
  let s: PaymentScene
  beforeAll(async () => {
    s = await paymentScene(baseUrl)
  })

  it('checkout: only the entry’s own entrant', async () => {
    expect((await new ApiClient(baseUrl).post(paths(s).checkout)).status).toBe(401)
    const organiser = await s.organiser.post(paths(s).checkout)
    expect(organiser.status).toBe(403)
    expect(organiser.body.message).toBe('Only the entry’s own entrant can do this.')
    expect((await s.otherEntrant.post(paths(s).checkout)).status).toBe(404)
    const stranger = await signedUpClient(baseUrl, 'Stranger')
    expect((await stranger.client.post(paths(s).checkout)).status).toBe(404)
    expect(await paymentRows(s.entryId)).toHaveLength(0)
  })

  it('checkout: a body with fields, or not JSON, is refused with 400', async () => {
    const fields = await s.entrant.request('POST', paths(s).checkout, { amountMinor: 1 })
    expect(fields.status).toBe(400)
    expect(fields.body.message).toContain('This action takes no fields.')
    const notJson = await s.entrant.postRaw(paths(s).checkout, '{nope')
    expect(notJson.status).toBe(400)
    expect(await paymentRows(s.entryId)).toHaveLength(0)
  })

  it('checkout and payments: a malformed id answers 404', async () => {
    expect((await s.entrant.post(`/api/competitions/${s.competitionId}/entries/not-a-uuid/checkout`)).status).toBe(404)
    expect((await s.entrant.get(`/api/competitions/not-a-uuid/entries/${s.entryId}/payments`)).status).toBe(404)
  })

  it('entry payments: the entrant and staff read, others do not', async () => {
    expect((await new ApiClient(baseUrl).get(paths(s).payments)).status).toBe(401)
    expect((await s.otherEntrant.get(paths(s).payments)).status).toBe(404)
    const staff = await s.scrutineer.get(paths(s).payments)
    expect(staff.status).toBe(200)
    expect(staff.body.canPay).toBe(false)
  })

  it('the payments table: organisers only, with a status filter', async () => {
    expect((await new ApiClient(baseUrl).get(paths(s).table)).status).toBe(401)
    expect((await s.entrant.get(paths(s).table)).status).toBe(403)
    expect((await s.scrutineer.get(paths(s).table)).status).toBe(403)
    const stranger = await signedUpClient(baseUrl, 'Stranger')
    expect((await stranger.client.get(paths(s).table)).status).toBe(404)
    const bad = await s.organiser.get(`${paths(s).table}?status=lost`)
    expect(bad.status).toBe(400)
    expect(bad.body.message).toContain('Status must be one of')
  })
})

describe('the organiser’s payments table', () => {
  it('lists payments with their entries, totals and refundability, filters by status, and exports CSV with each refund', async () => {
    const s = await paymentScene(baseUrl, { feeMinor: 10000 })
    await payEntry(s)
    const second = await createEntry({ competitionId: s.competitionId, classId: s.classId, entrantUserId: (await entryRow(s.entryId)).entrant_user_id, compId: 'Q7', status: 'submitted' })
    await payEntry(s, second)
    const third = await createEntry({ competitionId: s.competitionId, classId: s.classId, entrantUserId: (await entryRow(s.entryId)).entrant_user_id, compId: 'Z9', status: 'submitted' })
    expect((await s.entrant.post(paths(s, third).checkout)).status).toBe(201)
    await testDb()('entries').where({ id: second }).update({ status: 'withdrawn' })

    const all = await s.organiser.get(paths(s).table)
    expect(all.status).toBe(200)
    expect(all.body.rows).toHaveLength(3)
    expect(all.body.totals).toMatchObject({ collectedMinor: 20000, refundedMinor: 0, netMinor: 20000, waivedMinor: 0, count: 3 })
    const q7 = all.body.rows.find((r: { compId: string }) => r.compId === 'Q7')
    expect(q7).toMatchObject({ status: 'paid', method: 'card', refundable: true, entrantName: 'Paying Pilot', amountMinor: 10000, currency: 'EUR' })
    // Any paid payment can be refunded, withdrawn or not; a pending checkout cannot.
    expect(all.body.rows.filter((r: { refundable: boolean }) => r.refundable)).toHaveLength(2)

    const pending = await s.organiser.get(`${paths(s).table}?status=pending`)
    expect(pending.body.rows.map((r: { compId: string }) => r.compId)).toEqual(['Z9'])

    expect((await s.organiser.post(paths(s, second).refunds(q7.id), { amountMinor: 10000, reason: 'Withdrew in May.' })).status).toBe(200)
    const after = await s.organiser.get(paths(s).table)
    expect(after.body.totals).toMatchObject({ collectedMinor: 20000, refundedMinor: 10000, netMinor: 10000 })

    const csv = await fetch(`${baseUrl}${paths(s).table}/export.csv`, { headers: { cookie: s.organiser.cookie, 'x-forwarded-for': s.organiser.address } })
    expect(csv.status).toBe(200)
    expect(csv.headers.get('content-type')).toContain('text/csv')
    const text = await csv.text()
    expect(text.split('\n')[0]).toBe('competition_id,pilot,entrant,entry_status,kind,payment_id,method,amount,refunded,currency,status,date,reference,reason,recorded_by,created_at')
    expect(text).toContain(`Q7,Test Pilot,Paying Pilot,withdrawn,payment,${q7.id},card,100.00,100.00,EUR,refunded,`)
    expect(text).toMatch(new RegExp(`Q7,Test Pilot,Paying Pilot,withdrawn,refund,${q7.id},card,100.00,,EUR,succeeded,\\d{4}-\\d{2}-\\d{2},,Withdrew in May.,Office Organiser,`))
    expect((await s.entrant.get(`${paths(s).table}/export.csv`)).status).toBe(403)
  })
})
