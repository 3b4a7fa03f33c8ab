import { io, type Socket } from 'socket.io-client'
import type { BoardDayEvent, BoardJoinAck, BoardTileEvent, EntryReadinessEvent } from '#shared/types/api-board'

// The board's one live connection: socket.io to the same origin, websocket only (no sticky
// sessions needed behind a load balancer). The store hands in what to do on each event and
// gets back only a way to close it, so nothing else can emit on the socket.

export interface BoardSocketHandlers {
  /** Connected and asked to join: the server's answer (or a timeout, as a refusal). */
  joined: (ack: BoardJoinAck) => void
  /** The connection dropped; socket.io is already trying again (except after `close`). */
  disconnected: (reason: string) => void
  /** A connection attempt failed; `refused` when the server turned the handshake down (its message says why). */
  failed: (message: string, refused: boolean) => void
  tile: (event: BoardTileEvent) => void
  day: (event: BoardDayEvent) => void
  /** An entrant's own entry changed on the board (entrants get these instead of tiles). */
  readiness?: (event: EntryReadinessEvent) => void
}

export interface BoardSocketHandle {
  close: () => void
}

export type BoardSocketConnector = (competitionId: string, handlers: BoardSocketHandlers) => BoardSocketHandle

/** How long a join may take before the screen says it is not live. */
const JOIN_TIMEOUT_MS = 8_000
/** After the handshake was refused socket.io does not retry by itself; we do, this often. */
const REFUSED_RETRY_MS = 5_000

export const connectBoardSocket: BoardSocketConnector = (competitionId, handlers) => {
  if (import.meta.server) return { close() {} }
  const socket: Socket = io({
    path: '/socket.io/',
    transports: ['websocket'],
    withCredentials: true,
    reconnection: true,
    reconnectionDelay: 1_000,
    // A wall screen left alone all day must come back within seconds once the server does.
    reconnectionDelayMax: 5_000,
  })
  let closed = false
  let retry: ReturnType<typeof setTimeout> | undefined

  // On every connect, the first and each one after a drop: the rooms were lost with the old
  // connection, so join again.
  socket.on('connect', () => {
    socket.timeout(JOIN_TIMEOUT_MS).emit('board:join', { competitionId }, (error: Error | null, ack: BoardJoinAck) => {
      if (closed) return
      handlers.joined(error ? { ok: false, message: 'The board did not answer in time.' } : ack)
    })
  })
  socket.on('disconnect', (reason) => {
    if (closed) return
    handlers.disconnected(reason)
    // The server closed this socket itself (a restart of its sockets, a sign-out elsewhere):
    // socket.io then waits for us to reconnect.
    if (reason === 'io server disconnect') scheduleRetry()
  })
  socket.on('connect_error', (error) => {
    if (closed) return
    // socket.io retries a failed transport by itself, but not a handshake the server refused.
    const refused = !socket.active
    handlers.failed(error.message, refused)
    if (refused) scheduleRetry()
  })
  socket.on('board:tile', (event: BoardTileEvent) => handlers.tile(event))
  socket.on('board:day', (event: BoardDayEvent) => handlers.day(event))
  socket.on('entry:readiness', (event: EntryReadinessEvent) => handlers.readiness?.(event))

  function scheduleRetry() {
    clearTimeout(retry)
    retry = setTimeout(() => {
      if (!closed && !socket.connected) socket.connect()
    }, REFUSED_RETRY_MS)
  }

  return {
    close() {
      closed = true
      clearTimeout(retry)
      socket.removeAllListeners()
      socket.disconnect()
    },
  }
}
