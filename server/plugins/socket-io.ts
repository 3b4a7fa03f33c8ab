// The live board's socket.io server, attached to Nitro's own HTTP server (nuxt dev and the
// built server alike), as socket.io's guide for Nuxt shows; crossws ≥ 0.3 hands the upgrade
// over as `peer._internal.nodeReq` and `peer.websocket` (../shared/STACK.md).
//
// The handshake is authenticated with the session cookie (the same sealed session and row
// check as every API request); a socket then asks to join a competition's board and is let in
// only where its user holds a role: staff to the whole board, an entrant to their own entries.
// Instances share events through PostgreSQL (@socket.io/postgres-adapter, LISTEN/NOTIFY).
// A handshake from another site's page (its Origin) is refused, over polling and websocket
// alike: the cookie would otherwise let that page read the board (server/utils/same-origin.ts).
import { ServerResponse, type IncomingMessage } from 'node:http'
import { Server as Engine } from 'engine.io'
import { Server, type Socket } from 'socket.io'
import { createAdapter } from '@socket.io/postgres-adapter'
import pg from 'pg'
import { createEvent, defineEventHandler } from 'h3'
import type { User } from '#auth-utils'
import { boardJoinSchema } from '#shared/schemas/board'
import { STAFF_ROLES } from '#shared/constants/roles'
import { MESSAGES } from '#shared/constants/messages'
import { effectiveRoles } from '#shared/utils/access'
import type { BoardJoinAck } from '#shared/types/api-board'
import { rolesInCompetition } from '#domain/people/memberships'
import { userOfSession } from '#domain/people/sessions'
import { boardRoom, deliverLocally, type Delivery, entrantRoom, leaveCompetitionRooms, RELAY_EVENT, sessionRoom, setRealtime, userRoom } from '#domain/realtime/realtime'
import { fromAnotherSite } from '#server/utils/same-origin'

/** What instances tell each other: changes to push to their own screens. */
interface InterServerEvents {
  'gridmark:deliver': (deliveries: Delivery[]) => void
}

interface SocketData {
  user: User
  sessionId: string
}

/** The user of the session cookie a handshake carries, or null. */
async function handshakeUser(req: IncomingMessage): Promise<{ user: User, sessionId: string } | null> {
  if (!req.headers.cookie) return null
  // nuxt-auth-utils reads the session from an h3 event; the handshake has no response of its own.
  // Nitro reads its configuration from the event's context, which a hand-made event lacks (the
  // handshake may be a fresh server's first use of the session).
  const event = createEvent(req, new ServerResponse(req))
  event.context.nitro = { runtimeConfig: useRuntimeConfig() }
  const session = await getUserSession(event)
  const user = await userOfSession(session)
  return user && session.sessionId ? { user, sessionId: session.sessionId } : null
}

/** Whether a handshake comes from another site's page. */
function crossSiteHandshake(req: IncomingMessage): boolean {
  return fromAnotherSite({ headers: req.headers, encrypted: Boolean((req.socket as { encrypted?: boolean } | undefined)?.encrypted) })
}

/** Logs at most one line per message a minute: a database outage must not flood the log. */
function throttledLog(prefix: string) {
  const seen = new Map<string, number>()
  return (error: unknown) => {
    const message = (error as Error)?.message ?? String(error)
    const last = seen.get(message) ?? 0
    if (Date.now() - last < 60_000) return
    seen.set(message, Date.now())
    console.warn(`${prefix}: ${message}`)
  }
}

