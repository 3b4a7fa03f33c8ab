// What `npm run bench` needs in its throwaway database, written directly with knex (no demo
// seed, no API round trips): invented staff accounts, and competitions of N accepted, paid
// entries whose dossiers give few findings — no required documents, a collision-warning unit
// with firmware valid well past the contest and a flight recorder approved for all flights.
// Every tenth entry's firmware was last updated over a year before the first contest day, an
// advisory finding, so its tile reads caution after the grid check as a real field would.
import type { Knex } from 'knex'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { faiClass } from '../../shared/constants/classes'
import type { Role } from '../../shared/constants/roles'

export const BENCH_PASSWORD = 'bench-board-password'
export const BENCH_TIME_ZONE = 'Europe/Berlin'
const EMAIL_DOMAIN = 'bench.gridmark.example'

// The same driver and defaults as seeds/demo.ts (and nuxt-auth-utils' hashPassword), so the
// server's verifyPassword accepts the hash.
const hasher = new Hash(new Scrypt({}))

export interface BenchUser {
  id: string
  email: string
  name: string
}

/** The calendar date in the bench competitions' time zone (the day the grid checks are for). */
export function benchToday(at: Date = new Date()): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone: BENCH_TIME_ZONE, year: 'numeric', month: '2-digit', day: '2-digit' }).format(at)
}

export function shiftDay(day: string, n: number): string {
  const d = new Date(`${day}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + n)
  return d.toISOString().slice(0, 10)
}

async function insertInChunks<T>(db: Knex, table: string, rows: object[], returning: string[]): Promise<T[]> {
  const out: T[] = []
  for (let i = 0; i < rows.length; i += 500) {
    out.push(...await db(table).insert(rows.slice(i, i + 500)).returning(returning) as T[])
  }
  return out
}

let passwordHash: Promise<string> | undefined

/** Accounts `<tag>-001@…` … with the bench password; `name(i)` names each. */
export async function createBenchUsers(db: Knex, tag: string, count: number, name: (i: number) => string): Promise<BenchUser[]> {
  passwordHash ??= hasher.make(BENCH_PASSWORD)
  const hash = await passwordHash
  const rows = Array.from({ length: count }, (_, i) => ({
    email: `${tag}-${String(i + 1).padStart(4, '0')}@${EMAIL_DOMAIN}`,
    name: name(i),
    password_hash: hash,
    email_verified_at: new Date(),
  }))
  return insertInChunks<BenchUser>(db, 'users', rows, ['id', 'email', 'name'])
}

const LETTERS = 'ABCDEFGHJKLMNPRSTUVWXYZ'
const FIRST_NAMES = ['Ada', 'Bram', 'Cleo', 'Dov', 'Elin', 'Fenn', 'Greta', 'Hugo', 'Ines', 'Jory', 'Kaja', 'Lior', 'Mira', 'Nils', 'Orla', 'Piet']
const LAST_NAMES = ['Ashdown', 'Brackwater', 'Cairnfell', 'Dunmere', 'Eskholt', 'Fallowby', 'Greyling', 'Harrowfield', 'Ivesmoor', 'Jessop', 'Kettleby', 'Larkrise']

/** A competition ID of one to three letters and digits, different for each i below 5,290. */
function benchCompId(i: number): string {
  return `${LETTERS[i % 23]}${LETTERS[Math.floor(i / 23) % 23]}${Math.floor(i / 529) % 10}`
}

function benchRegistration(i: number): string {
  return `D-${LETTERS[i % 23]}${LETTERS[Math.floor(i / 23) % 23]}${LETTERS[Math.floor(i / 529) % 23]}${LETTERS[(i * 7) % 23]}`
}

export interface BenchCompetitionInput {
  name: string
  slug: string
  entries: number
  /** Today in BENCH_TIME_ZONE: contest days run from tomorrow for a week, so today is unscheduled. */
  today: string
  staff: { userId: string, role: Role }[]
}

export interface BenchCompetition {
  id: string
  entryIds: string[]
}

/** A competition with three classes, a week of contest days and `entries` accepted, paid entries, each with its own entrant. */
export async function createBenchCompetition(db: Knex, input: BenchCompetitionInput): Promise<BenchCompetition> {
  const first = shiftDay(input.today, 1)
  const last = shiftDay(input.today, 7)
  return db.transaction(async (trx) => {
    const [competition] = await trx('competitions').insert({
      slug: input.slug,
      name: input.name,
      airfield_name: 'Larkrise Down',
      time_zone: BENCH_TIME_ZONE,
      first_contest_day: first,
      last_contest_day: last,
      settings: { requiredDocumentKinds: [] },
    }).returning('id')
    const competitionId = competition.id as string
    await trx('competition_days').insert(Array.from({ length: 7 }, (_, i) => ({ competition_id: competitionId, day: shiftDay(first, i), kind: 'contest' })))

    const classes = await trx('classes').insert(['standard', '18m', 'club'].map((code, i) => {
      const fai = faiClass(code)!
      return { competition_id: competitionId, name: fai.name, code, max_span_m: fai.maxSpanM, max_mtom_kg: fai.maxMtomKg, water_ballast: fai.waterBallast, sort_order: i }
    })).returning(['id', 'max_mtom_kg'])

    const entrants = await createBenchUsers(trx, `${input.slug}-pilot`, input.entries, i => `${FIRST_NAMES[i % FIRST_NAMES.length]} ${LAST_NAMES[Math.floor(i / FIRST_NAMES.length) % LAST_NAMES.length]}`)
    const entryRows = entrants.map((u, i) => {
      const cls = classes[i % classes.length]!
      return {
        competition_id: competitionId,
        class_id: cls.id,
        entrant_user_id: u.id,
        status: 'accepted',
        payment_status: 'paid',
        pilot_name: u.name,
        glider_type: 'Tarn 15',
        registration: benchRegistration(i),
        comp_id: benchCompId(i),
        span_m: 15,
        mtom_kg: cls.max_mtom_kg ?? 450,
        empty_mass_kg: 250,
        submitted_at: trx.fn.now(),
        decided_at: trx.fn.now(),
      }
    })
    const entries = await insertInChunks<{ id: string }>(trx, 'entries', entryRows, ['id'])
    const radioBase = 0x3D0000 + (input.entries === 1000 ? 0x10000 : 0)
    const units = entries.flatMap((e, i) => [
      {
        entry_id: e.id,
        competition_id: competitionId,
        kind: 'collision-warning',
        model: 'Lapwing CW',
        serial: `LW-${10000 + i}`,
        firmware_version: '7.24',
        radio_id: (radioBase + i).toString(16).toUpperCase(),
        firmware_expires_on: shiftDay(input.today, 700),
        // Every tenth unit was last updated over a year before the contest: one advisory finding.
        firmware_updated_on: shiftDay(input.today, i % 10 === 0 ? -420 : -40),
      },
      {
        entry_id: e.id,
        competition_id: competitionId,
        kind: 'flight-recorder',
        model: 'Plover FR-2',
        serial: `PL-${20000 + i}`,
        firmware_version: '2.1',
        approval_level: 'all-flights',
      },
    ])
    await insertInChunks(trx, 'units', units, ['id'])
    await insertInChunks(trx, 'memberships', [
      ...input.staff.map(s => ({ user_id: s.userId, competition_id: competitionId, role: s.role })),
      ...entrants.map(u => ({ user_id: u.id, competition_id: competitionId, role: 'entrant' })),
    ], ['id'])
    return { id: competitionId, entryIds: entries.map(e => e.id) }
  })
}
