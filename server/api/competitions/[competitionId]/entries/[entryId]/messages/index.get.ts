// GET …/entries/:entryId/messages — its entrant and the staff: the messages between the entrant
// and the office about the entry, oldest first.
import { entryParamsSchema } from '#shared/schemas/entry'
import { listEntryMessages } from '#domain/entries/messages'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  return { messages: await listEntryMessages(entryId) }
})
