// POST /api/admin/reminders/run {now?} — site administrators. Runs the reminder job now, or as
// of a given instant (the controllable clock of tests); returns what it queued, with each kind.
import { reminderRunBodySchema } from '#shared/schemas/invitation'
import { runReminders } from '#domain/mail/reminders'

export default defineApiHandler(async (event) => {
  await requireAdmin(event)
  const body = await validBody(event, reminderRunBodySchema.optional())
  return await runReminders(body?.now ? new Date(body.now) : new Date())
})
