// The privacy notices through the real routes: a competition's notice is public and filled from
// its settings (retention, privacy contact, organisers); the site's notice lists the competitions
// open for entry; an entry is only taken with the notice confirmed, and records when and which.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, createClass, createCompetition, testDb } from '../../../support/db'
import { entriesWorld, entryBody, type EntriesWorld } from '../../../support/entries'
import { DEMO_COMPETITION } from '../../../../seeds/demo-data'
import type { CompetitionPrivacyNotice } from '../../../../shared/types/api-privacy'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: EntriesWorld
const noticePath = (id = w.competitionId) => `/api/competitions/${id}/privacy-notice`
const setupPath = () => `/api/competitions/${w.competitionId}`
const noticeText = (n: CompetitionPrivacyNotice) =>
  n.sections.flatMap(s => [s.title, ...s.paragraphs, ...s.items.map(i => `${i.term}: ${i.text}`)]).join('\n')
const sectionText = (n: CompetitionPrivacyNotice, id: string) => {
  const s = n.sections.find(x => x.id === id)!
  return [...s.paragraphs, ...s.items.map(i => `${i.term}: ${i.text}`)].join('\n')
}
async function entryCount() {
  const row = await testDb()('entries').where({ competition_id: w.competitionId }).count('* as n').first()
  return Number(row!.n)
}

beforeAll(async () => {
  w = await entriesWorld(baseUrl, 'Privacy Cup')
})

