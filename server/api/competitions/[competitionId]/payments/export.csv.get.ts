// GET /api/competitions/:competitionId/payments/export.csv[?status=…] — organisers (and site administrators).
// The payments table as CSV (amounts in major units with a dot, dates in ISO 8601).
import { competitionParamsSchema } from '#shared/schemas/params'
import { paymentsQuerySchema } from '#shared/schemas/payment'
import { competitionPaymentsCsv } from '#domain/payments/payments'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const query = await validQuery(event, paymentsQuerySchema)
  const { competition } = await requireRole(event, competitionId, ['organiser'])
  const csv = await competitionPaymentsCsv(competition, query)
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="payments-${competition.slug}.csv"`)
  return csv
})
