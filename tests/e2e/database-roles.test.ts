// The private cluster `npm start` and `npm test` make asks every connection for a password, and
// the app connects as a role that owns its database and tables but is not a superuser.
import { spawn } from 'node:child_process'
import { join } from 'node:path'
import pg from 'pg'
import { afterAll, describe, expect, it } from 'vitest'
import { closeTestDb, testDb } from '../support/db'

afterAll(closeTestDb)

const appUrl = () => new URL(process.env.DATABASE_URL!)

/** psql without any password (-w: never ask; no password file), as the given role, over TCP. */
function psqlWithoutPassword(role: string): Promise<{ code: number | null, output: string }> {
  const url = appUrl()
  const env = { PATH: process.env.PATH, PGPASSFILE: '/dev/null', PGCONNECT_TIMEOUT: '5' }
  const child = spawn(join(process.env.GRIDMARK_PG_BIN!, 'psql'), ['-X', '-w', '-h', '127.0.0.1', '-p', url.port, '-U', role, '-d', url.pathname.slice(1), '-c', 'select 1'], { env, cwd: '/' })
  let output = ''
  child.stdout.on('data', (d) => { output += d })
  child.stderr.on('data', (d) => { output += d })
  return new Promise(resolve => child.on('close', code => resolve({ code, output })))
}

describe('the database cluster', () => {
  it('lets the app in as its own role, which owns the tables and is not a superuser', async () => {
    const { rows } = await testDb().raw(`
      SELECT current_user AS role, r.rolsuper, (SELECT tableowner FROM pg_tables WHERE schemaname = 'public' AND tablename = 'users') AS users_owner,
             (SELECT pg_get_userbyid(datdba) FROM pg_database WHERE datname = current_database()) AS database_owner
      FROM pg_roles r WHERE r.rolname = current_user`)
    expect(rows).toEqual([{ role: process.env.GRIDMARK_TEST_APP_ROLE, rolsuper: false, users_owner: process.env.GRIDMARK_TEST_APP_ROLE, database_owner: process.env.GRIDMARK_TEST_APP_ROLE }])
    await expect(testDb().raw('ALTER SYSTEM SET work_mem = \'8MB\'')).rejects.toThrow(/permission denied|must be superuser/)
  })

  it('refuses a connection over TCP without a password, for the app and for the superuser', async () => {
    for (const role of [process.env.GRIDMARK_TEST_APP_ROLE!, new URL(process.env.GRIDMARK_TEST_SUPERUSER_URL!).username]) {
      const { code, output } = await psqlWithoutPassword(role)
      expect(code, output).toBe(2)
      expect(output).toMatch(/no password supplied/)
    }
  })

  it('refuses a wrong password', async () => {
    const url = appUrl()
    url.password = 'not-the-password'
    const client = new pg.Client({ connectionString: url.toString() })
    await expect(client.connect()).rejects.toMatchObject({ code: '28P01' })
    await client.end().catch(() => {})
  })
})
