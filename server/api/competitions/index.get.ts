// GET /api/competitions — signed-in users. The competitions the user takes part in;
// site administrators get every competition.
export default defineApiHandler(async (event) => {
  const user = await requireUser(event)
  if (user.isAdmin) return { competitions: await listAllCompetitions() }
  return { competitions: await membershipSummaries(user.id) }
})
