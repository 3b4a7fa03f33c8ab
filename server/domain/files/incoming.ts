// Where uploads wait while they arrive (NUXT_UPLOADS_TMP_DIR, else the system's temporary
// folder): server/utils/uploads.ts writes there, the orphan sweep (orphans.ts) clears what a
// stopped server left. A leaf: both import it.
import { tmpdir } from 'node:os'
import { join } from 'node:path'

export function incomingFolder(env: NodeJS.ProcessEnv = process.env): string {
  return env.NUXT_UPLOADS_TMP_DIR || join(tmpdir(), 'gridmark-incoming')
}
