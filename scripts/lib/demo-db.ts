// The demo database of `npm start`: one persistent cluster per clone, with fsync on because
// people keep real-looking data in it. Its location is recorded in .data/cluster.json so
// `npm run stop` finds it even when it had to live under /tmp.
import { createHash } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { localDataDir, repoRoot, ScriptError, step } from './common'
import { clusterUrl, createDatabase, ensureAppRole, ensurePostgresBinaries, giveAppOwnership, initCluster, randomClusterPasswords, serverUserCanReach, startCluster, trustsConnections, upgradeTrustCluster } from './postgres'
import type { Cluster, ClusterPasswords } from './postgres'
import { clusterPasswordsFile, readClusterPasswords, saveClusterPasswords } from './secrets'

export const DEMO_DATABASE = 'gridmark'
const DEFAULT_PORT = 54329
const recordFile = join(localDataDir, 'cluster.json')

function demoPort(): number {
  const raw = process.env.GRIDMARK_DB_PORT
  if (!raw) return DEFAULT_PORT
  const port = Number(raw)
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    throw new ScriptError(`GRIDMARK_DB_PORT=${raw} is not a valid port number.`)
  }
  return port
}

/**
 * Where the demo cluster lives: <repo>/.data when the postgres user can reach it, else a
 * folder under /tmp named after this clone's path (so two clones do not share one).
 */
async function demoClusterLocation(binDir: string): Promise<Cluster> {
  mkdirSync(localDataDir, { recursive: true })
  let base = localDataDir
  if (!(await serverUserCanReach(localDataDir))) {
    const tag = createHash('sha256').update(repoRoot).digest('hex').slice(0, 8)
    base = `/tmp/gridmark-${tag}`
    mkdirSync(base, { recursive: true, mode: 0o755 })
  }
  const port = demoPort()
  let socketDir = join(base, 'pg-socket')
  // A Unix socket path is limited to ~107 bytes; a deep clone gets a short folder instead.
  if (`${socketDir}/.s.PGSQL.${port}`.length > 100) {
    socketDir = `/tmp/gridmark-${createHash('sha256').update(repoRoot).digest('hex').slice(0, 8)}-socket`
  }
  return {
    dataDir: join(base, 'pg'),
    socketDir,
    port,
    logFile: join(base, 'postgres.log'),
    binDir,
    fsync: true,
  }
}

/** The demo cluster recorded by the last `npm start` (or migrate / seed:reset), or null. */
export function readClusterRecord(): Cluster | null {
  if (!existsSync(recordFile)) return null
  try {
    return JSON.parse(readFileSync(recordFile, 'utf8')) as Cluster
  }
  catch (error) {
    throw new ScriptError(`${recordFile} is not valid JSON (${(error as Error).message}); delete it and run npm start again.`)
  }
}

function writeClusterRecord(cluster: Cluster): void {
  mkdirSync(localDataDir, { recursive: true })
  writeFileSync(recordFile, `${JSON.stringify(cluster, null, 2)}\n`)
}

/**
 * Makes the demo database reachable and returns its URL: DATABASE_URL as is when set
 * (someone else runs the database), otherwise our own cluster, created and started as needed.
 */
export async function prepareDemoDatabase(): Promise<string> {
  if (process.env.DATABASE_URL) {
    step('Using the database in DATABASE_URL (no local cluster is started)')
    return process.env.DATABASE_URL
  }
  const binDir = await ensurePostgresBinaries()
  const wanted = await demoClusterLocation(binDir)
  const passwords = demoPasswords(wanted)
  if (await initCluster(wanted, passwords)) step(`Created the demo database cluster in ${wanted.dataDir}`)
  const cluster = await startCluster(wanted)
  if (cluster.port !== wanted.port) {
    step(`The demo database is already running on port ${cluster.port}; using it (npm run stop, then start again, to move it to ${wanted.port})`)
  }
  writeClusterRecord(cluster)
  step(`Demo database cluster running on 127.0.0.1:${cluster.port} (data in ${cluster.dataDir})`)
  await ensureAppRole(cluster, passwords)
  if (await createDatabase(cluster, passwords, DEMO_DATABASE)) step(`Created database "${DEMO_DATABASE}"`)
  if (trustsConnections(cluster)) {
    await upgradeTrustCluster(cluster, passwords, DEMO_DATABASE)
    step(`The demo database now asks every connection for a password (kept in ${clusterPasswordsFile}); the app connects as a role that is not a superuser`)
  }
  else {
    await giveAppOwnership(cluster, passwords, DEMO_DATABASE)
  }
  return clusterUrl(cluster, passwords, DEMO_DATABASE)
}

/**
 * The demo cluster's passwords: those kept in .data, or new ones for a new cluster. A cluster
 * made before passwords were required (it trusts local connections, its superuser is `app`)
 * gets new ones too, and prepareDemoDatabase upgrades it.
 */
function demoPasswords(cluster: Cluster): ClusterPasswords {
  const stored = readClusterPasswords()
  if (stored) return stored
  const exists = existsSync(join(cluster.dataDir, 'PG_VERSION'))
  if (exists && !trustsConnections(cluster)) {
    throw new ScriptError(`The demo cluster in ${cluster.dataDir} asks for passwords, but ${clusterPasswordsFile} that holds them is missing. `
      + 'Restore it, or run npm run stop and delete that folder (the demo\'s data) to start afresh.')
  }
  const passwords = exists ? { ...randomClusterPasswords(), superuserName: 'app' } : randomClusterPasswords()
  saveClusterPasswords(passwords)
  return passwords
}
