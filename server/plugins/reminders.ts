// Runs the reminder job on a timer (runtime config reminders.intervalMs; 0 turns it off, as the
// tests do — they trigger it through POST /api/admin/reminders/run with a chosen instant). Each
// run sends what the competitions' schedules make due that day (server/domain/mail/reminders.ts),
// so an hourly run is plenty and a missed run costs nothing but lateness.
import { runReminders } from '#domain/mail/reminders'

export default defineNitroPlugin((nitroApp) => {
  startIntervalJob(nitroApp, {
    name: 'reminder job',
    intervalMs: Number(useRuntimeConfig().reminders.intervalMs) || 0,
    firstAfterMs: 30_000,
    run: async () => {
      const r = await runReminders()
      if (r.queued) console.info(`[gridmark] queued ${r.queued} reminder(s)`)
    },
  })
})
