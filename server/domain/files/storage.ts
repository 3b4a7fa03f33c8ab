// The uploaded files themselves, kept in Nitro's storage layer under the `uploads` mount:
// a folder on disk by default (.data/uploads, git-ignored), an S3-compatible bucket when
// configured (server/plugins/uploads-storage.ts). Rows in PostgreSQL hold the metadata and
// point here by key. Keys are fresh uuids under the entry, so two uploads never share a
// file and removing one (after a failed transaction) cannot touch another's.
// An upload arrives in a temporary file (server/utils/uploads.ts) and is moved into place
// only once it is whole and valid.
import { randomUUID } from 'node:crypto'
import { copyFile, mkdir, readFile as readLocalFile, rename, rm } from 'node:fs/promises'
import { dirname, join, resolve } from 'node:path'

export type FileArea = 'documents' | 'igc'

/** An upload received on local disk (server/utils/uploads.ts), hashed as it arrived. */
export interface ReceivedFile {
  path: string
  size: number
  sha256: string
}

function uploads() {
  return useStorage('uploads')
}

export function newStorageKey(area: FileArea, entryId: string): string {
  return `${area}:${entryId}:${randomUUID()}`
}

/** The folder of the uploads mount when it is one on this machine (the fs driver), else null. */
function localFolder(): string | null {
  const { driver } = useStorage().getMount('uploads:')
  const base = (driver.options as { base?: unknown } | undefined)?.base
  return (driver.name === 'fs' || driver.name === 'fs-lite') && typeof base === 'string' ? resolve(base) : null
}

/**
 * Moves a file received on disk into storage under `key`. On local disk it is a rename (a
 * copy when the temporary folder is on another file system), so the file never passes
 * through memory; a bucket is sent the file, at most the upload's limit.
 */
export async function placeFile(key: string, path: string): Promise<void> {
  const folder = localFolder()
  if (!folder) {
    await uploads().setItemRaw(key, await readLocalFile(path))
    return
  }
  // The same place the fs driver reads the key from (a ':' is a folder).
  const target = join(folder, ...key.split(':'))
  await mkdir(dirname(target), { recursive: true })
  try {
    await rename(path, target)
  }
  catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EXDEV') throw error
    await copyFile(path, target)
    await rm(path, { force: true })
  }
}

export async function readFile(key: string): Promise<Buffer | null> {
  const raw = await uploads().getItemRaw(key)
  if (raw === null || raw === undefined) return null
  if (Buffer.isBuffer(raw)) return raw
  if (raw instanceof Uint8Array) return Buffer.from(raw)
  if (raw instanceof ArrayBuffer) return Buffer.from(new Uint8Array(raw))
  if (typeof raw === 'string') return Buffer.from(raw)
  return Buffer.from(raw as ArrayLike<number>)
}

export async function removeFile(key: string): Promise<void> {
  await uploads().removeItem(key)
}

/**
 * Moves the received file into place first, then runs the rows' transaction; if the
 * transaction fails the file is removed again, so a failed upload leaves neither rows nor a
 * stray file behind.
 */
export async function storeThenCommit<T>(key: string, path: string, commit: () => Promise<T>): Promise<T> {
  await placeFile(key, path)
  try {
    return await commit()
  }
  catch (error) {
    await removeFile(key).catch((cleanupError) => {
      console.error('[gridmark] could not remove the file of a failed upload', key, cleanupError)
    })
    throw error
  }
}
