// POST /api/competitions/:competitionId/firmware — organisers. Adds one release
// {unitFamily, version, expiresOn}; 201 with it, 409 when that family and version are listed.
import { competitionParamsSchema } from '#shared/schemas/params'
import { firmwareReleaseSchema } from '#shared/schemas/firmware'
import { addFirmwareRelease } from '#domain/competitions/firmware-catalogue'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const body = await validBody(event, firmwareReleaseSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  const created = await addFirmwareRelease(competitionId, body, user.id)
  setResponseStatus(event, 201)
  return created
})
