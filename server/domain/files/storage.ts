// The uploaded files themselves, kept in Nitro's storage layer under the `uploads` mount:
// a folder on disk by default (.data/uploads, git-ignored), an S3-compatible bucket when
// configured (server/plugins/uploads-storage.ts). Rows in PostgreSQL hold the metadata and
// point here by key, with the id of the key the file is sealed under (file-crypt.ts). Keys
// are fresh uuids under the entry, so two uploads never share a file and removing one (after
// a failed transaction) cannot touch another's.
// An upload arrives in a temporary file (server/utils/uploads.ts) and is sealed into place
// only once it is whole and valid (file-store.ts).
import { randomUUID } from 'node:crypto'
import { MESSAGES } from '#shared/constants/messages'
import { httpError } from '#server/utils/errors'
import { fileKeyring, StoredFileError, type FileKeyring } from './file-crypt'
import { readSealedFile, removeStoredFile, writeSealedFile, type FileArea, type UploadsStore } from './file-store'

export type { FileArea } from './file-store'

/** An upload received on local disk (server/utils/uploads.ts), hashed as it arrived. */
export interface ReceivedFile {
  path: string
  size: number
  sha256: string
}

export function newStorageKey(area: FileArea, entryId: string): string {
  return `${area}:${entryId}:${randomUUID()}`
}

/** The uploads mount, and its folder when it is one on this machine (the fs driver). */
function uploads(): UploadsStore {
  const storage = useStorage('uploads')
  const { driver } = useStorage().getMount('uploads:')
  const base = (driver.options as { base?: unknown } | undefined)?.base
  const local = (driver.name === 'fs' || driver.name === 'fs-lite') && typeof base === 'string'
  return { storage, folder: local ? base : null }
}

let keyring: FileKeyring | undefined

/**
 * NUXT_FILES_KEY and NUXT_FILES_OLD_KEYS, read once. A malformed one stops the server at start
 * (server/plugins/uploads-storage.ts); a missing one only in production (00.production-start.ts).
 */
export function serverFileKeyring(): FileKeyring {
  const config = useRuntimeConfig()
  keyring ??= fileKeyring({
    key: String(config.filesKey || process.env.NUXT_FILES_KEY || ''),
    oldKeys: String(config.filesOldKeys || process.env.NUXT_FILES_OLD_KEYS || ''),
  })
  return keyring
}

/** A stored file that cannot be opened or sealed is the server's fault: logged, told plainly. */
function unreadable(error: unknown, key: string): never {
  if (!(error instanceof StoredFileError)) throw error
  console.error(`[gridmark] stored file ${key}: ${error.message}`)
  if (error.reason === 'damaged') throw httpError(500, MESSAGES.storedFileDamaged)
  const noKey = error.reason === 'no-key' || !serverFileKeyring().current
  throw httpError(503, noKey ? MESSAGES.filesKeyMissing : MESSAGES.storedFileKeyUnknown)
}

/**
 * Seals a file received on disk into storage under `key`; returns the id of the key it is
 * sealed under. On local disk it streams (mode 0600, fsynced with its folder), so the file never
 * passes through memory; a bucket is sent the file, at most the upload's limit.
 */
export async function placeFile(key: string, path: string): Promise<string> {
  try {
    return await writeSealedFile(uploads(), serverFileKeyring(), key, path)
  }
  catch (error) {
    return unreadable(error, key)
  }
}

/** The file's content, decrypted; null when it is not there. A file that cannot be opened answers 500/503. */
export async function readFile(key: string): Promise<Buffer | null> {
  try {
    return await readSealedFile(uploads(), serverFileKeyring(), key)
  }
  catch (error) {
    return unreadable(error, key)
  }
}

export async function removeFile(key: string): Promise<void> {
  await removeStoredFile(uploads(), key)
}

/**
 * Seals the received file into place first (durably), then runs the rows' transaction with the
 * id of the key it is sealed under (for the row's file_key_id); if the transaction fails the
 * file is removed again, so a failed upload leaves neither rows nor a stray file behind.
 */
export async function storeThenCommit<T>(key: string, path: string, commit: (fileKeyId: string) => Promise<T>): Promise<T> {
  const fileKeyId = await placeFile(key, path)
  try {
    return await commit(fileKeyId)
  }
  catch (error) {
    await removeFile(key).catch((cleanupError) => {
      console.error('[gridmark] could not remove the file of a failed upload', key, cleanupError)
    })
    throw error
  }
}
