// GET /api/competitions/:competitionId/tags/sheet?classId=|entryIds=a,b → { tags: PrintableTag[] }:
// the current tags to print, with their QR codes. The organiser.
import { competitionParamsSchema } from '#shared/schemas/params'
import { tagSheetQuerySchema } from '#shared/schemas/tags'
import type { PrintableTag } from '#shared/types/api-tags'
import { sheetTags } from '#domain/tags/tags'

export default defineApiHandler(async (event): Promise<{ tags: PrintableTag[] }> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const selection = await validQuery(event, tagSheetQuerySchema)
  await requireRole(event, competitionId, ['organiser'])
  return { tags: await sheetTags(competitionId, selection, siteUrl(event)) }
})
