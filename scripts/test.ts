// `npm test [-- vitest args]`: every check, against a throwaway database — never the demo's.
//
//   setup      fresh PostgreSQL cluster in a new /tmp folder (fsync off, free port),
//              database gridmark_test, migrations, demo data (browser tests sign in as the
//              demo users), Chromium, poppler-utils (the PDF tests), build (if stale)
//   lint       eslint .
//   typecheck  nuxt typecheck                 (both skipped with GRIDMARK_SKIP_STATIC=1)
//   vitest     vitest run + the extra arguments, e.g. `npm test -- --project unit`
//
// Every step runs even when an earlier one failed, so one run shows every problem. The
// result goes to artifacts/test-summary.json ({ passed, failed, steps }), which CI reads;
// the cluster is stopped and its folder removed in every case, Ctrl-C included.
import type { ChildProcess } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { ensureBrowser } from './lib/browser'
import { ensurePdfTools } from './lib/pdf-tools'
import { ensureBuild } from './lib/build'
import { artifactsDir, formatDuration, interrupts, reportError, repoRoot, runInherited, step } from './lib/common'
import { migrate, seed } from './lib/db'
import { APP_ROLE, clusterEnv, clusterUrl, createDatabase, ensurePostgresBinaries, isClusterRunning, randomClusterPasswords, startThrowawayCluster, stopCluster, superuserUrl, throwawayDir } from './lib/postgres'
import type { Cluster } from './lib/postgres'
import { randomSessionPassword } from './lib/secrets'
import { newFilesKey } from '../server/domain/files/file-crypt'
import { startServices, type StartedServices } from './lib/services'
import { startServer, type RunningServer } from '../tests/support/server'

const TEST_DATABASE = 'gridmark_test'
const summaryFile = join(artifactsDir, 'test-summary.json')
const vitestJson = join(artifactsDir, 'vitest.json')
const bin = (name: string) => join(repoRoot, 'node_modules', '.bin', name)

interface StepResult {
  name: string
  status: 'passed' | 'failed' | 'skipped'
  durationMs: number
  exitCode?: number
  /** vitest only: counts from its JSON report. */
  tests?: { passed: number, failed: number, total: number }
  error?: string
}

const steps: StepResult[] = []
let cluster: Cluster | undefined
let tempDir: string | undefined
let currentChild: ChildProcess | undefined
let fakes: StartedServices | undefined
let server: RunningServer | undefined
// Fresh per run: nothing signed in by an earlier run stays valid. Known before seeding, since
// it also signs the demo's glider tags.
const sessionSecret = randomSessionPassword()
// Seals the files of the run (the demo seed's and the tests' uploads), fresh per run too.
const filesSealKey = newFilesKey()
// The throwaway cluster's database passwords: the app's role for the server and the tests,
// the superuser's only for the tests that need it (GRIDMARK_TEST_SUPERUSER_URL).
const dbPasswords = randomClusterPasswords()

// ---------------------------------------------------------------------------------------
// Signals: finish the current step quickly, skip the rest, still clean up and report.

const signals = interrupts('stopping the current step', (signal) => {
  if (currentChild && currentChild.exitCode === null && currentChild.signalCode === null) currentChild.kill(signal)
})
signals.listen()
const timed = signals.timed

// ---------------------------------------------------------------------------------------
// Set-up

/** Prepares the throwaway database, browser and build; returns the database URL. */
async function setUp(): Promise<string> {
  const binDir = await timed('PostgreSQL binaries', ensurePostgresBinaries)
  const testCluster = await timed('test cluster started', async () => {
    tempDir = throwawayDir('gridmark-test-')
    // Uploaded files of the run (demo seed and tests) live and die with it, apart from the demo's.
    process.env.NUXT_UPLOADS_DIR = join(tempDir, 'uploads')
    cluster = await startThrowawayCluster(tempDir, binDir, dbPasswords)
    return cluster
  })
  const url = clusterUrl(testCluster, dbPasswords, TEST_DATABASE)
  await timed(`database ${TEST_DATABASE} on port ${testCluster.port}`, () => createDatabase(testCluster, dbPasswords, TEST_DATABASE))
  await timed('migrations', () => migrate(url))
  await timed('demo data', () => seed(url, false, sessionSecret, filesSealKey))
  await timed('Chromium', ensureBrowser)
  await timed('poppler-utils', ensurePdfTools)
  await timed('build', ensureBuild)
  return url
}

