// The stored files themselves, sealed (file-crypt.ts), in the uploads storage: a folder on this
// machine or an S3-compatible bucket. Free of Nitro's globals, so the server (storage.ts), the
// maintenance scripts (files:rekey, files:orphans) and their tests share it.
//
// In a folder a file is written with mode 0600 (its folders 0700) and fsynced, then its folder,
// before the caller commits the row that points at it; it is sealed while it streams from the
// received temporary file, so an upload never passes through memory. A bucket is sent the sealed
// bytes in one request (at most the upload's limit). A file is replaced by writing a new copy
// beside it and renaming it over the old one: a reader sees one or the other, whole.
import { randomUUID } from 'node:crypto'
import { createReadStream, createWriteStream } from 'node:fs'
import { chmod, mkdir, open as openFile, readFile as readLocalFile, rename, rm } from 'node:fs/promises'
import { basename, dirname, join, resolve } from 'node:path'
import { pipeline } from 'node:stream/promises'
import type { Driver, Storage } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'
import s3Driver from 'unstorage/drivers/s3'
import { HEADER_BYTES, open, openingStream, readFileHeader, seal, sealingKey, sealingStream, type FileKeyring } from './file-crypt'

/** The uploads storage, and its folder when that is on this machine (null for a bucket). */
export interface UploadsStore {
  storage: Storage
  folder: string | null
}

/** The areas files are stored under (the first part of a storage key). */
export const FILE_AREAS = ['documents', 'igc'] as const
export type FileArea = typeof FILE_AREAS[number]

/** A replacement being written beside the file it replaces carries this in its name. */
const RESEAL_MARK = '.reseal-'

/**
 * Where uploads live by the environment: NUXT_UPLOADS_S3_BUCKET (with endpoint, region and
 * keys) a bucket, NUXT_UPLOADS_DIR a folder; null when neither is set (the default folder).
 */
export function uploadsDriverFromEnv(env: NodeJS.ProcessEnv): { driver: Driver, folder: string | null, where: string } | null {
  if (env.NUXT_UPLOADS_S3_BUCKET) {
    const missing = ['NUXT_UPLOADS_S3_ENDPOINT', 'NUXT_UPLOADS_S3_ACCESS_KEY_ID', 'NUXT_UPLOADS_S3_SECRET_ACCESS_KEY']
      .filter(name => !env[name])
    if (missing.length) throw new Error(`NUXT_UPLOADS_S3_BUCKET is set but ${missing.join(', ')} ${missing.length === 1 ? 'is' : 'are'} not.`)
    return {
      driver: s3Driver({
        bucket: env.NUXT_UPLOADS_S3_BUCKET,
        endpoint: env.NUXT_UPLOADS_S3_ENDPOINT!,
        region: env.NUXT_UPLOADS_S3_REGION || 'auto',
        accessKeyId: env.NUXT_UPLOADS_S3_ACCESS_KEY_ID!,
        secretAccessKey: env.NUXT_UPLOADS_S3_SECRET_ACCESS_KEY!,
      }),
      folder: null,
      where: `the bucket ${env.NUXT_UPLOADS_S3_BUCKET}`,
    }
  }
  if (env.NUXT_UPLOADS_DIR) {
    return { driver: fsDriver({ base: env.NUXT_UPLOADS_DIR }), folder: resolve(env.NUXT_UPLOADS_DIR), where: `the folder ${resolve(env.NUXT_UPLOADS_DIR)}` }
  }
  return null
}

/** The same place the fs driver reads a key from (a ':' is a folder). */
export function pathOfKey(folder: string, key: string): string {
  return join(folder, ...key.split(':'))
}

/** The folders of a key, created 0700 (the uploads folder itself included when new). */
async function folderFor(folder: string, key: string): Promise<string> {
  const parts = key.split(':').slice(0, -1)
  await mkdir(join(folder, ...parts), { recursive: true, mode: 0o700 })
  for (let i = parts.length; i > 0; i--) await chmod(join(folder, ...parts.slice(0, i)), 0o700)
  return join(folder, ...parts)
}

/** Makes a rename or a new name in the folder durable. */
async function syncFolder(path: string): Promise<void> {
  const handle = await openFile(path, 'r')
  try {
    await handle.sync()
  }
  finally {
    await handle.close()
  }
}

/** Streams `source` through `transform` into a new file at `target`: 0600, fsynced when closed. */
async function writeThrough(source: NodeJS.ReadableStream, transforms: NodeJS.ReadWriteStream[], target: string): Promise<void> {
  try {
    await pipeline([source, ...transforms, createWriteStream(target, { flags: 'wx', mode: 0o600, flush: true })])
  }
  catch (error) {
    await rm(target, { force: true })
    throw error
  }
}

