/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Payments any way: the office records a bank transfer, cash or another way, or waives the fee
// with a reason; the entry is paid when the money and waivers reach the fee due (its class's,
// plus the late fee for an entry that paid nothing by its date), and owes again after a refund
// or a change to a dearer class. Part refunds of a card payment go through the local payment
// fake; every step is audited and e-mailed; the organiser alone may do it.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, testDb } from '../../../support/db'
import { auditFor, entryRow, fakeEvents, mailFor, payOnFake, paymentRows, paymentScene, waitFor, type PaymentScene } from '../../../support/payments'

const baseUrl = inject('baseUrl')
const serviceEnv = inject('serviceEnv')
afterAll(closeTestDb)

const paths = (s: PaymentScene, entryId = s.entryId) => {
  const entry = `/api/competitions/${s.competitionId}/entries/${entryId}`
  return {
    entry,
    payments: `${entry}/payments`,
    refunds: (paymentId: string) => `${entry}/payments/${paymentId}/refunds`,
    findings: `${entry}/findings`,
    checkout: `${entry}/checkout`,
  }
}

/** A day before today wherever the competition is (its time zone is Europe/Berlin). */
const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10)

async function paidFinding(client: ApiClient, s: PaymentScene) {
  const res = await client.get(paths(s).findings)
  expect(res.status).toBe(200)
  return (res.body.findings as any[]).find(f => f.checkId === 'entry.paid')
}

describe('a bank transfer recorded by the office', () => {
  let s: PaymentScene
  const key = 'office-form-0001'
  beforeAll(async () => {
    s = await paymentScene(baseUrl, { feeMinor: 30000 })
  })

  it('starts unpaid, with entry.paid naming what is owed', async () => {
    const finding = await paidFinding(s.entrant, s)
    expect(finding.reason).toBe('€300.00 of the entry fee is still to pay; it is due before the first contest day (2027-05-01).')
    expect(finding.fixHint).toContain('ask the competition office if you have paid another way')
  })

  it('marks the entry paid, clears entry.paid, audits and e-mails the entrant', async () => {
    const res = await s.organiser.post(paths(s).payments, { method: 'bank-transfer', amountMinor: 30000, date: yesterday, reference: 'FT-2027-0042', idempotencyKey: key })
    expect(res.status).toBe(201)
    expect(res.body.created).toBe(true)
    expect(res.body.payment).toMatchObject({
      method: 'bank-transfer', amountMinor: 30000, currency: 'EUR', status: 'paid', reference: 'FT-2027-0042', paidOn: yesterday,
      recordedByName: 'Office Organiser', refundedMinor: 0, refundableMinor: 30000, refunds: [],
    })
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 30000, waived_minor: 0, first_paid_on: yesterday })
    expect(await paidFinding(s.entrant, s)).toBeUndefined()

    const [audit] = await auditFor(s.entryId, 'payment.recorded')
    expect(audit).toMatchObject({ actor_user_id: expect.any(String), details: { paymentId: res.body.payment.id, method: 'bank-transfer', amountMinor: 30000, paidOn: yesterday } })
    const status = await auditFor(s.entryId, 'payment.status-changed')
    expect(status.map(a => a.details)).toEqual([{ from: 'unpaid', to: 'paid', owedMinor: 0, currency: 'EUR' }])
    const mails = await mailFor(s.entryId)
    expect(mails.map(m => m.template)).toEqual(['payment-recorded'])
    expect(mails[0].subject).toBe('Payment recorded: ' + (await entryRow(s.entryId)).comp_id + ' at Fee Trophy')
    expect(mails[0].text_body).toContain('recorded your payment of €300.00 by bank transfer')
    expect(mails[0].text_body).toContain('(reference FT-2027-0042)')
    expect(mails[0].text_body).toContain('Your entry fee is now paid.')
  })

  it('records a double click once: the same submission key answers the first payment', async () => {
    const again = await s.organiser.post(paths(s).payments, { method: 'bank-transfer', amountMinor: 30000, date: yesterday, reference: 'FT-2027-0042', idempotencyKey: key })
    expect(again.status).toBe(200)
    expect(again.body.created).toBe(false)
    expect(await paymentRows(s.entryId)).toHaveLength(1)
    expect(await mailFor(s.entryId)).toHaveLength(1)
    expect(await entryRow(s.entryId)).toMatchObject({ paid_minor: 30000 })
  })

  it('shows the entrant the payment with its method and reference, the office who recorded it', async () => {
    const own = await s.entrant.get(paths(s).payments)
    expect(own.body).toMatchObject({ amountDueMinor: 0, canPay: false, canRecord: false, entry: { paymentStatus: 'paid', paidMinor: 30000, waivedMinor: 0 } })
    expect(own.body.payments[0]).toMatchObject({ method: 'bank-transfer', reference: 'FT-2027-0042', recordedByName: null })
    const office = await s.organiser.get(paths(s).payments)
    expect(office.body.canRecord).toBe(true)
    expect(office.body.payments[0].recordedByName).toBe('Office Organiser')
    expect(office.body.today).toMatch(/^\d{4}-\d{2}-\d{2}$/)
  })
})

