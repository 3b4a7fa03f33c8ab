// POST /api/competitions/:competitionId/entries — signed-in users; joins an open competition
// with an entry in draft (and makes the caller its entrant). 201 {id}; 409 on a taken competition ID;
// 403 until the caller's e-mail address is confirmed.
import { competitionParamsSchema } from '#shared/schemas/params'
import { entryBodySchema } from '#shared/schemas/entry'
import { createEntry } from '#domain/entries/entries'

export default defineApiHandler(async (event) => {
  const { competitionId } = await validParams(event, competitionParamsSchema)
  const user = requireVerified(await requireUser(event))
  const body = await validBody(event, entryBodySchema)
  const id = await createEntry(user, competitionId, body)
  setResponseStatus(event, 201)
  return { id }
})
