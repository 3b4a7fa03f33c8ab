// PATCH /api/competitions/:competitionId/firmware/:releaseId — organisers. Changes a
// release's family, version or expiry date; answers the release.
import { firmwareParamsSchema, firmwareReleasePatchSchema } from '#shared/schemas/firmware'
import { updateFirmwareRelease } from '#domain/competitions/firmware-catalogue'

export default defineApiHandler(async (event) => {
  const { competitionId, releaseId } = await validParams(event, firmwareParamsSchema)
  const body = await validBody(event, firmwareReleasePatchSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  return updateFirmwareRelease(competitionId, releaseId, body, user.id)
})