describe('GET /api/competitions/:id/privacy-notice', () => {
  it('is public: read before signing up, it names the organisers as controller and the default retention', async () => {
    const res = await w.anonymous.get(noticePath())
    expect(res.status).toBe(200)
    const notice = res.body as CompetitionPrivacyNotice
    expect(notice.facts).toMatchObject({
      competitionName: 'Privacy Cup',
      organisers: ['Olga Organiser'],
      contactEmail: null,
      medicalRetentionDays: 30,
      // createCompetition's last contest day is 2027-05-07; 30 days later.
      medicalDeletedAfter: '2027-06-06',
      supersededRetentionDays: 30,
    })
    expect(notice.version).toMatch(/^[0-9a-f]{64}$/)
    expect(notice.sections.map(s => s.id)).toEqual(['controller', 'collected', 'why', 'who-sees', 'how-long', 'rights'])
    expect(sectionText(notice, 'controller')).toContain('Privacy Cup at Test Field')
    expect(sectionText(notice, 'controller')).toContain('Olga Organiser')
    expect(sectionText(notice, 'controller')).toContain('has not named a privacy contact')
    expect(sectionText(notice, 'how-long')).toContain('30 days after the last contest day, that is until 6 June 2027')
    expect(sectionText(notice, 'collected')).toContain('health data')
    expect(sectionText(notice, 'who-sees')).toContain('never the files')
    expect(sectionText(notice, 'rights')).toContain('/account')
  })

  it('says what the organiser set: another retention and a privacy contact change the notice and its version', async () => {
    const before = (await w.anonymous.get(noticePath())).body as CompetitionPrivacyNotice
    const saved = await w.organiser.client.request('PATCH', setupPath(), {
      privacyContactEmail: ' Privacy@Privacy-Cup.example ',
      rules: { medicalRetentionDays: 45 },
    })
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject({ privacyContactEmail: 'privacy@privacy-cup.example', rules: { medicalRetentionDays: 45 } })
    expect((await w.organiser.client.get(`${setupPath()}/setup`)).body.privacyContactEmail).toBe('privacy@privacy-cup.example')

    const after = (await w.anonymous.get(noticePath())).body as CompetitionPrivacyNotice
    expect(after.facts).toMatchObject({ contactEmail: 'privacy@privacy-cup.example', medicalRetentionDays: 45, medicalDeletedAfter: '2027-06-21' })
    expect(sectionText(after, 'controller')).toContain('Questions about your data in this competition: privacy@privacy-cup.example.')
    expect(sectionText(after, 'how-long')).toContain('45 days after the last contest day, that is until 21 June 2027')
    expect(sectionText(after, 'rights')).toContain('write to privacy@privacy-cup.example')
    expect(noticeText(after)).not.toContain('30 days after the last contest day')
    expect(after.version).not.toBe(before.version)

    // Emptied, the contact is gone and the notice names the organisers again.
    const cleared = await w.organiser.client.request('PATCH', setupPath(), { privacyContactEmail: '' })
    expect(cleared.body.privacyContactEmail).toBeNull()
    const again = (await w.anonymous.get(noticePath())).body as CompetitionPrivacyNotice
    expect(again.facts.contactEmail).toBeNull()
    expect(sectionText(again, 'rights')).toContain('ask the organisers (Olga Organiser)')
  })

  it('refuses a privacy contact that is not an e-mail address (400, on its field), and others than the organiser (403)', async () => {
    const bad = await w.organiser.client.request('PATCH', setupPath(), { privacyContactEmail: 'the office' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fieldErrors.privacyContactEmail).toEqual(['Enter the privacy contact as an e-mail address like privacy@example.org, or leave it empty.'])
    const scrutineer = await w.scrutineer.client.request('PATCH', setupPath(), { privacyContactEmail: 'x@example.org' })
    expect(scrutineer.status).toBe(403)
  })

  it('answers 404 for an unknown competition, and for an id that is none (as every route does)', async () => {
    const unknown = await w.anonymous.get(noticePath('00000000-0000-4000-8000-000000000000'))
    expect(unknown.status).toBe(404)
    expect(unknown.body.message).toBe('There is no such competition, so no privacy notice either.')
    expect((await w.anonymous.get(noticePath('not-an-id'))).status).toBe(404)
  })
})

describe('GET /api/privacy-notices', () => {
  it('is public and lists the competitions open for entry, not a closed one', async () => {
    const closed = await createCompetition('Closed Privacy Cup')
    await createClass(closed)
    await testDb()('competitions').where({ id: closed }).update({ registration_closes_on: '2020-01-01' })
    const res = await w.anonymous.get('/api/privacy-notices')
    expect(res.status).toBe(200)
    expect(res.body.sections.map((s: { id: string }) => s.id)).toEqual(['site', 'account', 'account-rights'])
    const ids = res.body.competitions.map((c: { competitionId: string }) => c.competitionId)
    expect(ids).toContain(w.competitionId)
    expect(ids).not.toContain(closed)
    expect(res.body.competitions.find((c: { competitionId: string }) => c.competitionId === w.competitionId))
      .toMatchObject({ name: 'Privacy Cup', airfieldName: 'Test Field', firstContestDay: '2027-05-01', lastContestDay: '2027-05-07' })
  })
})

describe('confirming the notice when entering', () => {
  const entries = () => `/api/competitions/${w.competitionId}/entries`

  it('refuses an entry without the confirmation, or with it false (400 naming the notice); nothing is created', async () => {
    const count = await entryCount()
    const { privacyNoticeAccepted: _left, ...without } = entryBody(w.classId, { compId: 'PV1', registration: 'G-PRV1' })
    for (const body of [without, { ...without, privacyNoticeAccepted: false }, { ...without, privacyNoticeAccepted: 'yes' }]) {
      const res = await w.entrant.client.post(entries(), body)
      expect(res.status).toBe(400)
      expect(res.body.message).toContain('privacy notice')
      expect(res.body.data.fieldErrors.privacyNoticeAccepted).toEqual([
        'Read the competition’s privacy notice and tick the box to confirm it: an entry is only taken with the notice confirmed.',
      ])
    }
    expect(await entryCount()).toBe(count)
  })

  it('stores when the pilot confirmed, and which version of the notice', async () => {
    const notice = (await w.anonymous.get(noticePath())).body as CompetitionPrivacyNotice
    const before = Date.now()
    const res = await w.entrant.client.post(entries(), entryBody(w.classId, { compId: 'PV2', registration: 'G-PRV2' }))
    expect(res.status).toBe(201)
    const row = await testDb()('entries').where({ id: res.body.id }).first('privacy_confirmed_at', 'privacy_notice_version')
    expect(row.privacy_confirmed_at).toBeInstanceOf(Date)
    expect(row.privacy_confirmed_at.getTime()).toBeGreaterThanOrEqual(before - 5_000)
    expect(row.privacy_confirmed_at.getTime()).toBeLessThanOrEqual(Date.now() + 5_000)
    expect(row.privacy_notice_version).toBe(notice.version)

    // The notice changes (another retention): the next entry records the new one, this one keeps its own.
    expect((await w.organiser.client.request('PATCH', setupPath(), { rules: { medicalRetentionDays: 60 } })).status).toBe(200)
    const changed = (await w.anonymous.get(noticePath())).body as CompetitionPrivacyNotice
    const next = await w.otherEntrant.client.post(entries(), entryBody(w.classId, { compId: 'PV3', registration: 'G-PRV3', pilotName: 'Otto Other' }))
    expect(next.status).toBe(201)
    const nextRow = await testDb()('entries').where({ id: next.body.id }).first('privacy_notice_version')
    expect(nextRow.privacy_notice_version).toBe(changed.version)
    expect(changed.version).not.toBe(notice.version)
    expect((await testDb()('entries').where({ id: res.body.id }).first('privacy_notice_version')).privacy_notice_version).toBe(notice.version)
  })

  it('the demo’s entries were all confirmed, with the notice the server words for the demo competition', async () => {
    const demo = await testDb()('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
    const notice = (await w.anonymous.get(noticePath(demo.id))).body as CompetitionPrivacyNotice
    expect(notice.facts.contactEmail).toBe(DEMO_COMPETITION.privacyContactEmail)
    const rows = await testDb()('entries').where({ competition_id: demo.id }).select('privacy_confirmed_at', 'privacy_notice_version')
    expect(rows.length).toBeGreaterThanOrEqual(40)
    expect(rows.filter(r => !r.privacy_confirmed_at)).toEqual([])
    expect(new Set(rows.map(r => r.privacy_notice_version))).toEqual(new Set([notice.version]))
  })
})
