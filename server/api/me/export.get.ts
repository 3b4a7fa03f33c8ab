// GET /api/me/export — signed-in users. Everything Gridmark holds about the caller as a JSON
// attachment (no password hash, no other person's data); 401 signed out.
import { exportAccount } from '#domain/account/export'

export default defineApiHandler(async (event) => {
  const user = await requireUser(event)
  const data = await exportAccount(user.id)
  setResponseHeaders(event, {
    'Content-Type': 'application/json; charset=utf-8',
    'Content-Disposition': `attachment; filename="gridmark-my-data-${data.exportedAt.slice(0, 10)}.json"`,
    'Cache-Control': 'no-store',
  })
  return JSON.stringify(data, null, 2)
})
