// The production start (`npm run serve`, the built server without NUXT_DEMO_MODE): it refuses to
// run, before listening, without its own three secrets of ≥ 32 characters, a files key or a database, and
// while an account has the demo's password; on an empty database it migrates, answers health and
// seeds nothing.
import { spawn } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { fileURLToPath } from 'node:url'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import knex, { type Knex } from 'knex'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createKnexConfig } from '../../knexfile'
import { migrationSource } from '../../migrations/index'
import { DEMO_PASSWORD } from '../../shared/constants/demo'
import { closeTestDb, testDb } from '../support/db'
import { freePort } from '../support/server'

const root = fileURLToPath(new URL('../..', import.meta.url))
const database = `gridmark_production_${process.pid}`
const secret = () => randomBytes(30).toString('base64url') // 40 characters
const hasher = new Hash(new Scrypt({}))

let url: string
let db: Knex

interface Started {
  /** Resolves when the process ends: its exit code and everything it printed. */
  exited: Promise<{ code: number | null, output: string }>
  /** Resolves with the base URL once /api/health answers 200; rejects if the process exits first. */
  healthy: Promise<string>
  stop: () => Promise<void>
  output: () => string
}

/** `npm run serve` with only the given settings (nothing of the test server's environment). */
async function serve(settings: Record<string, string | undefined>): Promise<Started> {
  const port = await freePort()
  const env: NodeJS.ProcessEnv = { PATH: process.env.PATH, HOME: process.env.HOME, HOST: '127.0.0.1', PORT: String(port), NUXT_UPLOADS_DIR: process.env.NUXT_UPLOADS_DIR }
  for (const [key, value] of Object.entries(settings)) if (value !== undefined) env[key] = value
  const child = spawn(process.execPath, ['scripts/serve.mjs'], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] })
  let output = ''
  child.stdout.on('data', (d) => { output += d })
  child.stderr.on('data', (d) => { output += d })
  const exited = new Promise<{ code: number | null, output: string }>((resolve) => {
    child.on('exit', code => setImmediate(() => resolve({ code, output })))
  })
  const base = `http://127.0.0.1:${port}`
  const healthy = (async () => {
    const deadline = Date.now() + 25_000
    while (Date.now() < deadline) {
      if (child.exitCode !== null) throw new Error(`The production start exited (${child.exitCode}):\n${output}`)
      try {
        if ((await fetch(`${base}/api/health`)).status === 200) return base
      }
      catch { /* not listening yet */ }
      await new Promise(r => setTimeout(r, 150))
    }
    throw new Error(`The production start did not answer /api/health within 25 s:\n${output}`)
  })()
  healthy.catch(() => {}) // awaited by the tests that expect it
  return {
    exited,
    healthy,
    output: () => output,
    stop: async () => {
      if (child.exitCode === null) child.kill('SIGTERM')
      await exited
    },
  }
}

function goodSettings(): Record<string, string> {
  return { DATABASE_URL: url, NUXT_SESSION_PASSWORD: secret(), NUXT_TAG_SECRET: secret(), NUXT_INVITATION_SECRET: secret(), NUXT_FILES_KEY: randomBytes(32).toString('base64') }
}

/**
 * Starts with these settings and expects a refusal: non-zero exit and the reason; a refusal for
 * the settings comes before the server listens.
 */
async function expectRefusal(settings: Record<string, string | undefined>, reason: RegExp, { beforeListening = true } = {}) {
  const started = await serve(settings)
  const { code, output } = await started.exited
  expect(code).not.toBe(0)
  expect(output).toMatch(reason)
  if (beforeListening) expect(output).not.toMatch(/Listening on/)
  return output
}

beforeAll(async () => {
  await testDb().raw(`DROP DATABASE IF EXISTS ${database} WITH (FORCE)`)
  await testDb().raw(`CREATE DATABASE ${database}`)
  const parsed = new URL(process.env.DATABASE_URL!)
  parsed.pathname = `/${database}`
  url = parsed.toString()
  db = knex(createKnexConfig(url))
})

afterAll(async () => {
  await db?.destroy()
  await testDb().raw(`DROP DATABASE IF EXISTS ${database} WITH (FORCE)`)
  await closeTestDb()
})

