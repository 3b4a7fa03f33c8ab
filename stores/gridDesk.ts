import { dateInZone } from '#shared/engine'
import type { GridCheckBody } from '#shared/schemas/grid'
import { withUnitsShown } from '#shared/utils/units-shown'
import type { GridCheckResult, GridPack, GridPackEntry } from '#shared/types/api-grid'
import {
  attentionItems, dismissAttention, enqueueCheck, idbQueueStorage, loadPack, queuedChecks, saveScan, savePack, scansOf,
  type LocalScan,
} from '~/utils/gridDeskDb'
import { drainQueue, type AttentionItem, type QueuedCheck } from '~/utils/gridQueue'
import { servedPackUse } from '~/utils/servedPack'

// The scrutineer's desk on the phone: the day's pack (kept in IndexedDB, so the grid works
// without signal), the outbox of grid checks and its sync state. Client state shared by the
// scanner and the grid check screen; the server stays the record.

export const SYNC_INTERVAL_MS = 20_000

let zone: string | undefined
/** The phone's own time zone (read once: a new date formatter per read costs). */
function phoneZone(): string {
  return zone ??= Intl.DateTimeFormat().resolvedOptions().timeZone
}

/**
 * Sets a list read again from IndexedDB only when it differs from what is shown: each new
 * array re-rendered the day's list of gliders, several times over while the page opened.
 */
function keepIfSame<T>(list: Ref<T[]>, next: T[]): void {
  if (JSON.stringify(list.value) !== JSON.stringify(next)) list.value = next
}

