import type { Readiness } from '#shared/engine'
import type { BoardClass, BoardDay, BoardDayEvent, BoardJoinAck, BoardSeq, BoardSnapshot, BoardTile, BoardTileEvent } from '#shared/types/api-board'
import { hasGap, offer, rebase, sequenceState } from '#shared/utils/board-sequence'
import { countTiles, emptyCounts, type ReadinessCounts } from '#shared/utils/board-tile'
import { compareCompIds } from '#shared/utils/comp-id-order'
import { connectBoardSocket, type BoardSocketConnector, type BoardSocketHandle, type BoardSocketHandlers } from '~/utils/boardSocket'
import { createBoardChime, type BoardChime } from '~/utils/boardChime'

// The live readiness board of one competition, as the wall screen and the director's laptop
// show it. The server is the record: a snapshot (GET …/board) at a sequence number, then the
// socket's numbered changes applied in order (shared/utils/board-sequence.ts). Whatever might
// have been missed — a gap in the numbers that does not fill, a reconnect, a day opened or
// closed, a poll finding the server ahead — fetches the whole board again, and while that
// fetch runs, pushed changes wait and are applied on top of it. A screen that cannot be sure
// it is current says so (the connection state), never showing an old state as live.

export type BoardConnection = 'connecting' | 'live' | 'reconnecting' | 'offline' | 'refused'

export interface BoardFilters {
  classIds: string[]
  readiness: Readiness[]
}

export interface BoardTiming {
  /** How long a change ahead of a missing one waits for it before the board is fetched again. */
  gapWaitMs: number
  /** How often a live screen asks for the server's sequence number (a push lost between instances). */
  seqPollMs: number
  /** How long reconnecting may fail before the screen says it is offline. */
  offlineAfterMs: number
  /** How long a changed tile stays highlighted. */
  highlightMs: number
  /** How soon a failed fetch of the board is tried again. */
  snapshotRetryMs: number
}

export const BOARD_TIMING: Readonly<BoardTiming> = {
  gapWaitMs: 500,
  seqPollMs: 20_000,
  offlineAfterMs: 30_000,
  highlightMs: 4_000,
  snapshotRetryMs: 5_000,
}

export interface BoardGroup {
  classId: string
  className: string
  counts: ReadinessCounts
  /** The class's tiles that pass the filters, in competition-ID order. */
  tiles: BoardTile[]
}

/** Per device: whether this screen chimes when a glider becomes held. */
export const BOARD_CHIME_KEY = 'gridmark-board-chime'

type Timer = ReturnType<typeof setTimeout>

