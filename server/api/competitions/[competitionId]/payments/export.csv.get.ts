// GET /api/competitions/:competitionId/payments/export.csv[?status=…] — organisers (and site administrators).
// The payments table as CSV (amounts in major units with a dot, dates in ISO 8601).
import { stringify } from 'csv-stringify/sync'
import { competitionParamsSchema } from '#shared/schemas/params'
import { paymentsQuerySchema } from '#shared/schemas/payment'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const query = await validQuery(event, paymentsQuerySchema)
  const { competition } = await requireRole(event, competitionId, ['organiser'])
  const { rows } = await competitionPayments(competition, query)
  const major = (minor: number) => (minor / 100).toFixed(2)
  // A cell that a spreadsheet would read as a formula is kept as text.
  const cell = (s: string) => (/^[=+\-@\t\r]/.test(s) ? `'${s}` : s)
  const csv = stringify([
    ['competition_id', 'pilot', 'entrant', 'entry_status', 'amount', 'refunded', 'currency', 'status', 'created_at', 'paid_at', 'refunded_at'],
    ...rows.map(r => [r.compId, cell(r.pilotName), cell(r.entrantName), r.entryStatus, major(r.amountMinor), major(r.refundedMinor), r.currency, r.status, r.createdAt, r.paidAt ?? '', r.refundedAt ?? '']),
  ])
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="payments-${competition.slug}.csv"`)
  return csv
})
