// `npm start`: demo database (started if needed) → migrations → demo data (once) → build (if
// stale) → the built server on http://127.0.0.1:3000, with the session password and the files
// key kept in .data (scripts/lib/secrets.ts). Ctrl-C stops the app; the database
// keeps running so the next start is quick (`npm run stop` stops it).
import { spawn } from 'node:child_process'
import type { ChildProcess } from 'node:child_process'
import { join } from 'node:path'
import { ensureBuild } from './lib/build'
import { repoRoot, runMain, ScriptError, step } from './lib/common'
import { migrate, seed } from './lib/db'
import { prepareDemoDatabase } from './lib/demo-db'
import { playDemoDay } from './lib/demo-day'
import { isPortFree, sleep } from './lib/net'
import { filesKey, sessionPassword } from './lib/secrets'
import { sealDemoFiles } from './lib/file-maintenance'
import { startServices } from './lib/services'
import { printSignIns } from './lib/sign-ins'

const HEALTH_TIMEOUT_MS = 60_000
/** How long the app gets to finish open requests after Ctrl-C before it is killed. */
const SHUTDOWN_GRACE_MS = 10_000

function appPort(): number {
  const raw = process.env.PORT || process.env.NITRO_PORT || '3000'
  const port = Number(raw)
  if (!Number.isInteger(port) || port < 1 || port > 65535) throw new ScriptError(`PORT=${raw} is not a valid port number.`)
  return port
}

/** The address to reach a server bound to host from this machine. */
function localUrl(host: string, port: number): string {
  if (host === '0.0.0.0' || host === '') return `http://127.0.0.1:${port}`
  if (host === '::') return `http://[::1]:${port}`
  return host.includes(':') ? `http://[${host}]:${port}` : `http://${host}:${port}`
}

/** Polls GET /api/health until it answers 200; fails early if the app exits meanwhile. */
async function waitForHealth(url: string, app: ChildProcess): Promise<void> {
  const deadline = Date.now() + HEALTH_TIMEOUT_MS
  let last = 'no answer'
  while (Date.now() < deadline) {
    if (app.exitCode !== null || app.signalCode !== null) {
      throw new ScriptError(`The app exited during start-up (exit code ${app.exitCode ?? app.signalCode}); see its output above.`)
    }
    try {
      const response = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) })
      if (response.status === 200) return
      last = `HTTP ${response.status} ${await response.text()}`
    }
    catch (error) {
      last = (error as Error).message
    }
    await sleep(250)
  }
  throw new ScriptError(`The app did not report healthy within ${HEALTH_TIMEOUT_MS / 1000} s (last answer from ${url}/api/health: ${last}).`)
}

runMain(async () => {
  // Settings first, so a mistake in them fails before the slow steps.
  const password = sessionPassword()
  const filesSealKey = filesKey()
  const port = appPort()
  const host = process.env.HOST || process.env.NITRO_HOST || '127.0.0.1'

  const databaseUrl = await prepareDemoDatabase()

  const applied = await migrate(databaseUrl)
  step(applied.length > 0 ? `Applied ${applied.length} migration(s): ${applied.join(', ')}` : 'The schema is up to date')
  const { seeded } = await seed(databaseUrl, false, password, filesSealKey)
  step(seeded ? 'Seeded the demo data' : 'Demo data already present (npm run seed:reset starts it over)')
  const sealed = await sealDemoFiles(databaseUrl, filesSealKey)
  if (sealed > 0) step(`Encrypted ${sealed} stored file${sealed === 1 ? '' : 's'} kept from before files were encrypted`)

  await ensureBuild()
  if (!(await isPortFree(port, host))) {
    throw new ScriptError(`Port ${port} on ${host} is already in use (is the app already running?). Stop that program or set PORT.`)
  }

  const extra = await startServices()
  step(`Starting the app on ${host}:${port}`)
  const app = spawn(process.execPath, [join(repoRoot, '.output', 'server', 'index.mjs')], {
    cwd: repoRoot,
    stdio: 'inherit',
    env: {
      ...process.env,
      ...extra.env,
      PORT: String(port),
      HOST: host,
      NITRO_PORT: String(port),
      NITRO_HOST: host,
      DATABASE_URL: databaseUrl,
      NUXT_SESSION_PASSWORD: password,
      NUXT_FILES_KEY: filesSealKey,
      // The demo: its seeded accounts and the session password signing tags and invitations are
      // what a production start (npm run serve) refuses.
      NUXT_DEMO_MODE: 'true',
      NODE_ENV: 'production',
    },
  })

  let stopping = false
  const exited = new Promise<string>((resolve) => {
    app.on('exit', (code, signal) => resolve(signal ? `signal ${signal}` : `exit code ${code}`))
  })
  app.on('error', error => console.error(`Could not start the app: ${error.message}`))

  const shutdown = (signal: NodeJS.Signals) => {
    if (stopping) return // the terminal and bootstrap.mjs may both deliver the same Ctrl-C
    stopping = true
    console.log('\n▸ Stopping the app (the database keeps running; npm run stop stops it)')
    if (app.exitCode === null && app.signalCode === null) app.kill(signal)
    setTimeout(() => app.kill('SIGKILL'), SHUTDOWN_GRACE_MS).unref()
  }
  process.on('SIGINT', shutdown)
  process.on('SIGTERM', shutdown)

  const url = localUrl(host, port)
  try {
    await waitForHealth(url, app)
  }
  catch (error) {
    if (!stopping) {
      app.kill('SIGTERM')
      await exited
      await extra.stopAll()
      throw error
    }
  }

  if (!stopping && app.exitCode === null && app.signalCode === null) {
    try {
      const { played } = await playDemoDay(url, databaseUrl)
      if (played) step('Opened today as a practice day on the readiness board, with some gliders already checked')
    }
    catch (error) {
      // The app itself is fine; only the demo's first day is missing.
      console.warn(`Could not play the demo's first day: ${(error as Error).message}`)
    }
    console.log(`\nGridmark is running at ${url}${host === '0.0.0.0' ? ' (listening on all interfaces)' : ''}\n`)
    printSignIns()
    for (const note of extra.notes) console.log(note)
    console.log('\nPress Ctrl-C to stop the app.')
  }

  const how = await exited
  await extra.stopAll()
  if (stopping) {
    step('Stopped')
    process.exit(0)
  }
  throw new ScriptError(`The app exited unexpectedly (${how}); see its output above.`)
})