export const useBoardStore = defineStore('board', () => {
  // On the server, a plain $fetch would not carry the browser's cookie.
  const requestFetch = useRequestFetch()
  const competitionId = ref<string | null>(null)
  const competition = ref<BoardSnapshot['competition'] | null>(null)
  const day = ref<BoardDay | null>(null)
  const classes = ref<BoardClass[]>([])
  /** Tiles by entry id; replaced whole on every change (a shallow ref: tiles are read as plain objects). */
  const tiles = shallowRef<Record<string, BoardTile>>({})
  /** Entry ids in the board's order (class, then competition ID), as the snapshot gave them. */
  const order = ref<string[]>([])
  /** The sequence number the board shows. */
  const seq = ref(0)
  const loaded = ref(false)
  /** The board came with the page from the server's render, and `open` has not yet taken it. */
  const served = ref(false)
  const loading = ref(false)
  /** Why the board could not be fetched (the API's message), while that lasts. */
  const loadError = ref<string | null>(null)
  /** Why the live connection was refused (not signed in, not part of the board), while that lasts. */
  const liveError = ref<string | null>(null)
  /** The server refused this screen the board (401, 403, 404): its access ended, not its signal. */
  const refused = ref(false)

  // What the connection indicator is made of.
  // 'joining': joined, but the board fetched after the join has not arrived yet.
  const socketState = ref<'idle' | 'connecting' | 'joining' | 'joined' | 'down'>('idle')
  const snapshotOk = ref(true)
  const browserOnline = ref(true)
  const outageLong = ref(false)
  /** When the screen stopped being live (ISO time); null while live. */
  const offlineSince = ref<string | null>(null)

  const filters = ref<BoardFilters>({ classIds: [], readiness: [] })
  /** Entry ids changed a moment ago, highlighted for a few seconds. */
  const changed = ref<string[]>([])
  /** How many times a glider became held while this board was open (each rings the chime). */
  const heldAlerts = ref(0)
  const chimeEnabled = ref(false)
  /** The chime is on, but the browser allows sound only after a touch or key press. */
  const chimeBlocked = ref(false)

  const connection = computed<BoardConnection>(() => {
    if (!browserOnline.value) return 'offline'
    if (refused.value) return 'refused'
    if (socketState.value === 'joined' && snapshotOk.value) return 'live'
    if (outageLong.value) return 'offline'
    // 'idle': not yet opened (the server's render, the page not mounted yet).
    if (['idle', 'connecting', 'joining'].includes(socketState.value) && offlineSince.value === null) return 'connecting'
    return 'reconnecting'
  })

  const orderedTiles = computed(() => order.value.map(id => tiles.value[id]).filter((t): t is BoardTile => t !== undefined))
  const counts = computed(() => countTiles(orderedTiles.value))
  const filtering = computed(() => filters.value.classIds.length > 0 || filters.value.readiness.length > 0)
  const groups = computed<BoardGroup[]>(() => {
    const { classIds, readiness } = filters.value
    const byClass = counts.value.byClass
    return classes.value
      .filter(c => byClass[c.id] && (classIds.length === 0 || classIds.includes(c.id)))
      .map(c => ({
        classId: c.id,
        className: c.name,
        counts: byClass[c.id] ?? emptyCounts(),
        tiles: orderedTiles.value.filter(t => t.classId === c.id && (readiness.length === 0 || readiness.includes(t.readiness))),
      }))
      .filter(g => g.tiles.length > 0)
  })
  const shownCount = computed(() => groups.value.reduce((n, g) => n + g.tiles.length, 0))

  // Per open board (reset by `close`); plain variables, not state: none of it is shown.
  let timing: BoardTiming = { ...BOARD_TIMING }
  let generation = 0
  let socket: BoardSocketHandle | null = null
  let sequence = sequenceState<BoardTileEvent>(0)
  let fetching: Promise<void> | null = null
  let fetchSerial = 0
  let fetchingToken = 0
  let fetchAgain = false
  let joinSerial = 0
  let buffered: BoardTileEvent[] = []
  let gapTimer: Timer | undefined
  let pollTimer: ReturnType<typeof setInterval> | undefined
  let outageTimer: Timer | undefined
  let retryTimer: Timer | undefined
  const highlightTimers = new Map<string, Timer>()
  let chime: BoardChime | null = null
  let detachWindow: (() => void) | null = null

  // ---------------------------------------------------------------------------------------
  // Connection state

  /** The screen is not (or no longer) sure to be current: remember since when. */
  function markDown() {
    if (offlineSince.value !== null) return
    offlineSince.value = new Date().toISOString()
    clearTimeout(outageTimer)
    outageTimer = setTimeout(() => {
      outageLong.value = true
    }, timing.offlineAfterMs)
  }

  /** Back to live: the outage is over. */
  function settle() {
    if (connection.value !== 'live') return
    offlineSince.value = null
    outageLong.value = false
    clearTimeout(outageTimer)
    outageTimer = undefined
  }

  // ---------------------------------------------------------------------------------------
  // Tiles

  function markChanged(entryId: string) {
    if (!changed.value.includes(entryId)) changed.value = [...changed.value, entryId]
    clearTimeout(highlightTimers.get(entryId))
    highlightTimers.set(entryId, setTimeout(() => {
      highlightTimers.delete(entryId)
      changed.value = changed.value.filter(id => id !== entryId)
    }, timing.highlightMs))
  }

  function becameHeld() {
    heldAlerts.value++
    if (chimeEnabled.value && chime?.ready()) chime.play()
  }

  const classIndex = (classId: string) => {
    const i = classes.value.findIndex(c => c.id === classId)
    return i === -1 ? classes.value.length : i
  }
  // The server's order (class, then competition ID as people read it), so a glider that joins
  // the board stands where the next snapshot will put it.
  const boardOrder = (a: BoardTile, b: BoardTile) =>
    classIndex(a.classId) - classIndex(b.classId) || compareCompIds(a.compId, b.compId)

  /** Applies one change in sequence (a null tile: the entry left the board). */
  function applyTileEvent(event: BoardTileEvent) {
    // A change of another day than the one shown: the board moved on without telling us.
    if (!day.value || event.day !== day.value.day) {
      void refresh()
      return
    }
    const before = tiles.value[event.entryId]
    if (event.tile) {
      const tile = event.tile
      tiles.value = { ...tiles.value, [event.entryId]: tile }
      if (!order.value.includes(event.entryId)) {
        const at = order.value.findIndex((id) => {
          const other = tiles.value[id]
          return other !== undefined && boardOrder(tile, other) < 0
        })
        const next = [...order.value]
        next.splice(at === -1 ? next.length : at, 0, event.entryId)
        order.value = next
      }
      markChanged(event.entryId)
      if (tile.readiness === 'held' && before?.readiness !== 'held') becameHeld()
    }
    else if (before) {
      const { [event.entryId]: _gone, ...rest } = tiles.value
      tiles.value = rest
      order.value = order.value.filter(id => id !== event.entryId)
    }
  }

  /**
   * Replaces the whole board; on the same day, tiles that moved on are highlighted, and a tile
   * that did not (the same sequence number) keeps its object, so it is not drawn again: a board
   * fetched after a reconnect or a gap redraws only what changed.
   */
  function applySnapshot(snapshot: BoardSnapshot) {
    const sameDay = loaded.value && competition.value?.id === snapshot.competition.id && day.value?.day === snapshot.day?.day
    const before = tiles.value
    competition.value = snapshot.competition
    day.value = snapshot.day
    classes.value = snapshot.classes
    tiles.value = Object.fromEntries(snapshot.tiles.map((t) => {
      const old = sameDay ? before[t.entryId] : undefined
      return [t.entryId, old && old.seq === t.seq ? old : t]
    }))
    const nextOrder = snapshot.tiles.map(t => t.entryId)
    if (nextOrder.length !== order.value.length || nextOrder.some((id, i) => id !== order.value[i])) order.value = nextOrder
    loaded.value = true
    let held = 0
    if (sameDay) {
      for (const t of snapshot.tiles) {
        const old = before[t.entryId]
        if (old && old.seq === t.seq) continue
        markChanged(t.entryId)
        if (t.readiness === 'held' && old?.readiness !== 'held') held++
      }
    }
    if (held) becameHeld()
    // Changes that arrived ahead of a gap and follow this snapshot still apply.
    for (const e of rebase(sequence, snapshot.seq)) applyTileEvent(e)
    seq.value = sequence.seq
  }

  function clearGapTimer() {
    clearTimeout(gapTimer)
    gapTimer = undefined
  }

  /** A pushed tile change: applied in order, held back while the board is being fetched. */
  function receiveTile(event: BoardTileEvent) {
    if (event.competitionId !== competitionId.value) return
    if (fetching) {
      buffered.push(event)
      return
    }
    const result = offer(sequence, event)
    if (result.kind === 'stale') return
    if (result.kind === 'apply') {
      for (const e of result.events) applyTileEvent(e)
      seq.value = sequence.seq
      if (!hasGap(sequence)) clearGapTimer()
      return
    }
    // A change is missing: it may only be late; if not, fetch the board.
    gapTimer ??= setTimeout(() => {
      gapTimer = undefined
      if (hasGap(sequence)) void refresh()
    }, timing.gapWaitMs)
  }

  /** A day was opened or closed: the board to show has changed as a whole. */
  function receiveDay(event: BoardDayEvent) {
    if (event.competitionId !== competitionId.value) return
    if (!fetching && event.seq <= sequence.seq) return
    void refresh()
  }

  async function fetchOnce(gen: number, cid: string) {
    loading.value = true
    clearGapTimer()
    // Only a board read after the latest join makes the screen live: one read before it may
    // lack changes pushed while the socket was not in the room.
    const afterJoin = socketState.value === 'joining' ? joinSerial : -1
    try {
      const snapshot = await $fetch<BoardSnapshot>(`/api/competitions/${encodeURIComponent(cid)}/board`)
      if (gen !== generation) return
      applySnapshot(snapshot)
      snapshotOk.value = true
      if (socketState.value === 'joining' && afterJoin === joinSerial) socketState.value = 'joined'
      loadError.value = null
      refused.value = false
      clearTimeout(retryTimer)
      settle()
    }
    catch (error) {
      if (gen !== generation) return
      const status = apiStatus(error)
      loadError.value = status
        ? (apiErrorBody(error).message ?? `The board could not be loaded (${status}).`)
        : UI_MESSAGES.offline
      refused.value = status === 401 || status === 403 || status === 404
      snapshotOk.value = false
      markDown()
      clearTimeout(retryTimer)
      retryTimer = setTimeout(() => void refresh(), timing.snapshotRetryMs)
    }
    finally {
      if (gen === generation) loading.value = false
    }
  }

  /** Fetches the whole board (once at a time; a call meanwhile fetches once more after it). */
  function refresh(): Promise<void> {
    const cid = competitionId.value
    if (import.meta.server || !cid) return Promise.resolve()
    if (fetching) {
      fetchAgain = true
      return fetching
    }
    const gen = generation
    const token = ++fetchSerial
    fetchingToken = token
    const run = (async () => {
      try {
        do {
          fetchAgain = false
          await fetchOnce(gen, cid)
        } while (fetchAgain && gen === generation)
      }
      finally {
        if (fetchingToken === token) {
          fetching = null
          fetchingToken = 0
          const waiting = buffered.sort((a, b) => a.seq - b.seq)
          buffered = []
          if (gen === generation) for (const e of waiting) receiveTile(e)
        }
      }
    })()
    fetching = run
    return run
  }

  /** The board's last sequence number and open day on the server (a few bytes, not the board). */
  function fetchSeq(cid: string): Promise<BoardSeq> {
    return $fetch<BoardSeq>(`/api/competitions/${encodeURIComponent(cid)}/board/seq`)
  }

  /** Every so often while live: has the server moved on without telling this screen? */
  async function checkSeq() {
    const cid = competitionId.value
    if (!cid || connection.value !== 'live' || fetching || hasGap(sequence)) return
    const gen = generation
    try {
      const answer = await fetchSeq(cid)
      if (gen !== generation) return
      if (answer.seq > sequence.seq && !hasGap(sequence) && !fetching) await refresh()
    }
    catch (error) {
      // A refusal is news: this screen's access ended (its role in the competition removed, its
      // sign-in ended elsewhere) while its socket stayed connected, out of the board's room.
      // The board's read says so on the screen. No answer at all is not: the socket and the
      // next fetch tell whether the server is gone.
      const status = apiStatus(error)
      if (gen === generation && (status === 401 || status === 403 || status === 404)) void refresh()
    }
  }

  /**
   * After joining the board's room: changes made before the join were not pushed to this
   * screen. A board held whole (fetched, no gap) is current when the server's sequence number,
   * read after the join, is no further than its own — changes since the join come pushed — so
   * the screen goes live without fetching the whole board again (on a page load it was fetched
   * a moment before; a wall of screens reconnecting at once asks for a number each, not a
   * board). Otherwise, or when the number cannot be read, the board is fetched.
   */
  async function catchUpAfterJoin(gen: number) {
    const cid = competitionId.value
    const serial = joinSerial
    if (!cid || fetching || !loaded.value || !snapshotOk.value || hasGap(sequence)) return refresh()
    try {
      const answer = await fetchSeq(cid)
      if (gen !== generation || serial !== joinSerial || socketState.value !== 'joining') return
      if (!fetching && !hasGap(sequence) && answer.seq <= sequence.seq) {
        socketState.value = 'joined'
        settle()
        return
      }
    }
    catch {
      if (gen !== generation) return
    }
    if (serial === joinSerial) await refresh()
  }

  // ---------------------------------------------------------------------------------------
  // Opening and closing

  function socketHandlers(gen: number): BoardSocketHandlers {
    const current = () => gen === generation
    return {
      joined(ack: BoardJoinAck) {
        if (!current()) return
        if (!ack.ok) {
          liveError.value = ack.message
          socketState.value = 'down'
          markDown()
          return
        }
        liveError.value = null
        socketState.value = 'joining'
        joinSerial++
        void catchUpAfterJoin(gen)
      },
      disconnected() {
        if (!current()) return
        socketState.value = 'down'
        markDown()
      },
      failed(message: string, refused: boolean) {
        if (!current()) return
        socketState.value = 'down'
        liveError.value = refused ? message : null
        markDown()
      },
      tile: event => current() && receiveTile(event),
      day: event => current() && receiveDay(event),
    }
  }

  function readChimeSetting() {
    try {
      chimeEnabled.value = localStorage.getItem(BOARD_CHIME_KEY) === 'on'
    }
    catch {
      chimeEnabled.value = false
    }
    chimeBlocked.value = chimeEnabled.value && !chime?.ready()
  }

  /**
   * On the server: reads the board into the page's render, so it arrives drawn, not after the
   * page has started (the browser then lays out 40 tiles once, while the page is parsed). A
   * refusal is left to `open`, which says it on the screen.
   */
  async function serve(cid: string): Promise<void> {
    if (import.meta.client) return
    const snapshot = await requestFetch<BoardSnapshot>(`/api/competitions/${encodeURIComponent(cid)}/board`).catch(() => null)
    if (!snapshot) return
    competitionId.value = cid
    applySnapshot(snapshot)
    served.value = true
  }

  /**
   * Opens the board of a competition: fetches it and connects the live updates. Client only
   * (call from onMounted). `connect` is the socket factory (tests hand in their own).
   */
  async function open(cid: string, options: { connect?: BoardSocketConnector, timing?: Partial<BoardTiming> } = {}): Promise<void> {
    if (import.meta.server) return
    close()
    // The board the server's render read: the socket's join asks whether it is still current.
    const fresh = served.value && loaded.value && competitionId.value === cid
    served.value = false
    const gen = generation
    timing = { ...BOARD_TIMING, ...options.timing }
    if (competitionId.value !== cid) {
      competition.value = null
      day.value = null
      classes.value = []
      tiles.value = {}
      order.value = []
      seq.value = 0
      loaded.value = false
    }
    competitionId.value = cid
    sequence = sequenceState<BoardTileEvent>(seq.value)
    loadError.value = null
    liveError.value = null
    refused.value = false
    snapshotOk.value = true
    outageLong.value = false
    offlineSince.value = null
    browserOnline.value = navigator.onLine
    readChimeSetting()

    const onOnline = () => {
      browserOnline.value = true
      void refresh()
    }
    const onOffline = () => {
      browserOnline.value = false
      markDown()
    }
    window.addEventListener('online', onOnline)
    window.addEventListener('offline', onOffline)
    detachWindow = () => {
      window.removeEventListener('online', onOnline)
      window.removeEventListener('offline', onOffline)
    }
    if (!browserOnline.value) markDown()

    socketState.value = 'connecting'
    socket = (options.connect ?? connectBoardSocket)(cid, socketHandlers(gen))
    pollTimer = setInterval(() => void checkSeq(), timing.seqPollMs)
    if (!fresh) await refresh()
  }

  /** Disconnects and stops every timer (the page is left). The last board stays in memory. */
  function close() {
    generation++
    socket?.close()
    socket = null
    detachWindow?.()
    detachWindow = null
    clearGapTimer()
    clearInterval(pollTimer)
    clearTimeout(outageTimer)
    clearTimeout(retryTimer)
    pollTimer = outageTimer = retryTimer = undefined
    for (const t of highlightTimers.values()) clearTimeout(t)
    highlightTimers.clear()
    changed.value = []
    buffered = []
    fetching = null
    fetchingToken = 0
    fetchAgain = false
    loading.value = false
    socketState.value = 'idle'
    chime?.close()
    chime = null
  }

  // ---------------------------------------------------------------------------------------
  // Filters and the chime

  function setFilters(next: Partial<BoardFilters>) {
    filters.value = { ...filters.value, ...next }
  }

  /** Turns the chime on or off on this device; call from a click, so the browser allows sound. */
  async function setChime(on: boolean): Promise<void> {
    chimeEnabled.value = on
    try {
      localStorage.setItem(BOARD_CHIME_KEY, on ? 'on' : 'off')
    }
    catch { /* private mode: the setting lasts for this page only */ }
    if (!on) {
      chimeBlocked.value = false
      return
    }
    chime ??= createBoardChime()
    const ok = await chime.unlock()
    chimeBlocked.value = !ok
    // Play it once, so whoever set up the screen knows how it sounds and that it is loud enough.
    if (ok) chime.play()
  }

  /** After a touch or key press: lets a chime remembered as on make sound. */
  async function unlockChime(): Promise<void> {
    if (!chimeEnabled.value || chime?.ready()) return
    chime ??= createBoardChime()
    chimeBlocked.value = !(await chime.unlock())
  }

  return {
    competitionId, competition, day, classes, tiles, order, seq, loaded, served, loading, loadError, liveError,
    connection, offlineSince, filters, changed, heldAlerts, chimeEnabled, chimeBlocked,
    orderedTiles, counts, groups, shownCount, filtering,
    serve, open, close, refresh, setFilters, setChime, unlockChime,
  }
})
