#!/usr/bin/env node
// Entry point of `npm start`, `npm test`, `npm run stop`, `npm run seed:reset`,
// `npm run migrate`, `npm run bench`, `npm run admin:create`, `npm run files:rekey` and
// `npm run files:orphans`. Plain Node with no dependencies, because on a fresh clone it runs
// before node_modules exists: it installs the locked dependencies when they are missing or
// out of date, then hands over to the TypeScript script of the same name (run through tsx).
import { spawn, spawnSync } from 'node:child_process'
import { createHash } from 'node:crypto'
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import { constants } from 'node:os'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

const root = dirname(dirname(fileURLToPath(import.meta.url)))
const COMMANDS = ['start', 'test', 'stop', 'seed-reset', 'migrate', 'bench', 'admin-create', 'files-rekey', 'files-orphans']

const [command, ...args] = process.argv.slice(2)
if (!command || !COMMANDS.includes(command)) {
  console.error(`Usage: node scripts/bootstrap.mjs <${COMMANDS.join('|')}> [args...]`)
  process.exit(2)
}

ensureDependencies()
runScript(command, args)

/**
 * node_modules counts as up to date when the stamp written after the last successful
 * `npm ci` holds the hash of the current package-lock.json. A checkout that changed the
 * lock (or a half-finished install, which leaves no stamp) gets a clean reinstall.
 */
function ensureDependencies() {
  const lockFile = join(root, 'package-lock.json')
  const stampFile = join(root, 'node_modules', '.gridmark-lock.sha256')
  if (!existsSync(lockFile)) {
    console.error('package-lock.json is missing; cannot install the locked dependencies.')
    process.exit(1)
  }
  const lockHash = createHash('sha256').update(readFileSync(lockFile)).digest('hex')
  const stamp = existsSync(stampFile) ? readFileSync(stampFile, 'utf8').trim() : null
  if (stamp === lockHash && existsSync(join(root, 'node_modules', '.bin', 'tsx'))) return

  console.log(existsSync(join(root, 'node_modules'))
    ? '▸ package-lock.json changed since the last install: running npm ci'
    : '▸ Installing dependencies: running npm ci (about a minute)')
  const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm'
  const result = spawnSync(npm, ['ci'], { cwd: root, stdio: 'inherit' })
  if (result.error) {
    console.error(`Could not run npm: ${result.error.message}`)
    process.exit(1)
  }
  if (result.status !== 0) {
    console.error(`npm ci failed (exit code ${result.status ?? result.signal}); see its output above.`)
    process.exit(result.status || 1)
  }
  writeFileSync(stampFile, `${lockHash}\n`)
}

/** Runs scripts/<command>.ts in a child Node process and mirrors its exit status. */
function runScript(name, scriptArgs) {
  const child = spawn(process.execPath, ['--import', 'tsx', join('scripts', `${name}.ts`), ...scriptArgs], {
    cwd: root,
    stdio: 'inherit',
  })

  // A Ctrl-C in a terminal reaches the whole process group anyway, but a SIGTERM from a
  // supervisor (or CI) only reaches us: pass both on so the script can clean up. The
  // scripts treat a repeated signal as harmless.
  const forward = (signal) => {
    if (child.exitCode === null && child.signalCode === null) child.kill(signal)
  }
  process.on('SIGINT', forward)
  process.on('SIGTERM', forward)

  child.on('error', (error) => {
    console.error(`Could not start scripts/${name}.ts: ${error.message}`)
    process.exit(1)
  })
  child.on('exit', (code, signal) => {
    // Shell convention: a process killed by signal N exits with 128 + N.
    process.exit(code ?? 128 + (constants.signals[signal] ?? 1))
  })
}