describe('cash in parts', () => {
  it('leaves the rest owed after a part payment, and pays the entry when the rest comes', async () => {
    const s = await paymentScene(baseUrl, { feeMinor: 30000 })
    const first = await s.organiser.post(paths(s).payments, { method: 'cash', amountMinor: 10000, date: yesterday })
    expect(first.status).toBe(201)
    expect(first.body.payment.reference).toBeNull()
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid', paid_minor: 10000 })
    expect((await paidFinding(s.entrant, s)).reason).toContain('€200.00 of the entry fee is still to pay')
    expect((await s.entrant.get(paths(s).payments)).body).toMatchObject({ amountDueMinor: 20000, canPay: true })
    const [mail] = await mailFor(s.entryId)
    expect(mail.text_body).toContain('€100.00 in cash on')
    expect(mail.text_body).toContain('€200.00 of the entry fee is still to pay.')

    const rest = await s.organiser.post(paths(s).payments, { method: 'other', amountMinor: 20000, date: yesterday, reference: 'Club voucher 17' })
    expect(rest.status).toBe(201)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 30000 })
    expect(await paidFinding(s.entrant, s)).toBeUndefined()
  })
})

describe('waiving the fee', () => {
  let s: PaymentScene
  beforeAll(async () => {
    s = await paymentScene(baseUrl, { feeMinor: 30000 })
    expect((await s.organiser.post(paths(s).payments, { method: 'bank-transfer', amountMinor: 10000, date: yesterday, reference: 'PART-1' })).status).toBe(201)
  })

  it('needs a reason, and waives no more than is owed', async () => {
    const noReason = await s.organiser.post(paths(s).payments, { method: 'waived', amountMinor: 20000, date: yesterday })
    expect(noReason.status).toBe(400)
    expect(noReason.body.message).toContain('Give the reason the fee is waived')
    const tooMuch = await s.organiser.post(paths(s).payments, { method: 'waived', amountMinor: 20001, date: yesterday, reason: 'Club guest.' })
    expect(tooMuch.status).toBe(400)
    expect(tooMuch.body.message).toContain('Only €200.00 of the fee is owed; waive at most that.')
    expect(tooMuch.body.data.fieldErrors.amountMinor).toEqual(['Only €200.00 of the fee is owed; waive at most that.'])
    expect(await paymentRows(s.entryId)).toHaveLength(1)
  })

  it('counts towards paid but not as money received, and tells the entrant why', async () => {
    const res = await s.organiser.post(paths(s).payments, { method: 'waived', amountMinor: 20000, date: yesterday, reason: 'Guest pilot of the host club.' })
    expect(res.status).toBe(201)
    expect(res.body.payment).toMatchObject({ method: 'waived', reason: 'Guest pilot of the host club.', amountMinor: 20000 })
    // paid_minor stays the money actually received: what a withdrawal would refund.
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 10000, waived_minor: 20000 })
    expect(await paidFinding(s.entrant, s)).toBeUndefined()
    const [audit] = await auditFor(s.entryId, 'payment.waived')
    expect(audit.details).toMatchObject({ method: 'waived', amountMinor: 20000, reason: 'Guest pilot of the host club.' })
    const mails = await mailFor(s.entryId)
    expect(mails.map(m => m.template)).toEqual(['payment-recorded', 'payment-waived'])
    expect(mails[1].text_body).toContain('Reason: Guest pilot of the host club.')
    const table = await s.organiser.get(`/api/competitions/${s.competitionId}/payments`)
    expect(table.body.totals).toMatchObject({ collectedMinor: 10000, refundedMinor: 0, netMinor: 10000, waivedMinor: 20000, count: 2 })
  })

  it('refuses a waiver once nothing is owed', async () => {
    const res = await s.organiser.post(paths(s).payments, { method: 'waived', amountMinor: 100, date: yesterday, reason: 'Again.' })
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('Nothing of the fee is owed, so there is nothing to waive.')
  })

  it('withdraws part of a waiver with a reason: the entry owes that again', async () => {
    const waiver = (await paymentRows(s.entryId)).find(p => p.method === 'waived')
    const res = await s.organiser.post(paths(s).refunds(waiver.id), { amountMinor: 5000, reason: 'Only half the guest discount applies.' })
    expect(res.status).toBe(200)
    expect(res.body.payment).toMatchObject({ refundedMinor: 5000, refundableMinor: 15000 })
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid', paid_minor: 10000, waived_minor: 15000 })
    expect((await paidFinding(s.entrant, s)).reason).toContain('€50.00 of the entry fee is still to pay')
    expect(await auditFor(s.entryId, 'payment.waiver-withdrawn')).toHaveLength(1)
    const last = (await mailFor(s.entryId)).at(-1)
    expect(last.subject).toMatch(/^Waiver withdrawn: /)
    expect(last.text_body).toContain('€50.00 of the entry fee is now to pay.')
  })
})

