// GET /api/me — signed-in users. The user and their competitions with their roles; 401 otherwise.
import type { MeResponse } from '#shared/types/api'
import { membershipSummaries } from '#domain/competitions/competitions'

export default defineApiHandler(async (event): Promise<MeResponse> => {
  const user = await requireUser(event)
  return { user, memberships: await membershipSummaries(user.id) }
})
