import { openDB, type DBSchema, type IDBPDatabase } from 'idb'
import type { MeResponse } from '#shared/types/api'
import { loadPack } from './gridDeskDb'
import { forgetGridPages } from './gridPageCache'
import { mayUseKeptSession, offlinePageOf } from './pageAccess'

// The signed-in session as the server last confirmed it, kept on the phone so that the page
// guard can open the launch-grid pages with no signal (pageAccess.ts, mayUseKeptSession). It
// holds only what /api/me answered (name, address, roles), never the cookie or anything secret;
// it is forgotten on sign-out and as soon as the server says nobody is signed in.

export interface KeptSession {
  me: MeResponse
  /** When the server last confirmed it (the phone's clock). */
  seenAt: string
}

interface SessionSchema extends DBSchema {
  session: { key: string, value: KeptSession }
}

const KEY = 'me'
let opening: Promise<IDBPDatabase<SessionSchema>> | null = null

function sessionDb(): Promise<IDBPDatabase<SessionSchema>> | null {
  if (typeof indexedDB === 'undefined') return null
  opening ??= openDB<SessionSchema>('gridmark-session', 1, {
    upgrade(db) {
      db.createObjectStore('session')
    },
  })
  return opening
}

export async function keptSession(): Promise<KeptSession | undefined> {
  try {
    return await (await sessionDb())?.get('session', KEY)
  }
  catch {
    return undefined
  }
}

/** Keeps the session the server just confirmed; grid pages kept for another user go. */
export async function keepSession(me: MeResponse): Promise<void> {
  try {
    const db = await sessionDb()
    if (!db) return
    const before = await db.get('session', KEY)
    if (before && before.me.user.id !== me.user.id) await forgetGridPages()
    await db.put('session', { me, seenAt: new Date().toISOString() }, KEY)
  }
  catch {
    // Storage refused: the phone simply cannot open grid pages offline from a cold link.
  }
}

export async function forgetSession(): Promise<void> {
  try {
    await (await sessionDb())?.delete('session', KEY)
  }
  catch {
    // Nothing kept, or no storage.
  }
}

/**
 * The kept session the page guard may go on with when /api/me got no answer (`status` is what
 * it answered, if anything), or null: then the page says the server cannot be reached.
 */
export async function keptSessionFor(path: string, status: number | undefined): Promise<MeResponse | null> {
  const page = offlinePageOf(path)
  if (!page || status !== undefined) return null
  const kept = await keptSession()
  if (!kept) return null
  const packKept = page.kind === 'grid' && Boolean(await loadPack(page.competitionId).catch(() => undefined))
  return mayUseKeptSession({ page, status, keptSeenAt: kept.seenAt, packKept, now: new Date() }) ? kept.me : null
}
