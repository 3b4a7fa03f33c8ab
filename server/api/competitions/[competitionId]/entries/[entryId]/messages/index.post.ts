// POST …/entries/:entryId/messages ({ body }) — the entrant asks the office (every organiser is
// e-mailed), or an organiser answers (the entrant is e-mailed). 201 with the message.
import { entryMessageSchema, entryParamsSchema } from '#shared/schemas/entry'
import { postEntryMessage } from '#domain/entries/messages'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const body = await validBody(event, entryMessageSchema)
  const message = await postEntryMessage(access, body)
  setResponseStatus(event, 201)
  return { message }
})
