// `npm run admin:create -- <email>` run for real against the test database: it creates a site
// administrator with no usable password and prints a one-time link that sets one; it works once.
import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { afterAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
const root = fileURLToPath(new URL('../../../..', import.meta.url))
afterAll(closeTestDb)

/** Runs the command as `npm run admin:create -- …` would (its script, through tsx). */
function adminCreate(args: string[]): Promise<{ code: number | null, output: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/admin-create.ts', ...args], {
      cwd: root,
      // The production way of naming the database; the link points at the test server.
      env: { ...process.env, NUXT_DATABASE_URL: process.env.DATABASE_URL!, DATABASE_URL: '', NUXT_SITE_URL: baseUrl },
      stdio: ['ignore', 'pipe', 'pipe'],
    })
    let output = ''
    child.stdout.on('data', (d) => { output += d })
    child.stderr.on('data', (d) => { output += d })
    child.once('error', reject)
    child.once('exit', code => resolve({ code, output }))
  })
}

describe('admin:create', () => {
  it('creates a site administrator once, whose printed link sets the password', async () => {
    const email = uniqueEmail('first-admin')
    const first = await adminCreate([email, '--name', 'Rhona Fairweather'])
    expect(first.code, first.output).toBe(0)
    const link = first.output.split('\n').find(l => l.startsWith(`${baseUrl}/password/reset?token=`))
    expect(link, first.output).toBeDefined()

    const row = await testDb()('users').where({ email }).first()
    expect(row).toMatchObject({ name: 'Rhona Fairweather', is_admin: true, email_verified_at: null })

    // No password works before the link sets one.
    for (const password of ['', 'Site administrator', email]) {
      expect((await new ApiClient(baseUrl).post('/api/auth/login', { email, password: password || 'x' })).status).toBe(401)
    }

    const again = await adminCreate([email])
    expect(again.code).not.toBe(0)
    expect(again.output).toContain(`An account with ${email} exists already`)
    expect(await testDb()('users').whereRaw('lower(email) = ?', [email]).count()).toEqual([{ count: '1' }])

    const token = new URL(link!).searchParams.get('token')!
    const set = await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token, password: 'the office chooses this one' })
    expect(set.status).toBe(200)
    const admin = new ApiClient(baseUrl)
    expect((await admin.post('/api/auth/login', { email, password: 'the office chooses this one' })).status).toBe(200)
    expect((await admin.get('/api/me')).body.user).toMatchObject({ email, isAdmin: true, emailVerified: true })

    const reused = await new ApiClient(baseUrl).post('/api/auth/password-reset/confirm', { token, password: 'somebody else tries' })
    expect(reused).toMatchObject({ status: 400, body: { message: MESSAGES.tokenUsed } })
  }, 60_000)

  it('refuses without an e-mail address, changing nothing', async () => {
    const res = await adminCreate(['not-an-address'])
    expect(res.code).not.toBe(0)
    expect(res.output).toContain('not-an-address is not an e-mail address')
  }, 60_000)
})
