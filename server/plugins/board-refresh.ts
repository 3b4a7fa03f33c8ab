// The board follows dossier edits (server/utils/board-refresh.ts), and at start every open
// day's tiles are rebuilt from the dossiers: they are derived data, so a new engine version or
// a day opened by the demo seed shows correctly at once.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('afterResponse', (event) => {
    if (event.context.boardHandled) return
    const competitionId = competitionOfWrite(event.method, event.path, event.node.res.statusCode)
    if (competitionId) scheduleBoardRefresh(competitionId, (event.context.gridmarkUser as { id: string } | undefined)?.id ?? null)
  })

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
