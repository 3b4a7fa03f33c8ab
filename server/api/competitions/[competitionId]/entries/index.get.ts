// GET /api/competitions/:competitionId/entries — staff (organiser, scrutineer, director).
// The entries table: ?sort&direction&class&status&payment&q&page&pageSize → {rows, total, …}.
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import { entryTableQuerySchema } from '#shared/schemas/entry-table'
import type { EntryTableResponse } from '#shared/types/setup'
import { entryTablePage } from '#domain/entries/entry-table'

export default defineApiHandler(async (event): Promise<EntryTableResponse> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const query = await validQuery(event, entryTableQuerySchema)
  const { competition } = await requireRole(event, competitionId, STAFF_ROLES)
  return entryTablePage(competitionId, query, competition.currency)
})
