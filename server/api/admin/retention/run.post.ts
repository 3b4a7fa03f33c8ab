// POST /api/admin/retention/run {at?} — site administrators. Runs the retention job now, or as
// of a given instant (the controllable clock of tests); returns how many files it deleted.
import { retentionRunBodySchema } from '#shared/schemas/files'
import { runRetention } from '#domain/files/retention'

export default defineApiHandler(async (event) => {
  await requireAdmin(event)
  const body = await validBody(event, retentionRunBodySchema.optional())
  return await runRetention(body?.at ? new Date(body.at) : new Date())
})
