// POST /api/admin/reminders/run — site administrators. Runs the pre-event reminder job now
// (optionally as of a given time, for tests and dry runs of a schedule); returns what it queued.
import { reminderRunBodySchema } from '#shared/schemas/invitation'
import { runReminders } from '#domain/mail/reminders'

export default defineApiHandler(async (event) => {
  await requireAdmin(event)
  const body = await validBody(event, reminderRunBodySchema.optional())
  return await runReminders(body?.now ? new Date(body.now) : new Date())
})
