// GET /api/competitions/:competitionId/firmware/suggest?family=&version= — any member.
// FirmwareSuggestion: the firmware catalogue's expiry date for that unit family and version, or null.
import { competitionParamsSchema } from '#shared/schemas/params'
import { firmwareSuggestQuerySchema } from '#shared/schemas/entry'
import type { FirmwareSuggestion } from '#shared/types/api-entries'
import { suggestFirmware } from '#domain/competitions/firmware-catalogue'

export default defineApiHandler(async (event): Promise<FirmwareSuggestion> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  await requireRole(event, competitionId, 'any')
  const { family, version } = await validQuery(event, firmwareSuggestQuerySchema)
  return suggestFirmware(competitionId, family, version)
})