/**
 * Seals the file received at `path` into storage under `key` (a fresh key: nothing is there).
 * Returns the id of the key it is sealed under, for the row.
 */
export async function writeSealedFile(store: UploadsStore, keyring: FileKeyring, key: string, path: string): Promise<string> {
  const keyId = sealingKey(keyring).id // before anything is written
  if (!store.folder) {
    await store.storage.setItemRaw(key, seal(await readLocalFile(path), keyring))
    return keyId
  }
  const target = pathOfKey(store.folder, key)
  const folder = await folderFor(store.folder, key)
  await writeThrough(createReadStream(path), [sealingStream(keyring)], target)
  await syncFolder(folder)
  return keyId
}

function toBuffer(raw: unknown): Buffer {
  if (Buffer.isBuffer(raw)) return raw
  if (raw instanceof Uint8Array) return Buffer.from(raw)
  if (raw instanceof ArrayBuffer) return Buffer.from(new Uint8Array(raw))
  if (typeof raw === 'string') return Buffer.from(raw)
  return Buffer.from(raw as ArrayLike<number>)
}

/** The stored bytes as they lie (sealed), or null when there is no such file. */
export async function readStoredBytes(store: UploadsStore, key: string): Promise<Buffer | null> {
  const raw = await store.storage.getItemRaw(key)
  return raw === null || raw === undefined ? null : toBuffer(raw)
}

/** A stored file's content, opened; null when there is no such file. Throws StoredFileError. */
export async function readSealedFile(store: UploadsStore, keyring: FileKeyring, key: string): Promise<Buffer | null> {
  const stored = await readStoredBytes(store, key)
  return stored && open(stored, keyring).data
}

/** The id of the key a stored file is sealed under: null for a legacy (plain) one, undefined when missing. */
export async function storedKeyId(store: UploadsStore, key: string): Promise<string | null | undefined> {
  if (!store.folder) {
    const stored = await readStoredBytes(store, key)
    return stored ? readFileHeader(stored)?.keyId ?? null : undefined
  }
  let handle
  try {
    handle = await openFile(pathOfKey(store.folder, key), 'r')
  }
  catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return undefined
    throw error
  }
  try {
    const { buffer, bytesRead } = await handle.read(Buffer.alloc(HEADER_BYTES), 0, HEADER_BYTES, 0)
    return readFileHeader(buffer.subarray(0, bytesRead))?.keyId ?? null
  }
  finally {
    await handle.close()
  }
}

/**
 * Seals a stored file again under the current key: decrypted (or read plain) and sealed as it
 * streams into a new file beside it, fsynced, renamed over it, the folder fsynced. Whenever it
 * stops, the file is the old copy or the new one, each readable with its key. Returns the key
 * id the file had, or undefined when there is no such file.
 */
export async function resealFile(store: UploadsStore, keyring: FileKeyring, key: string): Promise<{ from: string | null } | undefined> {
  sealingKey(keyring)
  if (!store.folder) {
    const stored = await readStoredBytes(store, key)
    if (!stored) return undefined
    const opened = open(stored, keyring)
    await store.storage.setItemRaw(key, seal(opened.data, keyring))
    return { from: opened.keyId }
  }
  const path = pathOfKey(store.folder, key)
  const fresh = join(dirname(path), `${basename(path)}${RESEAL_MARK}${randomUUID()}`)
  let from: string | null = null
  try {
    await writeThrough(createReadStream(path), [openingStream(keyring, (id) => {
      from = id
    }), sealingStream(keyring)], fresh)
  }
  catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return undefined
    throw error
  }
  await rename(fresh, path)
  await syncFolder(dirname(path))
  return { from }
}

export async function removeStoredFile(store: UploadsStore, key: string): Promise<void> {
  await store.storage.removeItem(key)
}

export interface StoredFileListing {
  key: string
  /** When it was last written; null when the storage does not say (a bucket). */
  modifiedAt: Date | null
}

/** Every stored file of the file areas, replacements being written included. */
export async function listStoredFiles(store: UploadsStore): Promise<StoredFileListing[]> {
  const keys = (await store.storage.getKeys()).filter(k => FILE_AREAS.some(area => k.startsWith(`${area}:`)))
  const out: StoredFileListing[] = []
  for (const key of keys.sort()) {
    const meta = await store.storage.getMeta(key, { nativeOnly: true })
    const modified = meta?.mtime ? new Date(meta.mtime) : null
    out.push({ key, modifiedAt: modified && !Number.isNaN(modified.getTime()) ? modified : null })
  }
  return out
}