// ---------------------------------------------------------------------------------------
// Steps

async function runStep(name: string, command: string, args: string[], env: NodeJS.ProcessEnv = process.env): Promise<StepResult> {
  if (signals.signal) return { name, status: 'skipped', durationMs: 0, error: `interrupted by ${signals.signal}` }
  console.log(`\n━━ ${name}: ${[command.replace(`${repoRoot}/`, ''), ...args].join(' ')}`)
  const started = Date.now()
  let exitCode: number
  try {
    exitCode = await runInherited(command, args, { cwd: repoRoot, env }, (child) => {
      currentChild = child
    })
  }
  catch (error) {
    reportError(error)
    exitCode = 127
  }
  finally {
    currentChild = undefined
  }
  const durationMs = Date.now() - started
  const status = exitCode === 0 ? 'passed' : 'failed'
  console.log(`━━ ${name} ${status} in ${formatDuration(durationMs)}${exitCode === 0 ? '' : ` (exit code ${exitCode})`}`)
  return { name, status, durationMs, exitCode }
}

interface VitestReport {
  numPassedTests?: number
  numFailedTests?: number
  numTotalTests?: number
  numFailedTestSuites?: number
}

async function runVitest(url: string, extraArgs: string[]): Promise<StepResult> {
  rmSync(vitestJson, { force: true }) // a report left by an earlier run must not be counted
  const env: NodeJS.ProcessEnv = {
    ...process.env, // passes CI and the like through
    DATABASE_URL: url,
    NUXT_SESSION_PASSWORD: sessionSecret,
    NUXT_FILES_KEY: filesSealKey,
    ...clusterEnv(cluster!),
    GRIDMARK_TEST_SUPERUSER_URL: superuserUrl(cluster!, dbPasswords, TEST_DATABASE),
    GRIDMARK_TEST_APP_ROLE: APP_ROLE,
    GRIDMARK_ARTIFACTS: artifactsDir,
  }
  // One built server and one set of fakes for the e2e and browser layers together
  // (tests/support/global-server.ts hands them on).
  const started = Date.now()
  try {
    Object.assign(process.env, env)
    fakes = await startServices(undefined, { forTests: true })
    server = await startServer(fakes.env)
    env.GRIDMARK_TEST_BASE_URL = server.url
    env.GRIDMARK_TEST_SERVICE_ENV = JSON.stringify(fakes.env)
    console.log(`  ✓ test server on ${server.url} (${formatDuration(Date.now() - started)})`)
  }
  catch (error) {
    reportError(error)
    await stopServer()
    return { name: 'vitest', status: 'failed', durationMs: Date.now() - started, tests: { passed: 0, failed: 1, total: 1 }, error: 'the test server did not start' }
  }
  const result = await runStep('vitest', bin('vitest'), [
    'run',
    '--reporter=default',
    '--reporter=json',
    '--outputFile.json=artifacts/vitest.json',
    ...extraArgs,
  ], env)
  if (result.status === 'skipped') return result

  await stopServer()
  const report = readVitestReport()
  if (!report) {
    // A crash before the report was written: count it as one failure.
    return { ...result, status: 'failed', tests: { passed: 0, failed: 1, total: 0 }, error: 'vitest wrote no JSON report' }
  }
  const passed = report.numPassedTests ?? 0
  let failed = report.numFailedTests ?? 0
  // vitest can fail with no failing test (a file that does not load, no test files found,
  // an error outside tests): count at least one failure so the totals agree with the exit code.
  if (result.exitCode !== 0 && failed === 0) failed = Math.max(1, report.numFailedTestSuites ?? 0)
  return { ...result, tests: { passed, failed, total: report.numTotalTests ?? passed + failed } }
}

