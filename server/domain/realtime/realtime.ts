// The socket.io server of this instance (created once by server/plugins/socket-io.ts) and the
// rooms the board pushes to. Several instances share their events through PostgreSQL (the
// adapter), so an emit here reaches screens connected to any instance.
//   board:<competitionId>               staff of the competition: every tile, every day change
//   entrant:<competitionId>:<userId>    an entrant: their own entries' readiness only
//   session:<sessionId>                 every socket of one sign-in, closed at sign-out
//   user:<userId>                       every socket of one person, moved out of the rooms
//                                       of a competition when their role there is removed
import type { Server } from 'socket.io'
import { markTiming } from '#server/utils/server-timing'
import type { BoardChanges } from './changes'

let io: Server | null = null

export function setRealtime(server: Server | null): void {
  io = server
}

export const boardRoom = (competitionId: string) => `board:${competitionId}`
export const entrantRoom = (competitionId: string, userId: string) => `entrant:${competitionId}:${userId}`
export const sessionRoom = (sessionId: string) => `session:${sessionId}`
export const userRoom = (userId: string) => `user:${userId}`

export interface Delivery {
  room: string
  name: string
  payload: object
}

/** The name other instances are told what to push under (server to server, never to screens). */
export const RELAY_EVENT = 'gridmark:deliver'

/** Pushes to this instance's own screens. */
export function deliverLocally(deliveries: readonly Delivery[]): void {
  if (!io) return
  for (const d of deliveries) io.local.to(d.room).emit(d.name, d.payload)
}

/**
 * Pushes what a committed transaction changed: board changes in sequence order, then entrants'
 * news. This instance's screens get them at once; the other instances are told through the
 * adapter and push to theirs (an ordinary broadcast would first wait for PostgreSQL to take
 * the notification before reaching even the local screens).
 */
export function publishBoardChanges(changes: BoardChanges): void {
  if (!io) return
  const deliveries: Delivery[] = [
    ...changes.days.map(e => ({ seq: e.seq, room: boardRoom(e.competitionId), name: 'board:day', payload: e as object })),
    ...changes.tiles.map(e => ({ seq: e.seq, room: boardRoom(e.competitionId), name: 'board:tile', payload: e as object })),
  ].sort((a, b) => a.seq - b.seq).map(({ room, name, payload }) => ({ room, name, payload }))
  for (const n of changes.entrants) deliveries.push({ room: entrantRoom(n.event.competitionId, n.userId), name: 'entry:readiness', payload: n.event })
  markTiming('emit')
  deliverLocally(deliveries)
  markTiming('push')
  io.serverSideEmit(RELAY_EVENT, deliveries)
}

/** Closes the live connections of one sign-in (on every instance). */
export function disconnectSessionSockets(sessionId: string): void {
  if (!io) return
  // This instance's sockets at once: the adapter acts locally only after telling the others.
  io.local.in(sessionRoom(sessionId)).disconnectSockets(true)
  io.in(sessionRoom(sessionId)).disconnectSockets(true)
}

/**
 * Takes one person's sockets out of a competition's rooms their roles no longer allow, at once
 * and on every instance (the adapter passes the request on): the whole board when they hold no
 * staff role there any more, their own entries' news when they are no longer an entrant.
 */
export function leaveCompetitionRooms(userId: string, competitionId: string, still: { staff: boolean, entrant: boolean }): void {
  if (!io) return
  const rooms = [
    ...(still.staff ? [] : [boardRoom(competitionId)]),
    ...(still.entrant ? [] : [entrantRoom(competitionId, userId)]),
  ]
  if (!rooms.length) return
  // This instance's sockets leave at once, before the next push; the adapter would move them
  // only after its message to the other instances has gone through PostgreSQL.
  io.local.in(userRoom(userId)).socketsLeave(rooms)
  io.in(userRoom(userId)).socketsLeave(rooms)
}
