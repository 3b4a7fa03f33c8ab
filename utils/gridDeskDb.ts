import { openDB, type DBSchema, type IDBPDatabase } from 'idb'
import type { GridPack } from '#shared/types/api-grid'
import type { Readiness } from '#shared/engine'
import type { AttentionItem, QueuedCheck, QueueStorage } from './gridQueue'

// The phone's IndexedDB: the day's pack per competition and day, the outbox of grid checks, the
// checks the server refused (needs attention) and the scrutineer's own last scans. IndexedDB
// survives a reload and a browser restart; nothing here is the record — the server is.

/** One check made on this phone, for "Last scans today". */
export interface LocalScan {
  idempotencyKey: string
  competitionId: string
  day: string
  entryId: string
  compId: string
  gliderType: string
  readiness: Readiness
  outcome: 'pass' | 'fail'
  checkedAt: string
}

export interface StoredPack {
  key: string
  competitionId: string
  day: string
  storedAt: string
  pack: GridPack
}

interface GridDeskSchema extends DBSchema {
  packs: { key: string, value: StoredPack, indexes: { byCompetition: string } }
  queue: { key: string, value: QueuedCheck }
  attention: { key: string, value: AttentionItem }
  scans: { key: string, value: LocalScan, indexes: { byCompetitionDay: [string, string] } }
}

const DB_NAME = 'gridmark-grid-desk'
let opening: Promise<IDBPDatabase<GridDeskSchema>> | null = null

export function gridDeskDb(): Promise<IDBPDatabase<GridDeskSchema>> {
  opening ??= openDB<GridDeskSchema>(DB_NAME, 1, {
    upgrade(db) {
      db.createObjectStore('packs', { keyPath: 'key' }).createIndex('byCompetition', 'competitionId')
      db.createObjectStore('queue', { keyPath: 'idempotencyKey' })
      db.createObjectStore('attention', { keyPath: 'idempotencyKey' })
      db.createObjectStore('scans', { keyPath: 'idempotencyKey' }).createIndex('byCompetitionDay', ['competitionId', 'day'])
    },
    // Another tab upgrading the database: let go so it can.
    blocking() {
      void opening?.then(db => db.close())
      opening = null
    },
  })
  return opening
}

export async function savePack(pack: GridPack): Promise<void> {
  const db = await gridDeskDb()
  await db.put('packs', { key: `${pack.competitionId}:${pack.day}`, competitionId: pack.competitionId, day: pack.day, storedAt: new Date().toISOString(), pack })
}

/** The pack of that day, else the newest one kept for the competition. */
export async function loadPack(competitionId: string, day?: string): Promise<StoredPack | undefined> {
  const db = await gridDeskDb()
  if (day) {
    const exact = await db.get('packs', `${competitionId}:${day}`)
    if (exact) return exact
  }
  const all = await db.getAllFromIndex('packs', 'byCompetition', competitionId)
  return all.sort((a, b) => b.day.localeCompare(a.day))[0]
}

/** Writes the check to the outbox; resolves once it is durable. */
export async function enqueueCheck(item: QueuedCheck): Promise<void> {
  const db = await gridDeskDb()
  await db.put('queue', item)
}

export async function queuedChecks(): Promise<QueuedCheck[]> {
  return (await gridDeskDb()).getAll('queue')
}

export async function attentionItems(): Promise<AttentionItem[]> {
  return (await gridDeskDb()).getAll('attention')
}

export async function dismissAttention(idempotencyKey: string): Promise<void> {
  await (await gridDeskDb()).delete('attention', idempotencyKey)
}

export async function saveScan(scan: LocalScan): Promise<void> {
  await (await gridDeskDb()).put('scans', scan)
}

export async function scansOf(competitionId: string, day: string): Promise<LocalScan[]> {
  const all = await (await gridDeskDb()).getAllFromIndex('scans', 'byCompetitionDay', [competitionId, day])
  return all.sort((a, b) => b.checkedAt.localeCompare(a.checkedAt))
}

/** The outbox as the pure queue logic (utils/gridQueue.ts) reads and writes it. */
export const idbQueueStorage: QueueStorage = {
  queued: queuedChecks,
  async update(item) {
    await (await gridDeskDb()).put('queue', item)
  },
  async remove(key) {
    await (await gridDeskDb()).delete('queue', key)
  },
  async moveToAttention(item) {
    const db = await gridDeskDb()
    const tx = db.transaction(['queue', 'attention'], 'readwrite')
    await Promise.all([tx.objectStore('attention').put(item), tx.objectStore('queue').delete(item.idempotencyKey), tx.done])
  },
}

/** Every pack kept on this phone, newest day first (a /t/ link names no competition). */
export async function allPacks(): Promise<StoredPack[]> {
  const all = await (await gridDeskDb()).getAll('packs')
  return all.sort((a, b) => b.day.localeCompare(a.day))
}
