// Any /api address no route serves: a JSON 404 rather than the page renderer's HTML.
import { MESSAGES } from '#shared/constants/messages'

export default defineApiHandler(() => {
  throw httpError(404, MESSAGES.notFound)
})
