// POST /api/competitions/:competitionId/tags {classId?|entryIds?} → 201 TagList of the selected
// accepted entries, each selected one without a tag now with one. The organiser.
import { competitionParamsSchema } from '#shared/schemas/params'
import { tagSelectionSchema } from '#shared/schemas/tags'
import type { TagList } from '#shared/types/api-tags'
import { issueTags } from '#domain/tags/tags'

export default defineApiHandler(async (event): Promise<TagList> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const selection = await validBody(event, tagSelectionSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  const entries = await issueTags(competitionId, selection, user)
  setResponseStatus(event, 201)
  return { entries }
})
