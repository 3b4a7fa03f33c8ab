// GET /api/competitions/:competitionId/tags/sheet.pdf?classId=|entryIds=a,b → the A4 sticker
// sheet of the current tags (application/pdf). The organiser.
import { competitionParamsSchema } from '#shared/schemas/params'
import { tagSheetQuerySchema } from '#shared/schemas/tags'
import { renderTagSheet, tagSheetFilename } from '#domain/tags/tag-sheet'
import { sheetTags } from '#domain/tags/tags'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const selection = await validQuery(event, tagSheetQuerySchema)
  const { competition } = await requireRole(event, competitionId, ['organiser'])
  const tags = await sheetTags(competitionId, selection, siteUrl(event))
  const pdf = await renderTagSheet({ competitionName: competition.name, tags })
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${tagSheetFilename(competition.slug)}"`,
    'cache-control': 'no-store',
  })
  return pdf
})
