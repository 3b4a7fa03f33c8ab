// DELETE /api/competitions/:competitionId/firmware/:releaseId — organisers. 204.
import { firmwareParamsSchema } from '#shared/schemas/firmware'
import { deleteFirmwareRelease } from '#domain/competitions/firmware-catalogue'

export default defineApiHandler(async (event) => {
  const { competitionId, releaseId } = await validParams(event, firmwareParamsSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  await deleteFirmwareRelease(competitionId, releaseId, user.id)
  setResponseStatus(event, 204)
  return null
})