describe('a part refund of a card payment through the payment service', () => {
  let s: PaymentScene
  let paymentId: string
  beforeAll(async () => {
    s = await paymentScene(baseUrl, { feeMinor: 30000 })
    const checkout = await s.entrant.post(paths(s).checkout)
    expect(checkout.status).toBe(201)
    const paid = await payOnFake(serviceEnv, checkout.body.url)
    expect(paid.body.webhookStatus).toBe(200)
    paymentId = (await paymentRows(s.entryId))[0].id
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 30000 })
  })

  it('refunds part at the service; the entry owes that part again; the service’s notice adds nothing', async () => {
    const res = await s.organiser.post(paths(s).refunds(paymentId), { amountMinor: 5000, reason: 'Charged twice for the trailer space.' })
    expect(res.status).toBe(200)
    expect(res.body.payment).toMatchObject({ method: 'card', status: 'paid', refundedMinor: 5000, refundableMinor: 25000 })
    expect(res.body.payment.refunds).toEqual([expect.objectContaining({ amountMinor: 5000, status: 'succeeded', reason: 'Charged twice for the trailer space.' })])
    const [refund] = await testDb()('payment_refunds').where({ payment_id: paymentId })
    expect(refund.service_refund_id).toMatch(/^re_test_/)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid', paid_minor: 25000 })
    expect((await paidFinding(s.entrant, s)).reason).toContain('€50.00 of the entry fee is still to pay')

    // The fake refunded exactly that part, and its notification counts once.
    const [payment] = await paymentRows(s.entryId)
    const isOurs = (e: any) => e.type === 'charge.refunded' && e.payload.data.object.payment_intent === payment.payment_intent
    const events = await waitFor(() => fakeEvents(serviceEnv), evs => evs.some(e => isOurs(e) && e.attempts.length > 0), 3000)
    expect(events.find(isOurs).payload.data.object.amount_refunded).toBe(5000)
    await waitFor(() => testDb()('payment_events').where({ event_id: events.find(isOurs).id }), r => r.length === 1, 3000)
    expect(await testDb()('payment_refunds').where({ payment_id: paymentId })).toHaveLength(1)
    expect(await paymentRows(s.entryId)).toEqual([expect.objectContaining({ refunded_minor: 5000, status: 'paid' })])
    expect(await auditFor(s.entryId, 'payment.refunded')).toHaveLength(1)
    const last = (await mailFor(s.entryId)).at(-1)
    expect(last.template).toBe('payment-refund')
    expect(last.text_body).toContain('refunded €50.00 of the entry fee')
    expect(last.text_body).toContain('The rest of the fee stays paid.')
    expect(last.text_body).toContain('€50.00 of the entry fee is now to pay.')
  })

  it('refuses to refund more than remains of the payment, and changes nothing', async () => {
    const res = await s.organiser.post(paths(s).refunds(paymentId), { amountMinor: 25001, reason: 'Too much.' })
    expect(res.status).toBe(409)
    expect(res.body.message).toBe('At most €250.00 of this payment can still be refunded.')
    expect(await testDb()('payment_refunds').where({ payment_id: paymentId })).toHaveLength(1)
    expect(await entryRow(s.entryId)).toMatchObject({ paid_minor: 25000 })
  })

  it('refunds a double click once', async () => {
    const body = { amountMinor: 1000, reason: 'Parking refund.', idempotencyKey: 'refund-form-0001' }
    const [a, b] = await Promise.all([s.organiser.post(paths(s).refunds(paymentId), body), s.organiser.post(paths(s).refunds(paymentId), body)])
    expect([a.status, b.status]).toEqual([200, 200])
    expect(await testDb()('payment_refunds').where({ payment_id: paymentId, idempotency_key: 'refund-form-0001' })).toHaveLength(1)
    expect(await entryRow(s.entryId)).toMatchObject({ paid_minor: 24000 })
  })

  it('refunds the rest: the payment is refunded and nothing of the fee remains paid', async () => {
    const res = await s.organiser.post(paths(s).refunds(paymentId), { amountMinor: 24000, reason: 'Withdrew after all.' })
    expect(res.status).toBe(200)
    expect(res.body.payment).toMatchObject({ status: 'refunded', refundedMinor: 30000, refundableMinor: 0 })
    expect(res.body.payment.refunds).toHaveLength(3)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'refunded', paid_minor: 0 })
    expect((await mailFor(s.entryId)).at(-1).text_body).toContain('Nothing of the fee remains paid.')
  })
})

