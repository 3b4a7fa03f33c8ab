// What a bench section started, stopped in every case (an error, Ctrl-C): the built server,
// the throwaway cluster and its folder. Each step is tried even when the one before failed.
import { rmSync } from 'node:fs'
import type { RunningServer } from '../../tests/support/server'
import { isClusterRunning, stopCluster, type Cluster } from './postgres'

export async function tearDownBench(parts: { server?: RunningServer, cluster?: Cluster, tempDir?: string }): Promise<void> {
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
