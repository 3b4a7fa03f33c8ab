// GET …/entries/:entryId/document-views — the entry's entrant, or the competition's organiser.
// Who opened the entry's medical and licence files, under which role and when; newest first.
import { entryParamsSchema } from '#shared/schemas/params'
import { ENTRY_DOCUMENT_VIEWS_LIMIT } from '#shared/schemas/document-views'
import { entryDocumentViews } from '#domain/files/document-views'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const { entry } = await requireEntryDocumentViews(event, competitionId, entryId)
  return entryDocumentViews(entry, ENTRY_DOCUMENT_VIEWS_LIMIT)
})