describe('the production start refuses to run without its settings', () => {
  for (const variable of ['NUXT_SESSION_PASSWORD', 'NUXT_TAG_SECRET', 'NUXT_INVITATION_SECRET']) {
    it(`without ${variable}`, async () => {
      await expectRefusal({ ...goodSettings(), [variable]: undefined }, new RegExp(`${variable} is not set`))
    })

    it(`with ${variable} shorter than 32 characters`, async () => {
      await expectRefusal({ ...goodSettings(), [variable]: 'x'.repeat(31) }, new RegExp(`${variable} is 31 characters long; it needs at least 32`))
    })
  }

  it('with two secrets the same', async () => {
    const settings = goodSettings()
    const output = await expectRefusal({ ...settings, NUXT_INVITATION_SECRET: settings.NUXT_SESSION_PASSWORD }, /NUXT_SESSION_PASSWORD and NUXT_INVITATION_SECRET are the same/)
    expect(output).not.toMatch(/NUXT_TAG_SECRET[^\n]* are the same/)
  })

  it('without NUXT_FILES_KEY, or with one that is not 32 bytes in hex or base64', async () => {
    await expectRefusal({ ...goodSettings(), NUXT_FILES_KEY: undefined }, /NUXT_FILES_KEY is not set/)
    const output = await expectRefusal({ ...goodSettings(), NUXT_FILES_KEY: 'correct horse battery staple' }, /NUXT_FILES_KEY is not a key: it must be 32 random bytes written as 64 hex digits or 44 base64 characters/)
    expect(output).not.toContain('correct horse')
    await expectRefusal({ ...goodSettings(), NUXT_FILES_OLD_KEYS: randomBytes(16).toString('hex') }, /NUXT_FILES_OLD_KEYS is not a key/)
  })

  it('without a database', async () => {
    await expectRefusal({ ...goodSettings(), DATABASE_URL: undefined }, /DATABASE_URL \(or NUXT_DATABASE_URL\) is not set/)
  })

  it('in demo mode', async () => {
    await expectRefusal({ ...goodSettings(), NUXT_DEMO_MODE: 'true' }, /NUXT_DEMO_MODE is set, but `npm run serve` is the production start/)
  })

  it('and none of these refusals touched the database', async () => {
    const { rows } = await db.raw(`SELECT count(*)::int AS n FROM pg_tables WHERE schemaname = 'public'`)
    expect(rows[0].n).toBe(0)
  })
})

describe('the production start on an empty database', () => {
  it('migrates, answers /api/health and seeds nothing', async () => {
    const started = await serve(goodSettings())
    try {
      const base = await started.healthy
      expect(started.output()).toMatch(/Listening on/) // what the refusals above never print
      const health = await fetch(`${base}/api/health`)
      expect(await health.json()).toEqual({ status: 'ok', db: 'ok' })
      const applied = (await db('knex_migrations').orderBy('id').pluck('name')) as string[]
      expect(applied).toEqual(await migrationSource.getMigrations([]))
      for (const table of ['users', 'competitions', 'entries', 'memberships']) {
        expect(await db(table).count({ n: '*' }).first(), table).toEqual({ n: '0' })
      }
      // Nobody can sign in: there is no account at all, the demo's least.
      const login = await fetch(`${base}/api/auth/login`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'origin': base },
        body: JSON.stringify({ email: 'admin@gridmark.example', password: DEMO_PASSWORD }),
      })
      expect(login.status).toBe(401)
    }
    finally {
      await started.stop()
    }
  })

  it('refuses to run while an account has the demo password, and runs once it is gone', async () => {
    await db('users').insert([
      { email: 'kept@airfield.example', name: 'Kept Pilot', password_hash: await hasher.make('a password of her own') },
      { email: 'seeded@airfield.example', name: 'Seeded Admin', password_hash: await hasher.make(DEMO_PASSWORD), is_admin: true },
    ])
    // The accounts are checked once migrations have run, so this refusal comes after listening.
    const output = await expectRefusal(goodSettings(), /1 account still has the demo's published password: seeded@airfield\.example\./, { beforeListening: false })
    expect(output).not.toContain('kept@airfield.example')

    await db('users').where({ email: 'seeded@airfield.example' }).delete()
    const started = await serve(goodSettings())
    try {
      await started.healthy
      expect(await db('users').pluck('email')).toEqual(['kept@airfield.example'])
    }
    finally {
      await started.stop()
    }
  })
})
