/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// The rulebook route through the built server: every member reads every check of the catalogue
// with the competition's own settings (and sees a changed rule at once); non-members learn
// nothing; a malformed address is a 4xx in words. Then the e-mails about a hold, a release and
// a glider held on the grid: each finding links to its rule, and the hardware caution is there
// in full.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { CATALOGUE, HARDWARE_CAUTION } from '#shared/engine'
import { closeTestDb, createClass, testDb } from '../../../support/db'
import { competitionWithRoles, type RoleClients } from '../../../support/setup'
import { checkBody, gridEntry, gridWorld, todayIn, type GridWorld } from '../../../support/grid'
import { openToday } from '../../../support/board'
import { waitForMail } from '../../../support/mail'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let r: RoleClients
let path: string
beforeAll(async () => {
  r = await competitionWithRoles(baseUrl, 'Rulebook Cup')
  await createClass(r.competitionId, 'Standard')
  await testDb()('classes').insert({ competition_id: r.competitionId, name: 'Club', code: 'club', max_span_m: null, max_mtom_kg: null, water_ballast: false, entry_fee_minor: 20000, sort_order: 1 })
  await testDb()('firmware_releases').insert([
    { competition_id: r.competitionId, unit_family: 'Example CW-2', version: '7.20', expires_on: '2027-10-31' },
    { competition_id: r.competitionId, unit_family: 'Example CW-2', version: '7.24', expires_on: '2028-03-31' },
  ])
  path = `/api/competitions/${r.competitionId}/checks`
})

const checksOf = (body: any): any[] => body.families.flatMap((f: any) => f.checks)
const checkOf = (body: any, id: string) => checksOf(body).find(c => c.id === id)
const settingOf = (body: any, checkId: string, key: string) => checkOf(body, checkId).settings.find((s: any) => s.key === key)

describe('GET /api/competitions/:id/checks', () => {
  it('answers every member with every check of the catalogue, in catalogue order within each family', async () => {
    for (const client of [r.entrant, r.scrutineer, r.director, r.organiser, r.admin]) {
      const res = await client.get(path)
      expect(res.status).toBe(200)
      expect(res.body.competitionId).toBe(r.competitionId)
      const ids = checksOf(res.body).map(c => c.id)
      expect([...ids].sort()).toEqual(CATALOGUE.map(c => c.id).sort())
      for (const f of res.body.families) {
        const positions = f.checks.map((c: any) => CATALOGUE.findIndex(k => k.id === c.id))
        expect(positions).toEqual([...positions].sort((a: number, b: number) => a - b))
      }
    }
  })

  it('gives each check its rule, severity, source and hardware flag, as the catalogue has them', async () => {
    const { body } = await r.entrant.get(path)
    for (const c of CATALOGUE) {
      expect(checkOf(body, c.id)).toMatchObject({ rule: c.rule, severity: c.severity, source: c.source })
    }
    expect(body.families.map((f: any) => f.title)).toContain('Collision-warning units')
    expect(checkOf(body, 'firmware.valid-through-contest').touchesHardware).toBe(true)
    expect(checkOf(body, 'entry.paid').touchesHardware).toBe(false)
  })

  it('shows the competition’s settings: its rules, its classes’ limits, its firmware catalogue', async () => {
    const { body } = await r.scrutineer.get(path)
    expect(settingOf(body, 'firmware.valid-through-contest', 'firmwareMarginDays')).toMatchObject({ value: 0, text: '0 days' })
    expect(settingOf(body, 'documents.required', 'requiredDocumentKinds').value).toEqual(['airworthiness', 'insurance', 'licence', 'medical'])
    expect(checkOf(body, 'mass.class-limit').settings.map((s: any) => [s.label, s.text])).toEqual([
      ['Standard: maximum take-off mass', '525 kg'],
      ['Club: maximum take-off mass', 'No limit set'],
    ])
    expect(settingOf(body, 'firmware.catalogue-mismatch', 'firmwareReleaseCount')).toMatchObject({ value: 2, text: '2 releases' })
    expect(checkOf(body, 'radio-id.format').settings).toEqual([])
  })

  it('reflects a rule the organiser changes, at once', async () => {
    const patched = await r.organiser.request('PATCH', `/api/competitions/${r.competitionId}`, { rules: { firmwareMarginDays: 5, recordersRequired: 2 } })
    expect(patched.status).toBe(200)
    const { body } = await r.entrant.get(path)
    expect(settingOf(body, 'firmware.valid-through-contest', 'firmwareMarginDays')).toMatchObject({ value: 5, text: '5 days' })
    expect(settingOf(body, 'firmware.expires-soon', 'firmwareMarginDays').value).toBe(5)
    expect(settingOf(body, 'recorder.present', 'recordersRequired')).toMatchObject({ value: 2, text: '2 recorders' })
    // The others keep their values.
    expect(settingOf(body, 'firmware.expires-soon', 'firmwareWarningDays').value).toBe(30)
  })

  it('hides the competition from non-members (404, as its other routes) and asks strangers to sign in', async () => {
    const outsider = await r.outsider.get(path)
    expect(outsider.status).toBe(404)
    expect(outsider.body.message).toBe('No such competition, or you are not part of it.')
    const anonymous = await r.anonymous.get(path)
    expect(anonymous.status).toBe(401)
    expect(anonymous.body.message).toBe('Please sign in to continue.')
  })

  it('answers a malformed or unknown competition in words, never a server error', async () => {
    for (const bad of ['not-a-competition', '12345', '00000000-0000-4000-8000-000000000000']) {
      const res = await r.organiser.get(`/api/competitions/${bad}/checks`)
      expect(res.status, bad).toBe(404)
      expect(res.body.message.length, bad).toBeGreaterThan(10)
    }
  })
})

