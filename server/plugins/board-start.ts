// At start every open day's tiles are rebuilt from the dossiers: they are derived data, so a
// new engine version, or a day opened by the demo seed, shows correctly at once. (While the
// server runs, the code that changes a dossier keeps the board in step: dossierChanged.)
import { refreshAllOpenDays } from '#domain/board/dossier-changed'

export default defineNitroPlugin((nitroApp) => {
  let stopped = false
  nitroApp.hooks.hook('close', () => {
    stopped = true
  })
  void whenSchemaReady().then(async () => {
    if (stopped) return
    try {
      const rebuilt = await refreshAllOpenDays()
      if (rebuilt) console.info(`[gridmark] open days brought up to date: ${rebuilt}`)
    }
    catch (error) {
      console.warn(`[gridmark] open days not rebuilt at start: ${(error as Error).message}`)
    }
  })
})
