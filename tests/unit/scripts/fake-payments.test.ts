// The local payment fake speaks the API the real SDK calls, and signs notifications the way
// the SDK's own constructEvent verifies them.
import { createServer } from 'node:http'
import type { AddressInfo } from 'node:net'
import Stripe from 'stripe'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { parseForm, signPayload, startFakePayments, type FakePayments } from '../../../scripts/lib/fake-payments'

let fake: FakePayments
let stripe: Stripe
const received: { body: string, signature: string }[] = []
let app: ReturnType<typeof createServer>
let appUrl = ''

beforeAll(async () => {
  // A stand-in for the app's webhook route: records what arrives.
  app = createServer((req, res) => {
    let body = ''
    req.on('data', (c) => { body += c })
    req.on('end', () => {
      received.push({ body, signature: String(req.headers['stripe-signature']) })
      res.writeHead(200).end('{}')
    })
  })
  await new Promise<void>(r => app.listen(0, '127.0.0.1', () => r()))
  appUrl = `http://127.0.0.1:${(app.address() as AddressInfo).port}`
  fake = await startFakePayments({ refundWebhookDelayMs: 10 })
  stripe = new Stripe(fake.secretKey, { host: '127.0.0.1', port: fake.port, protocol: 'http', maxNetworkRetries: 0 })
})
afterAll(async () => {
  await fake?.stop()
  await new Promise(r => app.close(r))
})

describe('fake payment service', () => {
  it('reads the SDK’s bracketed form encoding into nested objects and arrays', () => {
    expect(parseForm('mode=payment&line_items[0][price_data][unit_amount]=1500&line_items[0][quantity]=1&metadata[entryId]=e1')).toEqual({
      mode: 'payment',
      line_items: [{ price_data: { unit_amount: '1500' }, quantity: '1' }],
      metadata: { entryId: 'e1' },
    })
  })

  it('signs so that the SDK’s constructEvent accepts it, and refuses another secret', () => {
    const payload = JSON.stringify({ id: 'evt_1', object: 'event', type: 'x', data: { object: {} } })
    expect(Stripe.webhooks.constructEvent(payload, signPayload(payload, 'whsec_a'), 'whsec_a').id).toBe('evt_1')
    expect(() => Stripe.webhooks.constructEvent(payload, signPayload(payload, 'whsec_b'), 'whsec_a')).toThrow(Stripe.errors.StripeSignatureVerificationError)
  })

  it('creates, retrieves, pays and refunds a checkout through the real SDK, notifying the success URL’s origin', async () => {
    const session = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: 'eur', unit_amount: 12345, product_data: { name: 'Entry fee' } } }],
      metadata: { entryId: 'e1' },
      client_reference_id: 'e1',
      success_url: `${appUrl}/done?session_id={CHECKOUT_SESSION_ID}`,
      cancel_url: `${appUrl}/cancel`,
    })
    expect(session).toMatchObject({ status: 'open', payment_status: 'unpaid', amount_total: 12345, currency: 'eur', metadata: { entryId: 'e1' }, client_reference_id: 'e1' })
    expect(session.url).toBe(`${fake.url}/pay/${session.id}`)
    expect((await stripe.checkout.sessions.retrieve(session.id)).id).toBe(session.id)

    const page = await fetch(session.url!)
    expect(await page.text()).toContain('€123.45')
    const paid = await fetch(session.url!, { method: 'POST', body: new URLSearchParams({ card_number: '4242424242424242', action: 'pay' }), redirect: 'manual' })
    expect(paid.status).toBe(303)
    expect(paid.headers.get('location')).toBe(`${appUrl}/done?session_id=${session.id}`)
    expect(received).toHaveLength(1)
    const event = Stripe.webhooks.constructEvent(received[0]!.body, received[0]!.signature, fake.webhookSecret)
    expect(event.type).toBe('checkout.session.completed')
    const completed = event.data.object as Stripe.Checkout.Session
    expect(completed).toMatchObject({ id: session.id, payment_status: 'paid', status: 'complete' })

    const refund = await stripe.refunds.create({ payment_intent: completed.payment_intent as string })
    expect(refund).toMatchObject({ amount: 12345, status: 'succeeded' })
    await expect(stripe.refunds.create({ payment_intent: completed.payment_intent as string })).rejects.toThrow(/already been refunded/)
    await new Promise(r => setTimeout(r, 100))
    expect(received.map(r => JSON.parse(r.body).type)).toEqual(['checkout.session.completed', 'charge.refunded'])
  })

  it('declines a card ending in 0002 and refuses a wrong key', async () => {
    const session = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: 'eur', unit_amount: 100, product_data: { name: 'Fee' } } }],
      success_url: `${appUrl}/done`,
    })
    const declined = await fetch(session.url!, { method: 'POST', body: new URLSearchParams({ card_number: '4000000000000002', action: 'pay' }), redirect: 'manual' })
    expect(declined.status).toBe(402)
    expect(await declined.text()).toContain('declined')
    expect((await stripe.checkout.sessions.retrieve(session.id)).payment_status).toBe('unpaid')
    const wrong = new Stripe('sk_test_wrong', { host: '127.0.0.1', port: fake.port, protocol: 'http', maxNetworkRetries: 0 })
    await expect(wrong.checkout.sessions.retrieve(session.id)).rejects.toThrow(Stripe.errors.StripeAuthenticationError)
  })
})
