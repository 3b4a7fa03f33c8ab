// GET /api/competitions/:competitionId/tags → TagList: every accepted entry with its current
// tag or null. The organiser.
import { competitionParamsSchema } from '#shared/schemas/params'
import type { TagList } from '#shared/types/api-tags'
import { listTags } from '#domain/tags/tags'

export default defineApiHandler(async (event): Promise<TagList> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  await requireRole(event, competitionId, ['organiser'])
  return { entries: await listTags(competitionId) }
})