export default defineNitroPlugin((nitroApp) => {
  const engine = new Engine({
    pingInterval: 10_000,
    pingTimeout: 8_000,
    // Polling handshakes; a websocket handed over by crossws skips this, the io.use below does not.
    allowRequest: (req, answer) => crossSiteHandshake(req) ? answer(MESSAGES.socketOriginRefused, false) : answer(null, true),
  })
  const io = new Server<Record<string, never>, Record<string, never>, InterServerEvents, SocketData>({ serveClient: false })

  // Its own small pool: the adapter keeps one connection LISTENing for the other instances.
  const logAdapter = throttledLog('[gridmark] board events between instances')
  const pool = new pg.Pool({ connectionString: databaseUrl(), max: 3, connectionTimeoutMillis: 3000, application_name: 'gridmark-sockets' })
  // A dropped connection (PostgreSQL restarting) emits 'error' on its client; unhandled, that
  // would end the process. The adapter reconnects by itself on the client's 'end'.
  pool.on('error', logAdapter)
  pool.on('connect', (client) => {
    client.on('error', logAdapter)
    // The adapter's LISTEN connection is checked out for good and, when it drops, never given
    // back: the pool would count it against its three forever, and after three PostgreSQL
    // restarts no connection would be left to listen on (events from other instances lost).
    // Given back here, with the error that removes it, so the adapter's reconnection finds room.
    client.on('end', () => {
      if (client.listenerCount('notification') === 0) return
      const checkedOut = client as pg.PoolClient
      try { checkedOut.release(new Error('The LISTEN connection ended')) }
      catch { /* already given back (the adapter closing) */ }
    })
  })
  io.adapter(createAdapter(pool, { errorHandler: logAdapter, heartbeatInterval: 5_000, heartbeatTimeout: 15_000 }))
  io.bind(engine)

  io.use(async (socket, next) => {
    if (crossSiteHandshake(socket.request)) return next(new Error(MESSAGES.socketOriginRefused))
    try {
      const who = await handshakeUser(socket.request)
      if (!who) return next(new Error(MESSAGES.socketSignIn))
      socket.data.user = who.user
      socket.data.sessionId = who.sessionId
      await socket.join([sessionRoom(who.sessionId), userRoom(who.user.id)])
      next()
    }
    catch (error) {
      logAdapter(error)
      next(new Error(MESSAGES.databaseDown))
    }
  })

  // Another instance committed a change: push it to the screens connected here.
  io.on(RELAY_EVENT, deliveries => deliverLocally(deliveries))

  io.on('connection', (socket: Socket) => {
    const user = socket.data.user as User

    socket.on('board:join', async (raw: unknown, ack?: (answer: BoardJoinAck) => void) => {
      const reply = typeof ack === 'function' ? ack : () => {}
      const parsed = boardJoinSchema.safeParse(raw)
      if (!parsed.success) return reply({ ok: false, message: MESSAGES.boardJoinRefused })
      const { competitionId } = parsed.data
      try {
        const scope = async () => {
          const roles = effectiveRoles(await rolesInCompetition(user.id, competitionId), user.isAdmin)
          return { staff: roles.some(r => STAFF_ROLES.includes(r)), entrant: roles.includes('entrant') }
        }
        const { staff, entrant } = await scope()
        if (!staff && !entrant) {
          console.warn(`[gridmark] socket ${socket.id} of user ${user.id} asked to join the board of competition ${competitionId}, where the user holds no role: ignored`)
          return reply({ ok: false, message: MESSAGES.boardJoinRefused })
        }
        if (staff) await socket.join(boardRoom(competitionId))
        if (entrant) await socket.join(entrantRoom(competitionId, user.id))
        // A role removed between the look-up and the join: its removal may have moved this
        // socket's rooms before the socket was in them. Asked again, the roles are current.
        const now = await scope()
        if ((staff && !now.staff) || (entrant && !now.entrant)) {
          leaveCompetitionRooms(user.id, competitionId, now)
          if (!now.staff && !now.entrant) return reply({ ok: false, message: MESSAGES.boardJoinRefused })
        }
        reply({ ok: true, scope: now.staff ? 'staff' : 'own' })
      }
      catch (error) {
        logAdapter(error)
        reply({ ok: false, message: MESSAGES.databaseDown })
      }
    })

    socket.on('board:leave', async (raw: unknown) => {
      const parsed = boardJoinSchema.safeParse(raw)
      if (!parsed.success) return
      await socket.leave(boardRoom(parsed.data.competitionId))
      await socket.leave(entrantRoom(parsed.data.competitionId, user.id))
    })
  })

  nitroApp.router.use('/socket.io/', defineEventHandler({
    handler(event) {
      engine.handleRequest(event.node.req, event.node.res)
      event._handled = true
    },
    websocket: {
      open(peer) {
        // @ts-expect-error private method and property (crossws ≥ 0.3)
        engine.prepare(peer._internal.nodeReq)
        // @ts-expect-error private method and property (crossws ≥ 0.3)
        engine.onWebSocket(peer._internal.nodeReq, peer._internal.nodeReq.socket, peer.websocket)
      },
    },
  }))

  setRealtime(io as unknown as Server)
  nitroApp.hooks.hook('close', async () => {
    setRealtime(null)
    io.close()
    await pool.end().catch(() => {})
  })
})
