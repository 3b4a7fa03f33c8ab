// GET /api/competitions/open — signed-in users. {competitions: OpenCompetition[]}: every
// competition whose registration is open today (in its own time zone), with its classes.
import { listOpenCompetitions } from '#domain/entries/entries'

export default defineApiHandler(async (event) => {
  const user = await requireUser(event)
  return { competitions: await listOpenCompetitions(user.id) }
})
