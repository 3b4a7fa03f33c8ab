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

/** A class of its own in a competition (defaults: Standard limits, fee 300.00). */
export async function createClass(competitionId: string, name = 'Standard', entryFeeMinor = 30000) {
  const [row] = await testDb()('classes')
    .insert({ competition_id: competitionId, name, code: 'standard', max_span_m: 15, max_mtom_kg: 525, entry_fee_minor: entryFeeMinor })
    .returning('id')
  return row.id as string
}

/** An entry of the given entrant in a class, arranged directly in the database. */
export async function createEntry(input: {
  competitionId: string
  classId: string
  entrantUserId: string
  compId?: string
  status?: string
}) {
  const [row] = await testDb()('entries')
    .insert({
      competition_id: input.competitionId,
      class_id: input.classId,
      entrant_user_id: input.entrantUserId,
      status: input.status ?? 'draft',
      pilot_name: 'Test Pilot',
      glider_type: 'Test Glider 15',
      registration: `D-${Math.floor(1000 + Math.random() * 9000)}`,
      comp_id: input.compId ?? Math.random().toString(36).slice(2, 5).toUpperCase(),
    })
    .returning('id')
  return row.id as string
}
