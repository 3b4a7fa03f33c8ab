// POST /api/competitions/:competitionId/entries/:entryId/tag/revoke → TagListEntry with no tag:
// the current tag stops working, no new one is issued. The organiser.
import { entryParamsSchema } from '#shared/schemas/params'
import type { TagListEntry } from '#shared/types/api-tags'
import { revokeTag } from '#domain/tags/tags'

export default defineApiHandler(async (event): Promise<TagListEntry> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  return revokeTag(competitionId, entryId, user)
})
