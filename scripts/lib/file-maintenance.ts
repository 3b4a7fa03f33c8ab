// What files:rekey and files:orphans share: the server's database, its uploads storage (the same
// settings: NUXT_UPLOADS_DIR, NUXT_UPLOADS_S3_*, else the demo's .data/uploads) and its files
// key (NUXT_FILES_KEY; for the demo's own database, the one npm start keeps in .data).
import { join } from 'node:path'
import knex, { type Knex } from 'knex'
import { createStorage } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'
import { createKnexConfig } from '../../knexfile'
import { FileKeyError, fileKeyring, FILES_KEY_VARIABLE, FILES_OLD_KEYS_VARIABLE, type FileKeyring } from '../../server/domain/files/file-crypt'
import { uploadsDriverFromEnv, type UploadsStore } from '../../server/domain/files/file-store'
import { filesLeftUnderOlderKeys, rekeyFiles } from '../../server/domain/files/rekey'
import { localDataDir, ScriptError, step } from './common'
import { prepareDemoDatabase } from './demo-db'
import { filesKey } from './secrets'

export interface FileMaintenance {
  db: Knex
  store: UploadsStore
  /** The files keys; null for a task that opens no file (options.keys false). */
  keyring: FileKeyring | null
}

function keyringFor(ownDatabase: string | undefined): FileKeyring {
  // Outside the demo the key must be the server's: a generated one would seal files it cannot open.
  if (ownDatabase && !process.env[FILES_KEY_VARIABLE]) {
    throw new ScriptError(`${FILES_KEY_VARIABLE} is not set: give this command the same ${FILES_KEY_VARIABLE} (and ${FILES_OLD_KEYS_VARIABLE}) as the server.`)
  }
  try {
    return fileKeyring({ key: ownDatabase ? process.env[FILES_KEY_VARIABLE] : filesKey(), oldKeys: process.env[FILES_OLD_KEYS_VARIABLE] })
  }
  catch (error) {
    if (error instanceof FileKeyError) throw new ScriptError(error.message)
    throw error
  }
}

function storeOf(chosen: ReturnType<typeof uploadsDriverFromEnv>): UploadsStore {
  const folder = join(localDataDir, 'uploads')
  return chosen
    ? { storage: createStorage({ driver: chosen.driver }), folder: chosen.folder }
    : { storage: createStorage({ driver: fsDriver({ base: folder }) }), folder }
}

/**
 * For npm start: seals under `key` the demo's files stored before encryption (or under another
 * key), so nothing readable stays on disk after an upgrade. Returns how many it sealed.
 */
export async function sealDemoFiles(url: string, key: string): Promise<number> {
  const store = storeOf(uploadsDriverFromEnv(process.env))
  const keyring = fileKeyring({ key, oldKeys: process.env[FILES_OLD_KEYS_VARIABLE] })
  const db = knex(createKnexConfig(url))
  try {
    if (await filesLeftUnderOlderKeys(db, keyring.current!.id) === 0) return 0
    return (await rekeyFiles(db, store, keyring)).moved
  }
  finally {
    await db.destroy()
    await store.storage.dispose()
  }
}

/** Opens the database and the storage for one task and always closes the pool. */
export async function withFileMaintenance(task: (m: FileMaintenance) => Promise<void>, options: { keys?: boolean } = {}): Promise<void> {
  const ownDatabase = process.env.NUXT_DATABASE_URL || process.env.DATABASE_URL
  const keyring = options.keys === false ? null : keyringFor(ownDatabase)
  const url = ownDatabase || await prepareDemoDatabase()
  let chosen
  try {
    chosen = uploadsDriverFromEnv(process.env)
  }
  catch (error) {
    throw new ScriptError((error as Error).message)
  }
  const folder = join(localDataDir, 'uploads')
  const store = storeOf(chosen)
  step(`Files in ${chosen?.where ?? `the folder ${folder}`}${keyring ? `; key ${keyring.current!.id} (${FILES_KEY_VARIABLE})` : ''}`)
  const db = knex(createKnexConfig(url))
  try {
    await task({ db, store, keyring })
  }
  finally {
    await db.destroy()
    await store.storage.dispose()
  }
}
