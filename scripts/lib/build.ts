// Builds the app (nuxt build → .output) only when its inputs changed since the last build,
// so a second `npm start` or `npm test` starts in seconds instead of ~30 s.
import { createHash } from 'node:crypto'
import { existsSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { join, relative, sep } from 'node:path'
import { formatDuration, repoRoot, runInherited, ScriptError, step } from './common'

/** Files and folders (relative to the repo) whose contents end up in the build. */
const BUILD_INPUTS = [
  'package-lock.json',
  'nuxt.config.ts',
  '.nuxtrc',
  'app.config.ts',
  'tailwind.config.ts',
  'app.vue',
  'error.vue',
  'pages',
  'components',
  'layouts',
  'composables',
  'utils',
  'middleware',
  'plugins',
  'stores',
  'server',
  'shared',
  'assets',
  'public',
  'migrations',
  'modules',
]

const outputDir = join(repoRoot, '.output')
const stampFile = join(outputDir, '.gridmark-build.sha256')

function listFiles(path: string): string[] {
  if (!existsSync(path)) return []
  if (!statSync(path).isDirectory()) return [path]
  return readdirSync(path)
    .sort()
    .flatMap(name => listFiles(join(path, name)))
}

/**
 * sha256 over the path and contents of every build input, in a fixed order. Paths are part
 * of the hash so renaming or moving a file (e.g. a page) also counts as a change.
 */
export function buildInputsHash(): string {
  const hash = createHash('sha256')
  for (const input of BUILD_INPUTS) {
    for (const file of listFiles(join(repoRoot, input))) {
      hash.update(relative(repoRoot, file).split(sep).join('/'))
      hash.update('\0')
      hash.update(readFileSync(file))
      hash.update('\0')
    }
  }
  return hash.digest('hex')
}

/** Runs `nuxt build` unless .output was built from exactly the current inputs. */
export async function ensureBuild(): Promise<void> {
  const inputsHash = buildInputsHash()
  const stamp = existsSync(stampFile) ? readFileSync(stampFile, 'utf8').trim() : null
  if (stamp === inputsHash && existsSync(join(outputDir, 'server', 'index.mjs'))) {
    step('The build is up to date')
    return
  }
  step('Building the app (nuxt build, about 30 s)')
  // Drop the old stamp first: an interrupted build must not look finished next time.
  rmSync(stampFile, { force: true })
  const started = Date.now()
  const code = await runInherited(join(repoRoot, 'node_modules', '.bin', 'nuxt'), ['build'], { cwd: repoRoot })
  if (code !== 0) throw new ScriptError(`nuxt build failed (exit code ${code}); see its output above.`)
  if (!existsSync(join(outputDir, 'server', 'index.mjs'))) {
    throw new ScriptError('nuxt build finished but .output/server/index.mjs is missing.')
  }
  writeFileSync(stampFile, `${inputsHash}\n`)
  step(`Built in ${formatDuration(Date.now() - started)}`)
}
