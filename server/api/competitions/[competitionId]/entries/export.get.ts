// GET /api/competitions/:competitionId/entries/export — organisers. The entries table's
// rows under the same filters and sort, as a CSV download (cells safe from formula injection).
import { competitionParamsSchema } from '#shared/schemas/params'
import { entryTableFilterSchema } from '#shared/schemas/entry-table'
import { entryTableCsv } from '#domain/entries/entry-table'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const filter = await validQuery(event, entryTableFilterSchema)
  const { competition } = await requireRole(event, competitionId, ['organiser'])
  const csv = await entryTableCsv(competitionId, filter, competition.currency)
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${competition.slug}-entries.csv"`)
  return csv
})
