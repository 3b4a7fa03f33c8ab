// Runs the retention job on a timer (runtime config retention.intervalMs; 0 turns it off, as
// the tests do — they trigger it through POST /api/admin/retention/run with a chosen instant).
// Each run deletes whatever stored files are due by then (server/domain/files/retention.ts), so
// an hourly run is plenty and a missed run only keeps a file a little longer.
import { runRetention } from '#domain/files/retention'

export default defineNitroPlugin((nitroApp) => {
  startIntervalJob(nitroApp, {
    name: 'retention job',
    intervalMs: Number(useRuntimeConfig().retention.intervalMs) || 0,
    firstAfterMs: 45_000,
    run: async () => {
      const r = await runRetention()
      if (r.medicalDeleted || r.supersededDeleted) {
        console.info(`[gridmark] retention: deleted ${r.medicalDeleted} medical or licence file(s) and ${r.supersededDeleted} replaced one(s)`)
      }
    },
  })
})
