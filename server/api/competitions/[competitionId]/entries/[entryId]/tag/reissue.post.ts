// POST /api/competitions/:competitionId/entries/:entryId/tag/reissue → TagListEntry: the current
// tag revoked (its sticker stops working) and a new one issued. The organiser.
import { entryParamsSchema } from '#shared/schemas/params'
import type { TagListEntry } from '#shared/types/api-tags'
import { reissueTag } from '#domain/tags/tags'

export default defineApiHandler(async (event): Promise<TagListEntry> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  return reissueTag(competitionId, entryId, user)
})