describe('a change to a dearer class', () => {
  it('leaves the entry owing the difference and raises entry.paid again, by the entrant before acceptance and by the office after', async () => {
    const s = await paymentScene(baseUrl, { feeMinor: 30000 })
    const open = await createClass(s.competitionId, 'Open', 45000)
    const eighteen = await createClass(s.competitionId, '18 Metre', 50000)
    expect((await s.organiser.post(paths(s).payments, { method: 'bank-transfer', amountMinor: 30000, date: yesterday, reference: 'FT-1' })).status).toBe(201)
    expect(await paidFinding(s.entrant, s)).toBeUndefined()

    const byEntrant = await s.entrant.request('PATCH', paths(s).entry, { classId: open })
    expect(byEntrant.status).toBe(200)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid', paid_minor: 30000 })
    expect((await s.entrant.get(paths(s).payments)).body).toMatchObject({ amountDueMinor: 15000, fee: { totalMinor: 45000 } })
    const finding = await paidFinding(s.entrant, s)
    expect(finding.reason).toBe('€150.00 of the entry fee is still to pay; it is due before the first contest day (2027-05-01).')
    const status = await auditFor(s.entryId, 'payment.status-changed')
    expect(status.map(a => [a.details.from, a.details.to, a.details.owedMinor])).toContainEqual(['paid', 'unpaid', 15000])

    expect((await s.organiser.post(paths(s).payments, { method: 'cash', amountMinor: 15000, date: yesterday })).status).toBe(201)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 45000 })

    await testDb()('entries').where({ id: s.entryId }).update({ status: 'accepted' })
    const byOffice = await s.organiser.request('PATCH', paths(s).entry, { classId: eighteen })
    expect(byOffice.status).toBe(200)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid' })
    expect((await paidFinding(s.organiser, s)).reason).toContain('€50.00 of the entry fee is still to pay')

    // Back to a cheaper class: what was paid covers it.
    expect((await s.organiser.request('PATCH', paths(s).entry, { classId: s.classId })).status).toBe(200)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid' })
  })
})

