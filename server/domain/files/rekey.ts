// Moving every stored file to the current key (`npm run files:rekey`, after NUXT_FILES_KEY has
// changed and the old key went to NUXT_FILES_OLD_KEYS), and counting what is left. One file at
// a time, with its row locked so nothing removes it meanwhile: the file is sealed again beside
// itself and renamed over (file-store.ts), then the row takes the new key id. Stopped at any
// point, every file stays readable (its header names its key, old or new) and a new run picks
// up what is left: the rows whose key id is not the current one, plain files (null) included.
// Free of Nitro's globals: the script and the tests pass the database and the storage.
import type { Knex } from 'knex'
import type { FileKeyring } from './file-crypt'
import { resealFile, storedKeyId, type UploadsStore } from './file-store'

/** The tables whose rows point at stored files. */
export const FILE_TABLES = ['documents', 'igc_files'] as const

export interface RekeyProgress {
  table: typeof FILE_TABLES[number]
  id: string
  storageKey: string
  /** The key id the file had (null: plain); undefined when the file is missing. */
  from: string | null | undefined
  /** This file's place in the run (1-based) and how many the run set out to move. */
  done: number
  total: number
}

export interface RekeyResult {
  moved: number
  /** Rows whose file is not in storage: nothing to move, still counted as left. */
  missing: string[]
  left: number
}

/** Rows with a stored file not under the current key; a file deleted on schedule has no key and is skipped. */
function underOlderKeys(db: Knex, table: string, currentId: string) {
  return db(table).whereNotNull('storage_key').where(q => q.whereNull('file_key_id').orWhereNot('file_key_id', currentId))
}

/** How many stored files are not under the current key (plain ones included). */
export async function filesLeftUnderOlderKeys(db: Knex, currentId: string): Promise<number> {
  let left = 0
  for (const table of FILE_TABLES) {
    const row = await underOlderKeys(db, table, currentId).count({ n: '*' }).first()
    left += Number(row?.n ?? 0)
  }
  return left
}

/**
 * Seals every file not under the current key again under it, and updates its row. Reports each
 * file through onProgress; returns how many moved, which are missing and how many are left.
 */
export async function rekeyFiles(db: Knex, store: UploadsStore, keyring: FileKeyring, onProgress?: (p: RekeyProgress) => void): Promise<RekeyResult> {
  const current = keyring.current
  if (!current) throw new Error('NUXT_FILES_KEY is not set: there is no key to move the files to.')
  const todo: { table: typeof FILE_TABLES[number], id: string }[] = []
  for (const table of FILE_TABLES) {
    const ids = await underOlderKeys(db, table, current.id).orderBy('id').pluck('id') as string[]
    todo.push(...ids.map(id => ({ table, id })))
  }
  let moved = 0
  const missing: string[] = []
  for (const [i, { table, id }] of todo.entries()) {
    await db.transaction(async (trx) => {
      // Locked while the file is rewritten: a deletion waits, and a second run skips it after.
      const row = await trx(table).where({ id }).forUpdate().first('storage_key', 'file_key_id') as { storage_key: string, file_key_id: string | null } | undefined
      if (!row || row.file_key_id === current.id) return
      const found = await storedKeyId(store, row.storage_key)
      // Sealed under the current key already: an earlier run stopped before the row's update.
      const from = found === current.id ? found : (await resealFile(store, keyring, row.storage_key))?.from
      if (found === undefined || from === undefined) {
        missing.push(row.storage_key)
        onProgress?.({ table, id, storageKey: row.storage_key, from: undefined, done: i + 1, total: todo.length })
        return
      }
      await trx(table).where({ id }).update({ file_key_id: current.id })
      moved++
      onProgress?.({ table, id, storageKey: row.storage_key, from, done: i + 1, total: todo.length })
    })
  }
  return { moved, missing, left: await filesLeftUnderOlderKeys(db, current.id) }
}
