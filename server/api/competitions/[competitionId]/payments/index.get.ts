// GET /api/competitions/:competitionId/payments[?status=paid] — organisers (and site administrators).
// Every card payment of the competition with its entry, and the totals collected and refunded.
import { competitionParamsSchema } from '#shared/schemas/params'
import { paymentsQuerySchema } from '#shared/schemas/payment'
import { competitionPayments } from '#domain/payments/payments'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const query = await validQuery(event, paymentsQuerySchema)
  const { competition } = await requireRole(event, competitionId, ['organiser'])
  return competitionPayments(competition, query)
})
