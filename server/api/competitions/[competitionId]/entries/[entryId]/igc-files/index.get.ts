// GET …/entries/:entryId/igc-files — the entry's entrant or the competition's staff.
// The latest IGC file from each recorder with its parsed header, and replaced ones as history.
import { entryParamsSchema } from '#shared/schemas/files'
import { listIgcFiles } from '#domain/files/igc-files'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return listIgcFiles(entryId)
})
