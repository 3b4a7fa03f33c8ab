// GET /api/competitions — signed-in users. {competitions: MembershipSummary[]}: the
// competitions the user takes part in; site administrators get every competition.
import { competitionSummariesForAdmin, membershipSummaries } from '#domain/competitions/competitions'

export default defineApiHandler(async (event) => {
  const user = await requireUser(event)
  const competitions = user.isAdmin ? await competitionSummariesForAdmin(user.id) : await membershipSummaries(user.id)
  return { competitions }
})
