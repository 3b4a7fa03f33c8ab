// GET /api/me/entries — signed-in users. {entries: MyEntrySummary[]}: the caller's own
// entries across competitions, each with what is missing and the next step.
import { myEntries } from '#domain/entries/entries'

export default defineApiHandler(async (event) => {
  const user = await requireUser(event)
  return { entries: await myEntries(user.id) }
})
