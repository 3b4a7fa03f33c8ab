// POST /api/payments/webhook — the payment service only (no session; the signature is the proof).
// Verifies the Stripe-Signature header over the raw body (1 MB at most), then applies the event exactly once.
import { MESSAGES } from '#shared/constants/messages'
import { processPaymentEvent, verifyWebhook } from '#domain/payments/payments'

const WEBHOOK_MAX_BYTES = 1024 * 1024

export default defineApiHandler(async (event) => {
  const raw = await readLimitedBody(event, WEBHOOK_MAX_BYTES, MESSAGES.webhookTooLarge)
  const signature = getRequestHeader(event, 'stripe-signature')
  const verified = verifyWebhook(raw, signature)
  return processPaymentEvent(verified)
})
