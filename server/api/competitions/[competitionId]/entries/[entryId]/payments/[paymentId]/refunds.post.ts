// POST /api/competitions/:competitionId/entries/:entryId/payments/:paymentId/refunds — organisers (and site administrators).
// Refunds part or all of what remains of one payment, with a reason (a card's through the payment service); answers { payment }.
import { paymentParamsSchema, refundBodySchema } from '#shared/schemas/payment'
import { refundPayment } from '#domain/payments/payments'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId, paymentId } = await validParams(event, paymentParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, ['organiser'])
  const body = await validBody(event, refundBodySchema)
  return { payment: await refundPayment(access, paymentId, body) }
})
