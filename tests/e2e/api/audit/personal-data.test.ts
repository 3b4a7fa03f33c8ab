/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The audit log keeps no personal values, against the real server and PostgreSQL: a change of
// a pilot's phone or emergency contact says which fields changed, never the values; names the
// engine quotes in findings are withheld; invitations keep no address; the pilot's own reason
// for withdrawing stays out. The audit page and the entry's timeline still read well. And, with
// the demo's own values read from its rows, no audit row anywhere holds a demo pilot's phone,
// emergency contact, licence number or address.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { openToday } from '../../../support/board'
import { auditRows } from '../../../support/entries'
import { gridEntry, gridWorld, todayIn, type GridWorld } from '../../../support/grid'
import { DEMO_COMPETITION } from '../../../../seeds/demo-data'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

/** The personal values among the texts, ignoring case. */
function found(texts: readonly string[], values: readonly string[]): string[] {
  const all = texts.join('\n').toLowerCase()
  return values.filter(v => all.includes(v.toLowerCase()))
}

/** The details of every row of the whole audit log, as text. */
async function everyAuditDetail(): Promise<string[]> {
  const rows = await testDb()('audit_log').select(testDb().raw('details::text as text')) as { text: string }[]
  return rows.map(r => r.text)
}

let w: GridWorld
let entryId: string
const entryPath = () => `${w.base}/entries/${entryId}`
// The values this file writes through the API, scanned for at the end as well.
const PHONE = '+44 7700 900777'
const CONTACT = 'Robin Reachable, +44 7700 900888'
const NEW_NAME = 'Renata Quickfall'
const INVITED = uniqueEmail('audit-invitee')
const OWN_REASON = 'My knee needs an operation next week.'

beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Personal Data Cup')
  entryId = await gridEntry(w)
  await openToday(w)
})

describe('a change of personal fields', () => {
  it('says which fields changed, not the values; the audit page reads it', async () => {
    const res = await w.entrant.client.request('PATCH', entryPath(), { pilotPhone: PHONE, emergencyContact: CONTACT, spanM: 15.5 })
    expect(res.status).toBe(200)
    expect(res.body.entry).toMatchObject({ pilotPhone: PHONE, emergencyContact: CONTACT })
    const rows = await auditRows(entryId, 'entry.updated')
    expect(rows.map(r => r.details)).toEqual([
      { field: 'pilotPhone', changed: true },
      { field: 'emergencyContact', changed: true },
      { field: 'spanM', from: 15, to: 15.5 },
    ])
    // The former values too (entryBody's), not only the new ones.
    const values = [PHONE, CONTACT, '+44 7700 900123', 'Pat Entrant, +44 7700 900456']
    expect(found(rows.map(r => JSON.stringify(r.details)), values)).toEqual([])

    const page = await w.organiser.client.get(`${w.base}/audit?entryId=${entryId}&action=entry.updated`)
    expect(page.status).toBe(200)
    expect(page.body.rows.map((r: any) => r.details.field).sort()).toEqual(['emergencyContact', 'pilotPhone', 'spanM'])
    expect(found([JSON.stringify(page.body)], values)).toEqual([])
  })

  it('withholds the names a finding quotes, in its change and in a waiver; the timeline still says what changed', async () => {
    // The recorder's declaration names Erin Entrant; the entry now names someone else.
    const res = await w.organiser.client.request('PATCH', entryPath(), { pilotName: NEW_NAME })
    expect(res.status).toBe(200)
    const [changed] = (await auditRows(entryId, 'findings.changed')).slice(-1)
    expect(changed.details.added.map((f: any) => f.checkId)).toContain('declaration.matches-entry')
    const declaration = changed.details.added.find((f: any) => f.checkId === 'declaration.matches-entry')
    expect(declaration.reason).toContain('names the pilot “…”, the entry says “…”')
    expect(found([JSON.stringify(changed.details)], [NEW_NAME, 'Erin Entrant'])).toEqual([])

    const waiver = await w.director.client.post(`${entryPath()}/waivers`, {
      scope: 'day', day: todayIn(), checkId: 'declaration.matches-entry', unitId: declaration.unitId, subject: declaration.subject,
      reason: 'Declaration read on the logger by hand',
    })
    expect(waiver.status, JSON.stringify(waiver.body)).toBe(201)
    const [waived] = await auditRows(entryId, 'director.waiver')
    expect(waived.details).toMatchObject({ checkId: 'declaration.matches-entry', reason: 'Declaration read on the logger by hand' })
    expect(waived.details.finding).toContain('“…”')
    expect(found([JSON.stringify(waived.details)], [NEW_NAME, 'Erin Entrant'])).toEqual([])

    const timeline = await w.entrant.client.get(`${entryPath()}/timeline`)
    expect(timeline.status).toBe(200)
    const summaries = timeline.body.items.map((i: any) => i.summary)
    expect(summaries).toContainEqual(expect.stringContaining('Findings changed: new: declaration.matches-entry (advisory)'))
    expect(summaries).toContainEqual(expect.stringMatching(/^Waived declaration\.matches-entry for .+: Declaration read on the logger by hand$/))
    expect(found([JSON.stringify(timeline.body)], [PHONE, CONTACT, NEW_NAME])).toEqual([])
  })
})

