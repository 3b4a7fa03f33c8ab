// GET /api/health — for operators and load balancers; no sign-in.
// 200 {status:'ok',db:'ok'}, or 503 {status:'degraded',db:'down'} while PostgreSQL is unreachable.
export default defineEventHandler(async (event) => {
  setResponseHeader(event, 'Cache-Control', 'no-store')
  if (await pingDatabase()) return { status: 'ok', db: 'ok' }
  setResponseStatus(event, 503)
  return { status: 'degraded', db: 'down' }
})
