/* eslint-disable @typescript-eslint/no-explicit-any -- pushed events are what the tests assert */
// Helpers of the board tests: a socket.io client signed in with an API client's cookie, waiting
// for pushed events, and opening today on a competition's board.
import { io, type Socket } from 'socket.io-client'
import type { ApiClient } from './api'
import type { GridWorld } from './grid'

export interface BoardSocket {
  socket: Socket
  /** Every event received, in order, as [name, payload]. */
  received: [string, any][]
  /** Resolves with the first received (or future) event of that name the predicate accepts. */
  next: (name: string, accept?: (payload: any) => boolean, timeoutMs?: number) => Promise<any>
  close: () => void
}

/** Connects with the client's session cookie; resolves once connected, or rejects with the refusal. */
export async function boardSocket(baseUrl: string, client: ApiClient | null, opts: { transports?: ('websocket' | 'polling')[], reconnection?: boolean } = {}): Promise<BoardSocket> {
  const socket = io(baseUrl, {
    path: '/socket.io/',
    transports: opts.transports ?? ['websocket'],
    extraHeaders: client?.cookie ? { 'cookie': client.cookie, 'x-forwarded-for': client.address } : {},
    reconnection: opts.reconnection ?? false,
    reconnectionDelay: 200,
    reconnectionDelayMax: 1000,
    timeout: 5000,
  })
  const received: [string, any][] = []
  const waiters: { name: string, accept: (p: any) => boolean, resolve: (p: any) => void }[] = []
  socket.onAny((name: string, payload: any) => {
    received.push([name, payload])
    for (const w of [...waiters]) {
      if (w.name === name && w.accept(payload)) {
        waiters.splice(waiters.indexOf(w), 1)
        w.resolve(payload)
      }
    }
  })
  await new Promise<void>((resolve, reject) => {
    const refused = (err: Error) => {
      socket.close()
      reject(err)
    }
    socket.once('connect_error', refused)
    socket.once('connect', () => {
      // Later connection errors belong to reconnecting, which must go on.
      socket.off('connect_error', refused)
      resolve()
    })
  })
  return {
    socket,
    received,
    next: (name, accept = () => true, timeoutMs = 5000) => {
      const seen = received.find(([n, p]) => n === name && accept(p))
      if (seen) return Promise.resolve(seen[1])
      return new Promise((resolve, reject) => {
        const waiter = { name, accept, resolve: (p: any) => { clearTimeout(timer); resolve(p) } }
        const timer = setTimeout(() => {
          waiters.splice(waiters.indexOf(waiter), 1)
          reject(new Error(`no ${name} event within ${timeoutMs} ms`))
        }, timeoutMs)
        waiters.push(waiter)
      })
    },
    close: () => socket.close(),
  }
}

/** Joins a competition's board; returns the ack. */
export function joinBoard(s: BoardSocket, competitionId: unknown): Promise<any> {
  return s.socket.timeout(5000).emitWithAck('board:join', { competitionId })
}

/** The director opens today (as a practice day unless it is scheduled). */
export async function openToday(w: GridWorld): Promise<any> {
  const res = await w.director.client.post(`${w.base}/days`, { kind: 'practice' })
  if (res.status !== 201 && res.status !== 200) throw new Error(`day not opened: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body.day
}

/**
 * The events of one name this socket has received once everything the server pushed to it
 * before now has arrived: a round trip on the same connection (a join the server refuses at
 * once, changing nothing) is answered after every event it wrote to the socket before, so what
 * is not here by then was never sent to it.
 */
export async function eventsSoFar(s: BoardSocket, name: string): Promise<any[]> {
  await s.socket.timeout(5000).emitWithAck('board:join', { competitionId: 'fence' })
  return s.received.filter(([n]) => n === name).map(([, p]) => p)
}
