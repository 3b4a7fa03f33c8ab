// Runs the reminder job on a timer (runtime config reminders.intervalMs; 0 turns it off, as the
// tests do — they trigger it through POST /api/admin/reminders/run with a chosen instant). Each
// run sends what the competitions' schedules make due that day (server/domain/mail/reminders.ts),
// so an hourly run is plenty and a missed run costs nothing but lateness.
import { runReminders } from '#domain/mail/reminders'

export default defineNitroPlugin((nitroApp) => {
  const intervalMs = Number(useRuntimeConfig().reminders.intervalMs) || 0
  if (intervalMs <= 0) return

  let running: Promise<unknown> | undefined
  const run = () => {
    if (running) return
    running = runReminders()
      .then((r) => {
        if (r.queued) console.info(`[gridmark] queued ${r.queued} reminder(s)`)
      })
      .catch(error => console.warn(`[gridmark] reminder job: ${(error as Error).message}`))
      .finally(() => { running = undefined })
  }
  // A first run shortly after start, once migrations had their chance.
  const first = setTimeout(run, 30_000)
  const timer = setInterval(run, intervalMs)
  nitroApp.hooks.hook('close', async () => {
    clearTimeout(first)
    clearInterval(timer)
    await running
  })
})
