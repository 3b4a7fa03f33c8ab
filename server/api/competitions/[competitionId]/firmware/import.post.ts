// POST /api/competitions/:competitionId/firmware/import — organisers. A CSV file (text/csv
// body, a form upload, or JSON {csv}) with columns unit_family, version, expires_on. All or
// nothing: 400 lists each bad line by number; otherwise upserts and answers {added, updated, total}.
import { competitionParamsSchema } from '#shared/schemas/params'
import type { FirmwareImportResult } from '#shared/types/setup'
import { importFirmwareCsv } from '#domain/competitions/firmware-catalogue'

export default defineApiHandler(async (event): Promise<FirmwareImportResult> => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const { user } = await requireRole(event, competitionId, ['organiser'])
  const text = await readCatalogueUpload(event)
  return importFirmwareCsv(competitionId, text, user.id)
})