export const useGridDeskStore = defineStore('gridDesk', () => {
  // On the server, a plain $fetch would not carry the browser's cookie.
  const requestFetch = useRequestFetch()
  const competitionId = ref<string | null>(null)
  // Replaced whole, never changed in place: a shallow ref, so the engine and the lists read
  // plain objects (a deep proxy made every property read of 40 dossiers a tracked read). A pack
  // the server's render sent with the page arrives as a shallow ref too: a plain object.
  const pack = shallowRef<GridPack | null>(null)
  /** The pack came with the page from the server's render, and `open` has not yet weighed it. */
  const served = ref(false)
  const packStoredAt = ref<string | null>(null)
  const packError = ref<string | null>(null)
  const packLoading = ref(false)
  const waiting = ref<QueuedCheck[]>([])
  const attention = ref<AttentionItem[]>([])
  const scans = ref<LocalScan[]>([])
  const lastSyncedAt = ref<string | null>(null)
  const lastSyncProblem = ref<string | null>(null)
  const syncing = ref(false)
  const online = ref(true)
  let started = false
  let syncRun: Promise<void> | null = null

  /** Today in the competition's time zone (the pack's), else the phone's. */
  const today = computed(() => dateInZone(new Date(), pack.value?.timeZone ?? phoneZone()))
  const packIsToday = computed(() => pack.value !== null && pack.value.day === today.value)

  function entry(entryId: string): GridPackEntry | undefined {
    return pack.value?.entries.find(e => e.dossier.entry.id === entryId)
  }

  async function refreshLists() {
    keepIfSame(waiting, (await queuedChecks()).sort((a, b) => a.queuedAt.localeCompare(b.queuedAt)))
    keepIfSame(attention, (await attentionItems()).sort((a, b) => a.movedAt.localeCompare(b.movedAt)))
    if (competitionId.value && pack.value) keepIfSame(scans, await scansOf(competitionId.value, pack.value.day))
  }

  /** Fetches today's pack and keeps it; on failure the kept one stays in use. */
  async function fetchPack(): Promise<void> {
    const cid = competitionId.value
    if (!cid) return
    packLoading.value = true
    try {
      const fresh = await $fetch<GridPack>(`/api/competitions/${encodeURIComponent(cid)}/grid/pack`)
      await savePack(fresh)
      if (competitionId.value === cid) {
        pack.value = fresh
        packStoredAt.value = new Date().toISOString()
        packError.value = null
      }
    }
    catch (error) {
      const status = apiStatus(error)
      packError.value = status
        ? (apiErrorBody(error).message ?? `The day’s pack could not be loaded (${status}).`)
        : 'Offline: using the pack kept on this phone.'
    }
    finally {
      packLoading.value = false
    }
  }

  /**
   * The server's render of a grid page (a reload, a link opened): the desk holds the day's pack
   * as the page was rendered with it, so the glider is on the first paint.
   */
  async function serve(cid: string): Promise<void> {
    try {
      const fresh = await requestFetch<GridPack>(`/api/competitions/${encodeURIComponent(cid)}/grid/pack`)
      competitionId.value = cid
      pack.value = fresh
      served.value = true
    }
    catch {
      // The phone opens its own pack, as on any other page.
    }
  }

  /**
   * The pack the page came with, weighed against the one kept on the phone: true when it is
   * the newest there is (just rendered by the server) and is now kept: no fresh one is needed.
   * A copy of the page kept by the worker brings an older pack: the phone's newer one wins.
   */
  async function takeServed(cid: string, fromPage: GridPack): Promise<boolean> {
    const kept = await loadPack(cid, fromPage.day)
    const use = servedPackUse(fromPage, kept?.pack)
    if (competitionId.value !== cid) return false
    if (use === 'kept') {
      pack.value = kept!.pack
      packStoredAt.value = kept!.storedAt
      return false
    }
    if (use === 'same') {
      packStoredAt.value = kept!.storedAt
      return false
    }
    try {
      await savePack(fromPage)
    }
    catch {
      // Not kept (the phone's storage refused): the usual download tries again.
      return false
    }
    if (competitionId.value === cid && pack.value === fromPage) packStoredAt.value = new Date().toISOString()
    return true
  }

  /** Opens the desk of a competition: the kept pack at once, then a fresh one when online. */
  async function open(cid: string): Promise<void> {
    start()
    const fromPage = served.value && competitionId.value === cid ? pack.value : null
    served.value = false
    if (competitionId.value !== cid) {
      competitionId.value = cid
      pack.value = null
      packStoredAt.value = null
      packError.value = null
    }
    let current = false
    if (fromPage) current = await takeServed(cid, fromPage)
    else if (!pack.value) {
      const kept = await loadPack(cid, dateInZone(new Date(), phoneZone()))
      if (kept && competitionId.value === cid) {
        pack.value = kept.pack
        packStoredAt.value = kept.storedAt
      }
    }
    await refreshLists()
    if (online.value && !current) await fetchPack()
    await refreshLists()
    void sync()
  }

  /**
   * "The unit shows another version": the kept pack takes the units as shown, so the glider
   * reads the same on this phone before the server's next pack says so too.
   */
  async function keepUnitsShown(body: GridCheckBody): Promise<void> {
    const current = pack.value
    const kept = current?.entries.find(e => e.dossier.entry.id === body.entryId)
    if (!current || !kept || !body.unitsShown?.length) return
    const next = { ...current, entries: current.entries.map(e => (e === kept ? { ...e, dossier: withUnitsShown(kept.dossier, body.unitsShown!) } : e)) }
    pack.value = next
    await savePack(JSON.parse(JSON.stringify(next)) as GridPack)
  }

  /** Writes the check to IndexedDB first, then tries to send it. */
  async function submit(input: { competitionId: string, compId: string, gliderType: string, body: GridCheckBody, readiness: LocalScan['readiness'], outcome: LocalScan['outcome'] }): Promise<'recorded' | 'waiting' | 'attention'> {
    // Plain data only: IndexedDB cannot clone Vue's reactive proxies (a weigh-in typed in a form).
    const body = JSON.parse(JSON.stringify(input.body)) as GridCheckBody
    const item: QueuedCheck = { idempotencyKey: body.idempotencyKey, competitionId: input.competitionId, compId: input.compId, userId: useSessionStore().user?.id, body, queuedAt: new Date().toISOString(), attempts: 0 }
    await enqueueCheck(item)
    await keepUnitsShown(body)
    await saveScan({
      idempotencyKey: item.idempotencyKey, competitionId: input.competitionId, day: input.body.day, entryId: input.body.entryId,
      compId: input.compId, gliderType: input.gliderType, readiness: input.readiness, outcome: input.outcome, checkedAt: input.body.checkedAt,
    })
    await sync()
    if (waiting.value.some(w => w.idempotencyKey === item.idempotencyKey)) return 'waiting'
    if (attention.value.some(a => a.idempotencyKey === item.idempotencyKey)) return 'attention'
    return 'recorded'
  }

  async function runSync(): Promise<void> {
    syncing.value = true
    try {
      // A check made by another scrutineer on this phone waits for their session: the server
      // records whoever sends it as the scrutineer.
      const me = useSessionStore().user?.id
      const mine = { ...idbQueueStorage, queued: async () => (await idbQueueStorage.queued()).filter(i => !i.userId || i.userId === me) }
      const result = await drainQueue(
        mine,
        item => $fetch<GridCheckResult>(`/api/competitions/${encodeURIComponent(item.competitionId)}/grid-checks`, { method: 'POST', body: item.body }),
        error => ({ status: apiStatus(error), message: apiErrorBody(error).message }),
      )
      lastSyncProblem.value = result.stoppedBy?.message ?? null
      if (!result.stoppedBy) lastSyncedAt.value = new Date().toISOString()
      if (result.stoppedBy && result.stoppedBy.status === undefined) online.value = false
    }
    finally {
      syncing.value = false
      await refreshLists()
    }
  }

  /** Sends the outbox (one run at a time; a call during a run waits for it). */
  function sync(): Promise<void> {
    if (import.meta.server) return Promise.resolve()
    syncRun ??= runSync().finally(() => { syncRun = null })
    return syncRun
  }

  async function dismiss(idempotencyKey: string) {
    await dismissAttention(idempotencyKey)
    await refreshLists()
  }

  /** Listens for the connection coming back and syncs on a timer (once per app). */
  function start() {
    if (started || import.meta.server) return
    started = true
    online.value = navigator.onLine
    window.addEventListener('online', () => {
      online.value = true
      void sync()
      if (!packIsToday.value) void fetchPack()
    })
    window.addEventListener('offline', () => { online.value = false })
    setInterval(() => {
      if (navigator.onLine) online.value = true
      if (online.value) void sync()
    }, SYNC_INTERVAL_MS)
  }

  return {
    competitionId, pack, served, packStoredAt, packError, packLoading, waiting, attention, scans, lastSyncedAt, lastSyncProblem, syncing, online,
    today, packIsToday, entry, open, serve, fetchPack, submit, sync, dismiss, refreshLists,
  }
})
