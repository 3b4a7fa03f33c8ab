// Stored files no row points at (`npm run files:orphans`): a crash between placing a file and
// committing its row leaves one, as does a replacement being written by files:rekey when it
// stops. So do temporary files of uploads in NUXT_UPLOADS_TMP_DIR when the server stops mid-
// request. Only those older than an hour are removed, so an upload or a rekey under way is never
// touched. Free of Nitro's globals: the script and the tests pass the database and the storage.
import { readdir, rm, stat } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Knex } from 'knex'
import { listStoredFiles, removeStoredFile, type StoredFileListing, type UploadsStore } from './file-store'
import { FILE_TABLES } from './rekey'

/** How old a file without a row must be before it is removed. */
export const ORPHAN_MIN_AGE_MS = 60 * 60 * 1000

/** Where uploads wait while they arrive (as server/utils/uploads.ts chooses it). */
export function incomingFolder(env: NodeJS.ProcessEnv = process.env): string {
  return env.NUXT_UPLOADS_TMP_DIR || join(tmpdir(), 'gridmark-incoming')
}

export interface OrphanReport {
  /** Stored files no row points at, oldest first. */
  orphans: StoredFileListing[]
  /** Temporary files of uploads, oldest first. */
  incoming: { path: string, modifiedAt: Date }[]
  /** What was removed (with `remove`): the orphans and temporary files older than an hour. */
  removed: string[]
}

const oldest = (a: { modifiedAt: Date | null }, b: { modifiedAt: Date | null }) =>
  (a.modifiedAt?.getTime() ?? 0) - (b.modifiedAt?.getTime() ?? 0)

async function incomingFiles(folder: string): Promise<{ path: string, modifiedAt: Date }[]> {
  const names = await readdir(folder).catch((error: NodeJS.ErrnoException) => {
    if (error.code === 'ENOENT') return [] as string[]
    throw error
  })
  const out: { path: string, modifiedAt: Date }[] = []
  for (const name of names) {
    const info = await stat(join(folder, name)).catch(() => null)
    if (info?.isFile()) out.push({ path: join(folder, name), modifiedAt: info.mtime })
  }
  return out.sort(oldest)
}

/**
 * Lists the stored files without a row and the uploads' temporary files; with `remove`, removes
 * those older than an hour (as of `now`). A file whose age the storage does not tell (a bucket)
 * is listed, never removed.
 */
export async function findOrphans(db: Knex, store: UploadsStore, options: { remove?: boolean, now?: Date, incoming?: string } = {}): Promise<OrphanReport> {
  const before = (options.now ?? new Date()).getTime() - ORPHAN_MIN_AGE_MS
  const stored = await listStoredFiles(store)
  // Read after the listing: a row committed meanwhile still counts.
  const referenced = new Set<string>()
  for (const table of FILE_TABLES) {
    for (const key of await db(table).whereNotNull('storage_key').pluck('storage_key') as string[]) referenced.add(key)
  }
  const orphans = stored.filter(f => !referenced.has(f.key)).sort(oldest)
  const incoming = await incomingFiles(options.incoming ?? incomingFolder())
  const removed: string[] = []
  if (options.remove) {
    for (const orphan of orphans) {
      if (!orphan.modifiedAt || orphan.modifiedAt.getTime() > before) continue
      await removeStoredFile(store, orphan.key)
      removed.push(orphan.key)
    }
    for (const file of incoming) {
      if (file.modifiedAt.getTime() > before) continue
      await rm(file.path, { force: true })
      removed.push(file.path)
    }
  }
  return { orphans, incoming, removed }
}