function readVitestReport(): VitestReport | null {
  if (!existsSync(vitestJson)) return null
  try {
    return JSON.parse(readFileSync(vitestJson, 'utf8')) as VitestReport
  }
  catch {
    return null
  }
}

// ---------------------------------------------------------------------------------------
// Summary and clean-up

function totals(): { passed: number, failed: number } {
  let passed = 0
  let failed = 0
  for (const s of steps) {
    if (s.tests) {
      passed += s.tests.passed
      failed += s.tests.failed
    }
    else if (s.status === 'passed' && s.name !== 'setup') passed += 1
    else if (s.status === 'failed') failed += 1
  }
  if (signals.signal && failed === 0) failed = 1 // an interrupted run never counts as green
  return { passed, failed }
}

function writeSummary(): { passed: number, failed: number } {
  const { passed, failed } = totals()
  mkdirSync(artifactsDir, { recursive: true })
  writeFileSync(summaryFile, `${JSON.stringify({ passed, failed, steps, ...(signals.signal ? { interrupted: signals.signal } : {}) }, null, 2)}\n`)

  console.log('\nSummary')
  for (const s of steps) {
    const detail = s.tests ? `  (${s.tests.passed} passed, ${s.tests.failed} failed)` : s.error ? `  (${s.error.split('\n')[0]})` : ''
    console.log(`  ${s.name.padEnd(10)} ${s.status.padEnd(8)} ${formatDuration(s.durationMs).padStart(8)}${detail}`)
  }
  console.log(`  ${passed} passed, ${failed} failed (artifacts/test-summary.json)`)
  return { passed, failed }
}

async function stopServer(): Promise<void> {
  try {
    await server?.stop()
    await fakes?.stopAll()
  }
  catch (error) {
    reportError(error)
  }
  server = undefined
  fakes = undefined
}

let cleanedUp = false
async function cleanUp(): Promise<void> {
  if (cleanedUp) return
  cleanedUp = true
  await stopServer()
  if (cluster) {
    try {
      if (await isClusterRunning(cluster)) await stopCluster(cluster)
    }
    catch (error) {
      console.error('Could not stop the test cluster:')
      reportError(error)
    }
  }
  if (tempDir) rmSync(tempDir, { recursive: true, force: true })
}

// ---------------------------------------------------------------------------------------

async function main(): Promise<number> {
  rmSync(summaryFile, { force: true })
  const extraArgs = process.argv.slice(2)
  const skipStatic = process.env.GRIDMARK_SKIP_STATIC === '1'

  step('Setting up a throwaway database, the browser and the build')
  const started = Date.now()
  let url: string
  try {
    url = await setUp()
    steps.push({ name: 'setup', status: 'passed', durationMs: Date.now() - started })
  }
  catch (error) {
    reportError(error)
    steps.push({ name: 'setup', status: 'failed', durationMs: Date.now() - started, error: (error as Error).message })
    writeSummary()
    return signals.signal ? 130 : 1
  }

  for (const [name, command, args] of [
    ['lint', bin('eslint'), ['.']],
    ['typecheck', bin('nuxt'), ['typecheck']],
  ] as const) {
    steps.push(skipStatic
      ? { name, status: 'skipped', durationMs: 0, error: 'GRIDMARK_SKIP_STATIC=1' }
      : await runStep(name, command, [...args]))
  }
  steps.push(await runVitest(url, extraArgs))

  const { failed } = writeSummary()
  if (signals.signal) return 130
  return failed > 0 ? 1 : 0
}

main()
  .catch((error: unknown) => {
    // A bug in this script: still leave a summary CI can read.
    reportError(error)
    steps.push({ name: 'internal', status: 'failed', durationMs: 0, error: String(error) })
    writeSummary()
    return 1
  })
  .then(async (code) => {
    try {
      await cleanUp()
    }
    catch (error) {
      console.error(`Could not remove ${tempDir}:`)
      reportError(error)
    }
    process.exit(code)
  })
