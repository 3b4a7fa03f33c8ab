// POST /api/payments/webhook — the payment service only (no session; the signature is the proof).
// Verifies the Stripe-Signature header over the raw body, then applies the event exactly once.
import { processPaymentEvent, verifyWebhook } from '#domain/payments/payments'

export default defineApiHandler(async (event) => {
  const raw = await readRawBody(event, false)
  const signature = getRequestHeader(event, 'stripe-signature')
  const verified = verifyWebhook(raw, signature)
  return processPaymentEvent(verified)
})
