// PATCH /api/competitions/:competitionId/entries/:entryId/units/:unitId — whoever may change
// the entry. The body is the whole unit (fields left out are cleared); its kind cannot change.
import { unitBodySchema, unitParamsSchema } from '#shared/schemas/entry'
import { updateUnit } from '#domain/entries/entries'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId, unitId } = await validParams(event, unitParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const body = await validBody(event, unitBodySchema)
  return updateUnit(access, unitId, body)
})
