// Keeps open days in step with dossier edits made anywhere else (entries, units, documents,
// IGC files, payments, set-up, the firmware catalogue): after a successful write under
// /api/competitions/:id/ (server/plugins/board-refresh.ts), or a payment notification, the
// competition's open day is brought up to date — once per burst of writes, a moment later,
// outside the request (a steady stream of writes: at least once a second). Writes that change the board themselves (grid checks, the director's
// actions, opening and closing days) set `event.context.boardHandled` and are skipped.
const DEBOUNCE_MS = 250
/** A steady stream of writes still brings the board up to date this often. */
const MAX_WAIT_MS = 1000

const timers = new Map<string, { timer: ReturnType<typeof setTimeout>, since: number }>()
const running = new Map<string, Promise<void>>()

function logFailure(competitionId: string, error: unknown) {
  console.warn(`[gridmark] board of competition ${competitionId} not brought up to date: ${(error as Error).message}`)
}

/** Brings the competition's open day up to date soon (several calls in a burst: once). */
export function scheduleBoardRefresh(competitionId: string, actorId: string | null): void {
  const pending = timers.get(competitionId)
  if (pending) clearTimeout(pending.timer)
  const since = pending?.since ?? Date.now()
  const delay = Math.max(0, Math.min(DEBOUNCE_MS, since + MAX_WAIT_MS - Date.now()))
  timers.set(competitionId, { since, timer: setTimeout(() => {
    timers.delete(competitionId)
    const previous = running.get(competitionId) ?? Promise.resolve()
    const next = previous
      .then(() => refreshOpenDay(competitionId, { cause: 'dossier', actorId }))
      .catch(error => logFailure(competitionId, error))
      .finally(() => {
        if (running.get(competitionId) === next) running.delete(competitionId)
      })
    running.set(competitionId, next)
  }, delay) })
}

/** Every open day of every competition, rebuilt from the dossiers (at start: tiles are derived data). */
export async function refreshAllOpenDays(): Promise<number> {
  const open = await useDb()('board_days').whereNull('closed_at').select('competition_id')
  for (const { competition_id } of open) await refreshOpenDay(competition_id, { cause: 'dossier', actorId: null })
  return open.length
}

const COMPETITION_WRITE = /^\/api\/competitions\/([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})\//i

/** The competition a successful write was about, if it may have changed a dossier. */
export function competitionOfWrite(method: string, path: string, status: number): string | null {
  if (method === 'GET' || method === 'HEAD' || method === 'OPTIONS' || status >= 400) return null
  return COMPETITION_WRITE.exec(path)?.[1]?.toLowerCase() ?? null
}
