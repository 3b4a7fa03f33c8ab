// setupFiles of the "nuxt" vitest project. The test app boots at "/" and the auth middleware asks
// /api/me; answer as the real server does for a visitor, so boot does not fall to the 503 page.
import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { setResponseStatus } from 'h3'

registerEndpoint('/api/me', (event) => {
  setResponseStatus(event, 401)
  return { statusCode: 401, message: 'Sign in first.' }
})
