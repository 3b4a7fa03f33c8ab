// PUT /api/competitions/:competitionId/entries/:entryId/occupant-masses — a scrutineer,
// director or organiser records the pilot's and co-pilot's mass with parachute from the
// registration weighing ({ pilotMassKg?, copilotMassKg? }, kg; null clears). Audited; the grid
// weigh-in adds them to the scale readings. Answers the new dossier.
import { entryParamsSchema, occupantMassesSchema } from '#shared/schemas/entry'
import type { EntryDossier } from '#shared/types/api-entries'
import { loadDossier, recordOccupantMasses } from '#domain/entries/entries'

export default defineApiHandler(async (event): Promise<EntryDossier> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, ['scrutineer', 'director', 'organiser'])
  const body = await validBody(event, occupantMassesSchema)
  await recordOccupantMasses(access, body)
  return loadDossier(access)
})
