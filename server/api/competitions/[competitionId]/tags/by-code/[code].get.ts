// GET /api/competitions/:competitionId/tags/by-code/:code → ResolvedTag (case and dashes do not
// matter). Staff of the competition ('grid') or the entry's own entrant ('own'); others 404.
import { shortCodeParamsSchema } from '#shared/schemas/tags'
import type { ResolvedTag } from '#shared/types/api-tags'
import { resolveShortCode } from '#domain/tags/tags'

export default defineApiHandler(async (event): Promise<ResolvedTag> => {
  const { competitionId, code } = await validParams(event, shortCodeParamsSchema)
  return resolveShortCode(event, competitionId, code)
})