describe('other writers', () => {
  it('an invitation and its withdrawal keep the role, not the address', async () => {
    const res = await w.organiser.client.post(`${w.base}/invitations`, { email: INVITED, role: 'scrutineer' })
    expect(res.status).toBe(201)
    const id = res.body.invitation.id
    expect((await w.organiser.client.request('DELETE', `${w.base}/invitations/${id}`)).status).toBe(200)
    const rows = await auditRows(id)
    expect(rows.map(r => [r.action, r.details.role])).toEqual([['invitation.create', 'scrutineer'], ['invitation.revoke', 'scrutineer']])
    expect(found(rows.map(r => JSON.stringify(r.details)), [INVITED])).toEqual([])
  })

  it('a pilot withdrawing with a reason: the log says a reason was given, not what it said', async () => {
    const other = await gridEntry(w)
    const res = await w.entrant.client.post(`${w.base}/entries/${other}/withdraw`, { reason: OWN_REASON })
    expect(res.status).toBe(200)
    const [row] = await auditRows(other, 'entry.withdrawn')
    expect(row.details).toMatchObject({ by: 'entrant', reasonGiven: true })
    expect(row.details.reason).toBeUndefined()
  })
})

describe('the whole audit log', () => {
  it('holds none of the demo pilots’ phones, emergency contacts, licence numbers or addresses, nor this file’s', async () => {
    const db = testDb()
    const demo = await db('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
    expect(demo, 'the demo is seeded').toBeTruthy()
    const entries = await db('entries').where({ competition_id: demo.id })
      .select('pilot_phone', 'emergency_contact', 'pilot_licence_number') as { pilot_phone: string | null, emergency_contact: string | null, pilot_licence_number: string | null }[]
    const emails = await db('users as u').whereIn('u.id', db('memberships').where({ competition_id: demo.id }).select('user_id'))
      .orWhereIn('u.id', db('entries').where({ competition_id: demo.id }).select('entrant_user_id')).pluck('u.email') as string[]
    const demoValues = [...new Set([...entries.flatMap(e => [e.pilot_phone, e.emergency_contact, e.pilot_licence_number]), ...emails])]
      .filter((v): v is string => !!v)
    expect(entries.length).toBeGreaterThan(0)
    expect(demoValues.filter(v => v.includes('@')).length).toBeGreaterThan(5)
    expect(demoValues.filter(v => v.startsWith('+')).length).toBeGreaterThan(5)

    const texts = await everyAuditDetail()
    expect(texts.length).toBeGreaterThan(0)
    expect(found(texts, demoValues)).toEqual([])
    expect(found(texts, [PHONE, CONTACT, NEW_NAME, INVITED, OWN_REASON])).toEqual([])
  })
})
