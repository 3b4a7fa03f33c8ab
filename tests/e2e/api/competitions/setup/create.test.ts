// POST /api/competitions (site administrators) and GET|PATCH of the organiser's set-up.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../../support/db'
import { competitionWithRoles, type RoleClients } from '../../../../support/setup'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let t: RoleClients
let organiserEmail: string
beforeAll(async () => {
  t = await competitionWithRoles(baseUrl, 'Setup Create Cup')
  organiserEmail = (await testDb()('users').where({ id: t.ids.organiser }).first('email')).email
})

const good = () => ({
  name: 'Lowland Gliding Week',
  airfieldName: 'Harrow Fen',
  airfieldIcao: 'exhf',
  timeZone: 'Europe/Amsterdam',
  firstContestDay: '2027-07-10',
  lastContestDay: '2027-07-18',
  organiserEmail,
})

describe('POST /api/competitions', () => {
  it('lets a site administrator create a competition and make an existing user its organiser, audited', async () => {
    const res = await t.admin.post('/api/competitions', good())
    expect(res.status).toBe(201)
    expect(res.body.slug).toMatch(/^lowland-gliding-week-/)
    const row = await testDb()('competitions').where({ id: res.body.id }).first()
    expect(row).toMatchObject({ name: 'Lowland Gliding Week', airfield_icao: 'EXHF', time_zone: 'Europe/Amsterdam', currency: 'EUR', created_by: t.ids.admin })
    const members = await testDb()('memberships').where({ competition_id: res.body.id })
    expect(members.map(m => [m.user_id, m.role])).toEqual([[t.ids.organiser, 'organiser']])
    const log = await testDb()('audit_log').where({ competition_id: res.body.id, action: 'competition.created' })
    expect(log).toHaveLength(1)
    expect(log[0].actor_user_id).toBe(t.ids.admin)
    // the new organiser now sees it and may open its set-up
    const setup = await t.organiser.get(`/api/competitions/${res.body.id}/setup`)
    expect(setup.status).toBe(200)
    expect(setup.body).toMatchObject({ name: 'Lowland Gliding Week', firstContestDay: '2027-07-10', contestDays: [], classes: [] })
  })

  it('refuses an organiser who is not a site administrator (403) and a stranger (401)', async () => {
    expect((await t.organiser.post('/api/competitions', good())).status).toBe(403)
    expect((await t.anonymous.post('/api/competitions', good())).status).toBe(401)
  })

  it('answers 400 with field errors for an unknown time zone, a bad ICAO indicator and reversed days', async () => {
    const res = await t.admin.post('/api/competitions', { ...good(), timeZone: 'Mars/Olympus', airfieldIcao: 'EX1', lastContestDay: '2027-07-01' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.timeZone[0]).toMatch(/not a known IANA time zone/)
    expect(res.body.data.fieldErrors.airfieldIcao[0]).toMatch(/four letters/)
    expect(res.body.data.fieldErrors.lastContestDay[0]).toMatch(/cannot be before the first/)
  })

  it('answers 400 on the organiser field when no account has that e-mail address, and creates nothing', async () => {
    const before = await testDb()('competitions').count('* as n').first()
    const res = await t.admin.post('/api/competitions', { ...good(), organiserEmail: 'nobody-here@test.gridmark.example' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.organiserEmail[0]).toMatch(/No account uses that e-mail address/)
    expect(await testDb()('competitions').count('* as n').first()).toEqual(before)
  })

  it('answers 400 with a sentence for a body that is not an object', async () => {
    const res = await t.admin.postRaw('/api/competitions', '[1,2]')
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/JSON object/)
  })
})

describe('GET /api/competitions/:id/setup', () => {
  it('shows the organiser every set-up field with default rules', async () => {
    const res = await t.organiser.get(`/api/competitions/${t.competitionId}/setup`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({
      id: t.competitionId,
      timeZone: 'Europe/Berlin',
      currency: 'EUR',
      practiceDays: [],
      contestDays: [],
      lateFeeMinor: 0,
      rules: { firmwareMarginDays: 0, firmwareWarningDays: 30, recordersRequired: 1 },
    })
  })

  it('refuses scrutineer, director and entrant (403), an outsider (404), and a stranger (401)', async () => {
    for (const c of [t.scrutineer, t.director, t.entrant]) {
      const res = await c.get(`/api/competitions/${t.competitionId}/setup`)
      expect(res.status).toBe(403)
      expect(res.body.message).toBe('This needs the organiser role in this competition.')
    }
    expect((await t.outsider.get(`/api/competitions/${t.competitionId}/setup`)).status).toBe(404)
    expect((await t.anonymous.get(`/api/competitions/${t.competitionId}/setup`)).status).toBe(401)
  })

  it('gives a site administrator the organiser’s view', async () => {
    expect((await t.admin.get(`/api/competitions/${t.competitionId}/setup`)).status).toBe(200)
  })
})

describe('PATCH /api/competitions/:id', () => {
  const path = () => `/api/competitions/${t.competitionId}`

  it('stores every set-up field and audits each change as from → to', async () => {
    const res = await t.organiser.request('PATCH', path(), {
      name: 'Setup Create Cup 2027',
      airfieldIcao: 'edxq',
      timeZone: 'Europe/London',
      currency: 'gbp',
      practiceDays: ['2027-04-29', '2027-04-30'],
      contestDays: ['2027-05-01', '2027-05-02', '2027-05-04', '2027-05-07'],
      registrationOpensOn: '2027-01-15',
      registrationClosesOn: '2027-04-15',
      lateFeeAfter: '2027-03-31',
      lateFeeMinor: 5000,
      rules: { firmwareMarginDays: 3, recordersRequired: 2, requiredDocumentKinds: ['airworthiness', 'insurance'], acceptedApprovalLevels: ['all-flights'] },
    })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({
      name: 'Setup Create Cup 2027',
      airfieldIcao: 'EDXQ',
      timeZone: 'Europe/London',
      currency: 'GBP',
      practiceDays: ['2027-04-29', '2027-04-30'],
      contestDays: ['2027-05-01', '2027-05-02', '2027-05-04', '2027-05-07'],
      registrationOpensOn: '2027-01-15',
      registrationClosesOn: '2027-04-15',
      lateFeeAfter: '2027-03-31',
      lateFeeMinor: 5000,
      rules: { firmwareMarginDays: 3, firmwareWarningDays: 30, recordersRequired: 2, requiredDocumentKinds: ['airworthiness', 'insurance'], acceptedApprovalLevels: ['all-flights'] },
    })
    const again = await t.organiser.get(`${path()}/setup`)
    expect(again.body.contestDays).toEqual(['2027-05-01', '2027-05-02', '2027-05-04', '2027-05-07'])
    const [log] = await testDb()('audit_log').where({ competition_id: t.competitionId, action: 'competition.setup-changed' }).orderBy('at', 'desc').limit(1)
    expect(log.actor_user_id).toBe(t.ids.organiser)
    expect(log.details.changes.currency).toEqual({ from: 'EUR', to: 'GBP' })
    expect(log.details.changes.timeZone).toEqual({ from: 'Europe/Berlin', to: 'Europe/London' })
    expect(log.details.changes.lateFeeMinor).toEqual({ from: 0, to: 5000 })
    expect(log.details.changes.airfieldName).toBeUndefined()
  })

  it('checks the whole after merging: moving the first contest day past listed contest days is refused and nothing changes', async () => {
    const res = await t.organiser.request('PATCH', path(), { firstContestDay: '2027-05-03' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.contestDays[0]).toMatch(/between the first and last contest day \(2027-05-01, 2027-05-02 does not\)/)
    expect((await t.organiser.get(`${path()}/setup`)).body.firstContestDay).toBe('2027-05-01')
  })

  it('refuses practice days on or after the first contest day and registration closing before it opens', async () => {
    const res = await t.organiser.request('PATCH', path(), { practiceDays: ['2027-05-01'], registrationOpensOn: '2027-04-20', registrationClosesOn: '2027-04-10' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors.practiceDays[0]).toMatch(/before the first contest day/)
    expect(res.body.data.fieldErrors.registrationClosesOn[0]).toMatch(/cannot close before it opens/)
  })

  it('refuses an unknown time zone, a bad ICAO indicator, a currency that is not ISO 4217, and an unknown field', async () => {
    const zone = await t.organiser.request('PATCH', path(), { timeZone: 'Europe/Atlantis' })
    expect(zone.status).toBe(400)
    expect(zone.body.data.fieldErrors.timeZone).toBeDefined()
    const icao = await t.organiser.request('PATCH', path(), { airfieldIcao: 'ED-1' })
    expect(icao.body.data.fieldErrors.airfieldIcao[0]).toBe('An ICAO location indicator is four letters, e.g. EDKM.')
    const currency = await t.organiser.request('PATCH', path(), { currency: 'XYZ' })
    expect(currency.body.data.fieldErrors.currency[0]).toBe('That is not an ISO 4217 currency code.')
    const rules = await t.organiser.request('PATCH', path(), { rules: { recordersRequired: 3 } })
    expect(rules.status).toBe(400)
    const unknown = await t.organiser.request('PATCH', path(), { colour: 'red' })
    expect(unknown.status).toBe(400)
  })

  it('changes one rule without resetting the others to their defaults', async () => {
    const res = await t.organiser.request('PATCH', path(), { rules: { firmwareWarningDays: 45 } })
    expect(res.status).toBe(200)
    expect(res.body.rules).toMatchObject({ firmwareMarginDays: 3, firmwareWarningDays: 45, recordersRequired: 2, acceptedApprovalLevels: ['all-flights'] })
    const bad = await t.organiser.request('PATCH', path(), { rules: { acceptedApprovalLevels: [] } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.rules[0]).toBe('Accept at least one recorder approval level.')
  })

  it('clears the ICAO indicator when sent empty', async () => {
    const res = await t.organiser.request('PATCH', path(), { airfieldIcao: '' })
    expect(res.status).toBe(200)
    expect(res.body.airfieldIcao).toBeNull()
  })

  it('refuses scrutineer, director, entrant (403), outsider (404), stranger (401)', async () => {
    for (const c of [t.scrutineer, t.director, t.entrant]) expect((await c.request('PATCH', path(), { name: 'Hijacked' })).status).toBe(403)
    expect((await t.outsider.request('PATCH', path(), { name: 'Hijacked' })).status).toBe(404)
    expect((await t.anonymous.request('PATCH', path(), { name: 'Hijacked' })).status).toBe(401)
    expect((await t.organiser.get(`${path()}/setup`)).body.name).toBe('Setup Create Cup 2027')
  })
})
