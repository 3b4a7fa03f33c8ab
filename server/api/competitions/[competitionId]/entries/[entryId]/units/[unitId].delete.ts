// DELETE /api/competitions/:competitionId/entries/:entryId/units/:unitId — whoever may change
// the entry. 204; the audit log keeps what the unit was.
import { unitParamsSchema } from '#shared/schemas/entry'
import { deleteUnit } from '#domain/entries/entries'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId, unitId } = await validParams(event, unitParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  await deleteUnit(access, unitId)
  setResponseStatus(event, 204)
  return null
})
