// Sign-in sessions. The cookie (sealed by nuxt-auth-utils) names a user_sessions row; each
// request checks the row is still open, so sign-out ends a session everywhere at once, and
// sessions survive a server restart because both the row and the cookie's key persist.
// The route kit's requireUser and requireRole (server/utils/authz.ts) read sessions here.
// (getUserSession, replaceUserSession and clearUserSession are nuxt-auth-utils', provided by
// the framework.)
import { getCookie, getRequestHeader, type H3Event } from 'h3'
import type { Knex } from 'knex'
import type { User } from '#auth-utils'
import type { CompetitionRow, UserRow, UserSessionRow } from '#shared/types/rows'
import type { Role } from '#shared/constants/roles'
import { MESSAGES } from '#shared/constants/messages'
import { prepared, useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { clientAddress } from '#server/utils/client-address'
import { disconnectSessionSockets } from '#domain/realtime/realtime'
import { competitionColumns, findCompetition, prefixedCompetition } from '#domain/competitions/competitions'
import { rolesInCompetition } from './memberships'
import { toPublicUser } from './users'

// Touch last_seen_at at most this often, to keep reads cheap.
const TOUCH_AFTER_MS = 5 * 60 * 1000

export async function startSession(event: H3Event, user: UserRow): Promise<void> {
  const [row] = await useDb()<UserSessionRow>('user_sessions')
    .insert({
      user_id: user.id,
      user_agent: getRequestHeader(event, 'user-agent')?.slice(0, 300) ?? null,
      ip_address: clientAddress(event),
    })
    .returning('id')
  await replaceUserSession(event, { user: toPublicUser(user), sessionId: row!.id })
}

export async function endSession(event: H3Event): Promise<void> {
  const session = await getUserSession(event)
  if (session.sessionId) {
    await revokeSession(session.sessionId)
    // Live screens opened with this session close too, on every instance.
    disconnectSessionSockets(session.sessionId)
  }
  await clearUserSession(event)
}

export async function revokeSession(sessionId: string): Promise<void> {
  await useDb()('user_sessions').where({ id: sessionId }).whereNull('revoked_at').update({ revoked_at: useDb().fn.now() })
}

type SessionUserRow = UserRow & { revoked_at: Date | null, last_seen_at: Date, session_id: string }

/** A session's row joined with its user (aliases s and u), and the columns `acceptSession` reads. */
function sessionUserQuery(db: Knex, sessionId: string) {
  return db('user_sessions as s').join('users as u', 'u.id', 's.user_id').where('s.id', sessionId)
}
const SESSION_USER_COLUMNS = ['u.*', 's.revoked_at', 's.last_seen_at', 's.id as session_id'] as const

/** The session's user, or null when its row is gone, revoked (signed out) or someone else's. */
async function acceptSession(db: Knex, session: { user?: { id: string } }, row: SessionUserRow | undefined): Promise<User | null> {
  if (!row || row.revoked_at || row.id !== session.user?.id) return null
  if (Date.now() - new Date(row.last_seen_at).getTime() > TOUCH_AFTER_MS) {
    await db('user_sessions').where({ id: row.session_id }).update({ last_seen_at: db.fn.now() })
  }
  return toPublicUser(row)
}

/**
 * The user of a sealed session, fresh from the database: null when the session names none, or
 * its row was revoked (signed out) or belongs to someone else. The socket handshake reads
 * sessions through this too.
 */
export async function userOfSession(session: { user?: { id: string }, sessionId?: string }): Promise<User | null> {
  if (!session.user || !session.sessionId) return null
  const db = useDb()
  const row = await sessionUserQuery(db, session.sessionId).first<SessionUserRow>(...SESSION_USER_COLUMNS)
  return acceptSession(db, session, row)
}

// Unsealing a session cookie derives two keys and checks a MAC (iron, through WebCrypto: a few
// trips to the thread pool, some 2 ms of every request). The session of a cookie seen lately is
// kept unsealed: the sealed text is the key, so only a cookie once verified is trusted; an entry
// lasts ten minutes at most, and never past the seal's expiry or the session's age limit; and
// every request still checks the session's row, so a sign-out ends it everywhere at once.
interface UnsealedSession { id: string, createdAt: number, data: Record<string, unknown> }
const unsealed = new Map<string, { session: UnsealedSession, until: number }>()
const UNSEALED_KEEP_MS = 10 * 60 * 1000
const UNSEALED_MAX = 5000

// The process' runtime config: asked with an event, Nitro copies the whole config and applies
// the environment to it again for that request (some 2 ms of every request on a busy server).
function sessionConfig(): { name: string, maxAge?: number } {
  return useRuntimeConfig().session as { name: string, maxAge?: number }
}

/** The sealed session the request carries in its cookie (not in h3's session header, which is not kept). */
function sealedSessionOf(event: H3Event, name: string): string | undefined {
  if (getRequestHeader(event, `x-${name.toLowerCase()}-session`) !== undefined) return undefined
  return getCookie(event, name) || undefined
}

/** Hands h3 the session of a cookie unsealed lately, so getUserSession need not unseal it again. */
function reuseUnsealed(event: H3Event, name: string, sealed: string): boolean {
  const hit = unsealed.get(sealed)
  if (!hit) return false
  if (hit.until <= Date.now()) {
    unsealed.delete(sealed)
    return false
  }
  const sessions = (event.context.sessions ??= Object.create(null)) as Record<string, UnsealedSession>
  if (sessions[name]) return false
  sessions[name] = { id: hit.session.id, createdAt: hit.session.createdAt, data: structuredClone(hit.session.data) }
  return true
}

function keepUnsealed(event: H3Event, config: { name: string, maxAge?: number }, sealed: string): void {
  const session = (event.context.sessions as Record<string, UnsealedSession> | undefined)?.[config.name]
  if (!session?.id) return
  // An iron seal reads Fe26.2*id*salt*iv*data*expiry*hmac-salt*hmac (expiry in ms, may be empty).
  const sealExpiry = Number(sealed.split('*')[5]) || Number.POSITIVE_INFINITY
  const ageLimit = config.maxAge ? session.createdAt + config.maxAge * 1000 : Number.POSITIVE_INFINITY
  const until = Math.min(Date.now() + UNSEALED_KEEP_MS, sealExpiry, ageLimit)
  if (unsealed.size >= UNSEALED_MAX) unsealed.delete(unsealed.keys().next().value!)
  unsealed.set(sealed, { session: { id: session.id, createdAt: session.createdAt, data: structuredClone(session.data) }, until })
}

/** The request's unsealed session; 401 when it names no session. */
async function requireSession(event: H3Event): Promise<{ user: { id: string }, sessionId: string }> {
  const config = sessionConfig()
  const sealed = sealedSessionOf(event, config.name)
  const reused = sealed ? reuseUnsealed(event, config.name, sealed) : false
  const session = await getUserSession(event)
  if (!session.user || !session.sessionId) throw httpError(401, MESSAGES.notSignedIn)
  if (sealed && !reused) keepUnsealed(event, config, sealed)
  return session as { user: { id: string }, sessionId: string }
}

async function sessionEnded(event: H3Event): Promise<never> {
  await clearUserSession(event)
  throw httpError(401, MESSAGES.sessionEnded)
}

/** The signed-in user, fresh from the database; 401 when there is none or it was revoked. */
export async function sessionUser(event: H3Event): Promise<User> {
  const cached = event.context.gridmarkUser as User | undefined
  if (cached) return cached
  const session = await requireSession(event)
  const user = await userOfSession(session) ?? await sessionEnded(event)
  event.context.gridmarkUser = user
  return user
}

/**
 * `sessionUser`, with a competition and the roles the user holds in it read in the same
 * statement: most routes ask all three, and every round trip to the database is felt on a
 * busy grid. The competition is undefined when there is none of that id.
 */
export async function sessionUserIn(event: H3Event, competitionId: string): Promise<{ user: User, competition: CompetitionRow | undefined, rolesHeld: Role[] }> {
  const cached = event.context.gridmarkUser as User | undefined
  if (cached) {
    const [competition, rolesHeld] = await Promise.all([findCompetition(competitionId), rolesInCompetition(cached.id, competitionId)])
    return { user: cached, competition, rolesHeld }
  }
  const db = useDb()
  const session = await requireSession(event)
  // Asked by nearly every request of the grid and the board: prepared once per connection.
  const row = await prepared(sessionUserQuery(db, session.sessionId)
    .leftJoin('competitions as c', 'c.id', db.raw('?', [competitionId]))
    .first<SessionUserRow & { gm_roles: Role[] }>(
      ...SESSION_USER_COLUMNS,
      ...competitionColumns('gm_c_'),
      db.raw('array(select m.role::text from memberships m where m.user_id = s.user_id and m.competition_id = ?) as gm_roles', [competitionId]),
    ))
  const user = await acceptSession(db, session, row) ?? await sessionEnded(event)
  event.context.gridmarkUser = user
  return { user, competition: prefixedCompetition(row!, 'gm_c_'), rolesHeld: row!.gm_roles }
}