describe('the late fee', () => {
  it('is owed by an entry that paid nothing by its date, not by one that paid in time', async () => {
    const s = await paymentScene(baseUrl, { feeMinor: 20000 })
    await testDb()('competitions').where({ id: s.competitionId }).update({ late_fee_after: '2020-01-01', late_fee_minor: 5000 })
    expect((await s.entrant.get(paths(s).payments)).body).toMatchObject({ amountDueMinor: 25000, fee: { lateFeeApplies: true } })
    const inTime = await s.organiser.post(paths(s).payments, { method: 'bank-transfer', amountMinor: 20000, date: '2019-12-20', reference: 'EARLY' })
    expect(inTime.status).toBe(201)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'paid', first_paid_on: '2019-12-20' })
    expect((await s.entrant.get(paths(s).payments)).body).toMatchObject({ amountDueMinor: 0, fee: { lateFeeApplies: false, totalMinor: 20000 } })

    const late = await paymentScene(baseUrl, { feeMinor: 20000 })
    await testDb()('competitions').where({ id: late.competitionId }).update({ late_fee_after: '2020-01-01', late_fee_minor: 5000 })
    expect((await late.organiser.post(paths(late).payments, { method: 'bank-transfer', amountMinor: 20000, date: yesterday, reference: 'LATE' })).status).toBe(201)
    expect(await entryRow(late.entryId)).toMatchObject({ payment_status: 'unpaid' })
    expect((await paidFinding(late.entrant, late)).reason).toContain('€50.00 of the entry fee is still to pay')
  })
})

describe('who may record, and bad bodies', () => {
  let s: PaymentScene
  beforeAll(async () => {
    s = await paymentScene(baseUrl, { feeMinor: 30000 })
  })
  const good = { method: 'bank-transfer', amountMinor: 30000, date: yesterday, reference: 'X-1' }

  it('refuses the entrant and the scrutineer (403), hides the entry from others (404), asks strangers to sign in (401)', async () => {
    const entrant = await s.entrant.post(paths(s).payments, good)
    expect(entrant.status).toBe(403)
    expect(entrant.body.message).toBe('This needs the organiser role in this competition.')
    expect((await s.scrutineer.post(paths(s).payments, good)).status).toBe(403)
    expect((await s.otherEntrant.post(paths(s).payments, good)).status).toBe(404)
    expect((await new ApiClient(baseUrl).post(paths(s).payments, good)).status).toBe(401)
    const stranger = await signedUpClient(baseUrl, 'Stranger')
    expect((await stranger.client.post(paths(s).payments, good)).status).toBe(404)
    expect(await paymentRows(s.entryId)).toHaveLength(0)
  })

  it('answers each bad body with 400 and a message a person understands, recording nothing', async () => {
    const cases: [unknown, string][] = [
      [{ ...good, method: 'card' }, 'Choose how it was paid: bank-transfer, cash, other, waived.'],
      [{ ...good, method: undefined }, 'Choose how it was paid'],
      [{ ...good, amountMinor: 0 }, 'The amount must be more than zero.'],
      [{ ...good, amountMinor: 12.5 }, 'Enter the amount in whole cents.'],
      [{ ...good, amountMinor: '300' }, 'Enter the amount as a number.'],
      [{ ...good, date: '2027-02-30' }, 'That date does not exist.'],
      [{ ...good, date: '30/01/2027' }, 'Enter a date as YYYY-MM-DD.'],
      [{ ...good, date: '2999-01-01' }, 'A payment cannot be dated after today'],
      [{ ...good, reference: undefined }, 'Give the bank transfer’s reference, as it shows on the statement.'],
      [{ ...good, method: 'other', reference: ' ' }, 'Say how it was paid'],
      [{ ...good, reference: 'x'.repeat(121) }, 'Keep the reference under 120 characters.'],
      [{ ...good, surprise: true }, ''],
      [[good], 'Send the payment as an object'],
    ]
    for (const [body, message] of cases) {
      const res = await s.organiser.post(paths(s).payments, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.message, JSON.stringify(body)).toContain(message)
    }
    const notJson = await s.organiser.postRaw(paths(s).payments, '{nope')
    expect(notJson.status).toBe(400)
    const refund = await s.organiser.post(paths(s).refunds('not-a-uuid'), { amountMinor: 1, reason: 'Why not.' })
    expect(refund.status).toBe(404)
    expect(await paymentRows(s.entryId)).toHaveLength(0)
    expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid', paid_minor: 0 })
  })
})
