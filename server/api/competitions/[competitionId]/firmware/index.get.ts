// GET /api/competitions/:competitionId/firmware — organisers, scrutineers, directors.
// The firmware catalogue, by unit family and version; canEdit tells organisers apart.
import { STAFF_ROLES } from '#shared/constants/roles'
import { competitionParamsSchema } from '#shared/schemas/params'
import type { FirmwareCatalogueResponse } from '#shared/types/setup'
import { listFirmwareReleases } from '#domain/competitions/firmware-catalogue'

export default defineApiHandler(async (event): Promise<FirmwareCatalogueResponse> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { roles } = await requireRole(event, competitionId, STAFF_ROLES)
  return { releases: await listFirmwareReleases(competitionId), canEdit: roles.includes('organiser') }
})
