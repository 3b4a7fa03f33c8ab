// POST /api/competitions/:competitionId/entries/:entryId/units — whoever may change the entry.
// Adds a collision-warning unit or flight recorder: 201 UnitView; 409 on a radio ID in use.
import { entryParamsSchema, unitBodySchema } from '#shared/schemas/entry'
import { addUnit } from '#domain/entries/entries'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const body = await validBody(event, unitBodySchema)
  const unit = await addUnit(access, body)
  setResponseStatus(event, 201)
  return unit
})
