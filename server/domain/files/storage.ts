// The uploaded files themselves, kept in Nitro's storage layer under the `uploads` mount:
// a folder on disk by default (.data/uploads, git-ignored), an S3-compatible bucket when
// configured (server/plugins/uploads-storage.ts). Rows in PostgreSQL hold the metadata and
// point here by key. Keys are fresh uuids under the entry, so two uploads never share a
// file and removing one (after a failed transaction) cannot touch another's.
import { createHash, randomUUID } from 'node:crypto'

export type FileArea = 'documents' | 'igc'

function uploads() {
  return useStorage('uploads')
}

export function sha256Hex(data: Uint8Array): string {
  return createHash('sha256').update(data).digest('hex')
}

export function newStorageKey(area: FileArea, entryId: string): string {
  return `${area}:${entryId}:${randomUUID()}`
}

export async function putFile(key: string, data: Uint8Array): Promise<void> {
  await uploads().setItemRaw(key, Buffer.from(data.buffer, data.byteOffset, data.byteLength))
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
 * Writes the file first, then runs the rows' transaction; if the transaction fails the file
 * is removed again, so a failed upload leaves neither rows nor a stray file behind.
 */
export async function storeThenCommit<T>(key: string, data: Uint8Array, commit: () => Promise<T>): Promise<T> {
  await putFile(key, data)
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
