// Runs the retention job on a timer (runtime config retention.intervalMs; 0 turns it off, as
// the tests do — they trigger it through POST /api/admin/retention/run with a chosen instant).
// Each run deletes whatever stored files are due by then (server/domain/files/retention.ts), so
// an hourly run is plenty and a missed run only keeps a file a little longer.
import { runRetention } from '#domain/files/retention'

export default defineNitroPlugin((nitroApp) => {
  const intervalMs = Number(useRuntimeConfig().retention.intervalMs) || 0
  if (intervalMs <= 0) return

  let running: Promise<unknown> | undefined
  const run = () => {
    if (running) return
    running = runRetention()
      .then((r) => {
        if (r.medicalDeleted || r.supersededDeleted) {
          console.info(`[gridmark] retention: deleted ${r.medicalDeleted} medical or licence file(s) and ${r.supersededDeleted} replaced one(s)`)
        }
      })
      .catch(error => console.warn(`[gridmark] retention job: ${(error as Error).message}`))
      .finally(() => { running = undefined })
  }
  // A first run shortly after start, once migrations had their chance.
  const first = setTimeout(run, 45_000)
  const timer = setInterval(run, intervalMs)
  nitroApp.hooks.hook('close', async () => {
    clearTimeout(first)
    clearInterval(timer)
    await running
  })
})
