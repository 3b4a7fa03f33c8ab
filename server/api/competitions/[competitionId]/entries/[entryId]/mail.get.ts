// GET /api/competitions/:competitionId/entries/:entryId/mail — every e-mail about the entry,
// sent or still waiting in the outbox. The organiser only.
import { entryParamsSchema } from '#shared/schemas/entry'
import type { EntryMailResponse } from '#shared/types/api-mail'
import { entryMailLog } from '#domain/mail/outbox'

export default defineApiHandler(async (event): Promise<EntryMailResponse> => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, ['organiser'])
  return { mail: await entryMailLog(entryId) }
})
