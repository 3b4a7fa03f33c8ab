// The demo's first contest day, played through the app's own API once the server is up, so
// that every state of the board shows on first start: the director opens today as a practice
// day, two scrutineers check part of the field on the grid (one glider fails an item, one is
// weighed), the director holds one glider and waives one finding for the day; the rest wait
// unchecked. It runs once per demo database (never again after any day has been opened), and
// through the API rather than the seed so findings, readiness, audit log and e-mail are what
// the product itself makes of it.
import { randomUUID } from 'node:crypto'
import knex from 'knex'
import { createKnexConfig } from '../../knexfile'
import { DEMO_COMPETITION, DEMO_PASSWORD } from '../../seeds/demo-data'
import { DEFAULT_CHECKLIST } from '../../shared/constants/grid'

class Caller {
  cookie = ''
  constructor(readonly baseUrl: string) {}

  async call<T>(method: string, path: string, body?: unknown): Promise<T> {
    const res = await fetch(this.baseUrl + path, {
      method,
      headers: { 'content-type': 'application/json', 'accept': 'application/json', ...(this.cookie ? { cookie: this.cookie } : {}) },
      body: body === undefined ? undefined : JSON.stringify(body),
    })
    const setCookie = res.headers.getSetCookie().find(c => c.startsWith('gridmark-session='))
    if (setCookie) this.cookie = setCookie.split(';')[0]!
    const text = await res.text()
    if (res.status >= 400) throw new Error(`${method} ${path} answered ${res.status}: ${text.slice(0, 300)}`)
    return (text ? JSON.parse(text) : null) as T
  }

  static async signIn(baseUrl: string, email: string): Promise<Caller> {
    const c = new Caller(baseUrl)
    await c.call('POST', '/api/auth/login', { email, password: DEMO_PASSWORD })
    return c
  }
}

interface Plan {
  compId: string
  by: 'first' | 'second'
  fail?: { item: string, note: string, notes: string }
  weighKg?: [number, number]
}

// Who is checked, by whom, and how it goes (the seeded problems do the rest: K7, B2, D6, E2, G5,
// P6 and S2 are held by their findings, T3 and H8 are cautions). P6 is weighed again with its
// pilot's recorded mass: 452 kg on the scales + 91 kg = 543 kg, over the Standard class's 525 kg.
const CHECKS: Plan[] = [
  { compId: 'K7', by: 'first' },
  { compId: 'T3', by: 'first' },
  { compId: 'A1', by: 'first' },
  { compId: 'B2', by: 'first' },
  { compId: 'H8', by: 'first' },
  { compId: 'D6', by: 'first' },
  { compId: 'E2', by: 'first' },
  { compId: 'G5', by: 'first' },
  { compId: 'J3', by: 'second' },
  { compId: 'L8', by: 'second' },
  { compId: 'N1', by: 'second', fail: { item: 'cwu-operating', note: 'No collision-warning unit fitted', notes: 'Sent back to the trailer lines to fit the unit.' } },
  { compId: 'P6', by: 'second', weighKg: [420, 32] },
  { compId: 'Q9', by: 'second' },
  { compId: 'S2', by: 'second' },
]

export async function playDemoDay(baseUrl: string, databaseUrl: string): Promise<{ played: boolean }> {
  const db = knex(createKnexConfig(databaseUrl))
  let competitionId: string
  let entryIds: Map<string, string>
  try {
    const competition = await db('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
    if (!competition) return { played: false }
    const opened = await db('board_days').where({ competition_id: competition.id }).first('day')
    if (opened) return { played: false }
    competitionId = competition.id
    const rows = await db('entries').where({ competition_id: competitionId, status: 'accepted' }).select('id', 'comp_id')
    entryIds = new Map(rows.map(r => [r.comp_id as string, r.id as string]))
  }
  finally {
    await db.destroy()
  }

  const base = `/api/competitions/${competitionId}`
  const [director, first, second] = await Promise.all([
    Caller.signIn(baseUrl, 'director@gridmark.example'),
    Caller.signIn(baseUrl, 'scrutineer@gridmark.example'),
    Caller.signIn(baseUrl, 'scrutineer2@gridmark.example'),
  ])
  const { day } = await director.call<{ day: { day: string } }>('POST', `${base}/days`, { kind: 'practice' })

  const started = Date.now() - CHECKS.length * 3 * 60_000
  for (const [i, plan] of CHECKS.entries()) {
    const entryId = entryIds.get(plan.compId)
    if (!entryId) continue
    const scrutineer = plan.by === 'first' ? first : second
    await scrutineer.call('POST', `${base}/grid-checks`, {
      idempotencyKey: randomUUID(),
      entryId,
      day: day.day,
      checkedAt: new Date(started + i * 3 * 60_000).toISOString(),
      answers: DEFAULT_CHECKLIST.map(item => ({
        itemId: item.id,
        result: item.id === plan.fail?.item ? 'fail' : 'pass',
        ...(item.id === plan.fail?.item ? { note: plan.fail.note } : {}),
      })),
      ...(plan.weighKg
        ? { weighIn: { units: 'kg-m', readings: [{ point: 'main-wheel', weight: plan.weighKg[0], arm: 0.21 }, { point: 'tail-wheel', weight: plan.weighKg[1], arm: 4.6 }] } }
        : {}),
      notes: plan.fail?.notes ?? '',
      foundBy: i % 3 === 0 ? 'code' : 'scan',
    })
  }

  const s2 = entryIds.get('S2')
  if (s2) await director.call('POST', `${base}/entries/${s2}/hold`, { reason: 'Canopy lock does not engage fully; see the director before launch.' })
  const g5 = entryIds.get('G5')
  if (g5) {
    const detail = await director.call<{ findings: { checkId: string, unitId?: string, subject?: string, severity: string }[] }>('GET', `${base}/board/entries/${g5}`)
    const declaration = detail.findings.find(f => f.checkId === 'declaration.matches-entry' && f.severity === 'blocking')
    if (declaration) {
      await director.call('POST', `${base}/entries/${g5}/waivers`, {
        scope: 'day',
        checkId: declaration.checkId,
        ...(declaration.unitId ? { unitId: declaration.unitId } : {}),
        ...(declaration.subject ? { subject: declaration.subject } : {}),
        reason: 'Declaration corrected on the recorder in front of the scrutineer; new IGC file to follow.',
      })
    }
  }
  return { played: true }
}
