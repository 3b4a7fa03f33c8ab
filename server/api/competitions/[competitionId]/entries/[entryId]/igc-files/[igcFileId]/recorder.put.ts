// PUT …/entries/:entryId/igc-files/:igcFileId/recorder ({ unitId }) — the entry's entrant or
// staff say which flight recorder a current IGC file came from (a file uploaded without naming
// it, or named wrongly). 404 for a unit that is not one of the entry's flight recorders.
import { entryIgcParamsSchema, igcRecorderBodySchema } from '#shared/schemas/files'
import { nameIgcRecorder } from '#domain/files/igc-files'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId, igcFileId } = await validParams(event, entryIgcParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const { unitId } = await validBody(event, igcRecorderBodySchema)
  await requireEntryRecorder(entryId, unitId)
  const igcFile = await nameIgcRecorder({ competitionId, entryId, igcFileId, unitId, actorUserId: access.user.id })
  return { igcFile }
})
