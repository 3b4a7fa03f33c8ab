// GET /api/competitions/:competitionId/audit?day=&entryId=&actorId=&action=&before=&limit= —
// organiser or contest director. The audit log, newest first, with the filters' choices.
import { competitionParamsSchema } from '#shared/schemas/params'
import { auditQuerySchema } from '#shared/schemas/board'
import type { AuditPage } from '#shared/types/api-board'
import { auditPage } from '#domain/audit/audit-log'

export default defineApiHandler(async (event): Promise<AuditPage> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const query = await validQuery(event, auditQuerySchema)
  const { competition } = await requireRole(event, competitionId, ['organiser', 'director'])
  return auditPage(competition, query)
})
