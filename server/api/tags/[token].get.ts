// GET /api/tags/:token → ResolvedTag: where a scanned tag leads. Signed in; staff of the tag's
// competition get 'grid', the entry's own entrant 'own'; anyone else, and any bad token, 404.
import { tagTokenParamsSchema } from '#shared/schemas/tags'
import { MESSAGES } from '#shared/constants/messages'
import type { ResolvedTag } from '#shared/types/api-tags'
import { resolveTagToken } from '#domain/tags/tags'

export default defineApiHandler(async (event): Promise<ResolvedTag> => {
  const { token } = await validTagToken(event)
  return resolveTagToken(event, token)
})

/** A malformed or truncated token is no tag of ours: 404 with the tag message, no database look-up. */
async function validTagToken(event: Parameters<typeof validParams>[0]) {
  const result = tagTokenParamsSchema.safeParse(getRouterParams(event, { decode: true }))
  if (!result.success) {
    await requireUser(event)
    throw httpError(404, MESSAGES.tagNotFound)
  }
  return result.data
}
