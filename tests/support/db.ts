// Direct access to the throwaway test database, to arrange what a test needs.
import knex, { type Knex } from 'knex'
import { createKnexConfig } from '../../knexfile'

let db: Knex | undefined

export function testDb(): Knex {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.')
  db ??= knex(createKnexConfig(process.env.DATABASE_URL))
  return db
}

export async function closeTestDb(): Promise<void> {
  await db?.destroy()
  db = undefined
}

/** A competition of its own for one test, with the given members. */
export async function createCompetition(name: string, members: { userId: string, role: string }[] = []) {
  const slug = `${name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}-${Math.random().toString(36).slice(2, 8)}`
  const [row] = await testDb()('competitions')
    .insert({ slug, name, airfield_name: 'Test Field', time_zone: 'Europe/Berlin', first_contest_day: '2027-05-01', last_contest_day: '2027-05-07' })
    .returning('id')
  if (members.length) {
    await testDb()('memberships').insert(members.map(m => ({ user_id: m.userId, competition_id: row.id, role: m.role })))
  }
  return row.id as string
}