describe('e-mails about a held glider link each finding to its rule and carry the caution', () => {
  let w: GridWorld
  let expired: string
  let unpaid: string
  const rule = (checkId: string) => `${baseUrl}/competitions/${w.competitionId}/checks#${checkId}`
  beforeAll(async () => {
    w = await gridWorld(baseUrl, 'Rulebook Mail Cup')
    expired = await gridEntry(w, { compId: 'RX' })
    // The firmware stops during the contest (its last day is 2027-05-07): a blocking finding with the caution.
    await testDb()('units').where({ entry_id: expired, kind: 'collision-warning' }).update({ firmware_expires_on: '2027-05-03' })
    unpaid = await gridEntry(w, { compId: 'RU' })
    await testDb()('entries').where({ id: unpaid }).update({ payment_status: 'unpaid' })
    await openToday(w)
  })

  it('the director’s hold and release', async () => {
    const held = await w.director.client.post(`${w.base}/entries/${expired}/hold`, { reason: 'Firmware out of date' })
    expect(held.status).toBe(201)
    const [hold] = (await waitForMail(w.entrant.email)).filter(m => m.subject === `RX is held on ${todayIn()} — Rulebook Mail Cup`)
    expect(hold).toBeDefined()
    expect(hold!.text).toContain('The director’s reason: Firmware out of date')
    expect(hold!.text).toContain('The fix touches hardware: read the caution below.')
    expect(hold!.links).toContain(rule('firmware.valid-through-contest'))
    expect(hold!.text).toContain(`Rule: firmware.valid-through-contest\n    ${rule('firmware.valid-through-contest')}`)
    expect(hold!.html).toContain(`href="${rule('firmware.valid-through-contest')}"`)
    expect(hold!.text).toContain(HARDWARE_CAUTION)

    expect((await w.director.client.post(`${w.base}/entries/${expired}/release`, { reason: 'Updated on the grid' })).status).toBe(201)
    const release = (await waitForMail(w.entrant.email, { count: 2 })).find(m => m.subject.startsWith('RX is released'))
    expect(release).toBeDefined()
    expect(release!.links).toContain(rule('firmware.valid-through-contest'))
    expect(release!.text).toContain(HARDWARE_CAUTION)
  })

  it('a glider held by a blocking finding on the grid', async () => {
    expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(unpaid))).status).toBe(201)
    const held = (await waitForMail(w.entrant.email, { count: 3 })).find(m => m.subject.startsWith('RU is held'))
    expect(held).toBeDefined()
    expect(held!.text).toMatch(/Blocking: .*entry fee/i)
    expect(held!.links).toContain(rule('entry.paid'))
    // No finding here touches hardware; the caution is there all the same.
    expect(held!.text).not.toContain('read the caution below')
    expect(held!.text).toContain(HARDWARE_CAUTION)
  })
})
