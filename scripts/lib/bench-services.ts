// What a bench section runs on: a throwaway PostgreSQL cluster in a folder of its own with one
// migrated database, and the built server; stopped in every case (an error, Ctrl-C), each step
// tried even when the one before failed.
import { rmSync } from 'node:fs'
import type { RunningServer } from '../../tests/support/server'
import { migrate } from './db'
import { clusterUrl, createDatabase, ensurePostgresBinaries, isClusterRunning, randomClusterPasswords, startThrowawayCluster, stopCluster, throwawayDir, type Cluster } from './postgres'

export interface BenchParts {
  server?: RunningServer
  cluster?: Cluster
  tempDir?: string
}

type Timed = <T>(label: string, task: () => Promise<T>) => Promise<T>

/** Starts the cluster (recorded in `parts` as soon as it exists) and a migrated database; its URL. */
export async function startBenchDatabase(parts: BenchParts, folderPrefix: string, database: string, timed: Timed): Promise<string> {
  const dbPasswords = randomClusterPasswords()
  const binDir = await timed('PostgreSQL binaries', ensurePostgresBinaries)
  const cluster = await timed('bench cluster started', async () => {
    parts.tempDir = throwawayDir(folderPrefix)
    parts.cluster = await startThrowawayCluster(parts.tempDir, binDir, dbPasswords)
    return parts.cluster
  })
  const url = clusterUrl(cluster, dbPasswords, database)
  await timed(`database ${database} on port ${cluster.port}`, () => createDatabase(cluster, dbPasswords, database))
  await timed('migrations', () => migrate(url))
  return url
}

export async function tearDownBench(parts: BenchParts): Promise<void> {
  try {
    await parts.server?.stop()
  }
  catch (error) {
    console.error(`Could not stop the bench server: ${(error as Error).message}`)
  }
  if (parts.cluster) {
    try {
      if (await isClusterRunning(parts.cluster)) await stopCluster(parts.cluster)
    }
    catch (error) {
      console.error(`Could not stop the bench cluster: ${(error as Error).message}`)
    }
  }
  if (parts.tempDir) rmSync(parts.tempDir, { recursive: true, force: true })
}
