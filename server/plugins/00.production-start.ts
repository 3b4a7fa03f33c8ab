// The production start: the built server outside the demo (NUXT_DEMO_MODE unset), however it is
// started (`npm run serve`, or node .output/server/index.mjs). Before it listens it refuses to
// run without its own secrets and a database; once migrations have run it refuses to run while
// any account still has the demo's published password, and requests wait for that answer.
// Named 00.… so it runs before the other plugins start anything.
import { fileKeyProblems } from '#domain/files/file-crypt'
import { accountsWithDemoPassword } from '#domain/people/demo-password'
import { configuredSecrets, isDemoMode, SECRET_MIN_LENGTH, secretProblems } from '#domain/people/secrets'
import { whenSchemaReady } from '../utils/db'

const RETRY_MS = 5000
/** The longest a request waits for the account check (e.g. while the database is down). */
const REQUEST_WAIT_MS = 10_000

const SETTINGS_HINT = [
  `Give each of NUXT_SESSION_PASSWORD, NUXT_TAG_SECRET and NUXT_INVITATION_SECRET its own random value of at least ${SECRET_MIN_LENGTH} characters`,
  '(e.g. `openssl rand -base64 36`), NUXT_FILES_KEY 32 random bytes (`openssl rand -base64 32`; keep it: the stored files',
  'cannot be read without it), and DATABASE_URL the database. See "Production" in README.md; `npm start` runs the demo instead.',
]

/** Says why on stderr and exits non-zero (before listening, for the settings). */
function refuse(lines: string[], hint: string[] = []): never {
  console.error(['', '✖ Gridmark will not start in production:', ...lines.map(l => `  - ${l}`), ...hint, ''].join('\n'))
  process.exit(1)
}

export default defineNitroPlugin((nitroApp) => {
  if (import.meta.dev || isDemoMode()) return

  const config = useRuntimeConfig()
  const problems = [
    ...secretProblems(configuredSecrets()),
    ...fileKeyProblems({ key: String(config.filesKey || ''), oldKeys: String(config.filesOldKeys || '') }),
  ]
  if (!process.env.DATABASE_URL && !config.databaseUrl) problems.push('DATABASE_URL (or NUXT_DATABASE_URL) is not set.')
  if (problems.length > 0) refuse(problems, SETTINGS_HINT)

  let stopped = false
  const checked = new Promise<void>((resolve) => {
    const attempt = async () => {
      try {
        await whenSchemaReady()
        const emails = await accountsWithDemoPassword()
        if (emails.length > 0) {
          const shown = emails.length > 5 ? [...emails.slice(0, 5), `and ${emails.length - 5} more`] : emails
          refuse([
            `${emails.length} account${emails.length === 1 ? ' still has' : 's still have'} the demo's published password: ${shown.join(', ')}.`,
            'This looks like a database seeded by `npm start`: point DATABASE_URL at a new, empty database',
            '(the demo is never seeded by a production start), or remove these accounts first.',
          ])
        }
        resolve()
      }
      catch (err) {
        console.warn(`[gridmark] could not check the accounts for the demo password (${(err as Error).message}); retrying in ${RETRY_MS / 1000} s`)
        if (!stopped) setTimeout(attempt, RETRY_MS)
      }
    }
    void attempt()
  })

  nitroApp.hooks.hook('request', async () => {
    let timer: ReturnType<typeof setTimeout> | undefined
    await Promise.race([checked, new Promise<void>((resolve) => {
      timer = setTimeout(resolve, REQUEST_WAIT_MS)
    })])
    clearTimeout(timer)
  })
  nitroApp.hooks.hook('close', () => {
    stopped = true
  })
})
