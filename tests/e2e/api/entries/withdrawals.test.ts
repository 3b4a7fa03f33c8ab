// Withdrawing an entry through the real route, read back from the SMTP capture: the entrant's
// own withdrawal confirms to them and tells every organiser the refund due (the money received,
// paid first through the payment fake); the organiser withdraws for the pilot only with a reason,
// which the pilot is told and the audit log keeps; nobody else withdraws an entry.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { signedUpClient, type ApiClient } from '../../../support/api'
import { closeTestDb, createEntry, testDb } from '../../../support/db'
import { waitForMail } from '../../../support/mail'
import { auditFor, entryRow, payOnFake, paymentScene, type PaymentScene } from '../../../support/payments'

const baseUrl = inject('baseUrl')
const serviceEnv = inject('serviceEnv')
afterAll(closeTestDb)

let s: PaymentScene
let secondOrganiserEmail: string
const entryPath = (id: string) => `/api/competitions/${s.competitionId}/entries/${id}`
const withdrawnSubject = (compId: string) => `Entry ${compId} withdrawn — Fee Trophy`

beforeAll(async () => {
  s = await paymentScene(baseUrl, { feeMinor: 30000, status: 'accepted' })
  // A second organiser: every organiser of the competition is told.
  const o2 = await signedUpClient(baseUrl, 'Second Organiser')
  secondOrganiserEmail = o2.email
  await testDb()('memberships').insert({ user_id: o2.user.id, competition_id: s.competitionId, role: 'organiser' })
})

/** The one message to `to` whose subject starts so, once the capture has it. */
async function mailTo(to: string, subjectStart: string) {
  for (let count = 1; ; count++) {
    const messages = await waitForMail(to, { count })
    const hit = messages.find(m => m.subject.startsWith(subjectStart))
    if (hit) return hit
  }
}

describe('the entrant withdraws', () => {
  it('a paid entry: a confirmation to the entrant, and each organiser is told the refund due', async () => {
    const checkout = await s.entrant.post(`${entryPath(s.entryId)}/checkout`)
    expect(checkout.status).toBe(201)
    expect((await payOnFake(serviceEnv, checkout.body.url)).body.webhookStatus).toBe(200)
    const { comp_id: compId } = await entryRow(s.entryId)
    expect((await entryRow(s.entryId)).paid_minor).toBe(30000)

    const res = await s.entrant.post(`${entryPath(s.entryId)}/withdraw`)
    expect(res.status).toBe(200)
    expect(res.body.entry.status).toBe('withdrawn')
    expect(res.body.can).toMatchObject({ withdraw: false, withdrawForPilot: false })

    const confirmation = await mailTo(s.entrantUser.email, withdrawnSubject(compId))
    expect(confirmation.text).toContain('is withdrawn, as you asked.')
    expect(confirmation.text).toContain('You paid €300.00 for this entry.')
    expect(confirmation.links).toContain(`${baseUrl}${entryPath(s.entryId).replace('/api', '')}`)
    for (const organiser of [s.organiserEmail, secondOrganiserEmail]) {
      const notice = await mailTo(organiser, `Entry ${compId} withdrawn — refund due: €300.00`)
      expect(notice.to).toEqual([organiser])
      expect(notice.text).toContain('Paying Pilot withdrew their entry')
      expect(notice.text).toContain('Refund due: €300.00, the money received for this entry.')
      expect(notice.links).toContain(`${baseUrl}/competitions/${s.competitionId}/entries/${s.entryId}/payment`)
    }
    const [row] = await auditFor(s.entryId, 'entry.withdrawn')
    expect(row.actor_user_id).toBe(s.entrantUser.id)
    expect(row.details).toMatchObject({ from: 'accepted', to: 'withdrawn', by: 'entrant', paidMinor: 30000 })
    expect((await s.entrant.post(`${entryPath(s.entryId)}/withdraw`)).status).toBe(409)
  })

  it('an unpaid entry: the organisers are told no fee was paid', async () => {
    const id = await createEntry({ competitionId: s.competitionId, classId: s.classId, entrantUserId: s.entrantUser.id, status: 'submitted', compId: 'WU' })
    expect((await s.entrant.post(`${entryPath(id)}/withdraw`)).status).toBe(200)
    const confirmation = await mailTo(s.entrantUser.email, withdrawnSubject('WU'))
    expect(confirmation.text).toContain('No entry fee was paid for this entry')
    const notice = await mailTo(secondOrganiserEmail, 'Entry WU withdrawn — refund due: none')
    expect(notice.text).toContain('Refund due: none, no fee was paid for this entry.')
    expect(notice.links).toContain(`${baseUrl}/competitions/${s.competitionId}/entries/${id}`)
  })
})

describe('the organiser withdraws for the pilot', () => {
  let pilot: { client: ApiClient, email: string, id: string }
  let entryId: string

  beforeAll(async () => {
    const p = await signedUpClient(baseUrl, 'Absent Pilot')
    pilot = { client: p.client, email: p.email, id: p.user.id }
    await testDb()('memberships').insert({ user_id: p.user.id, competition_id: s.competitionId, role: 'entrant' })
    entryId = await createEntry({ competitionId: s.competitionId, classId: s.classId, entrantUserId: p.user.id, status: 'accepted', compId: 'WO' })
  })

  it('is refused without a reason, with the reason asked for', async () => {
    const dossier = await s.organiser.get(entryPath(entryId))
    expect(dossier.body.can).toMatchObject({ withdraw: false, withdrawForPilot: true })
    for (const body of [{}, { reason: '   ' }]) {
      const res = await s.organiser.post(`${entryPath(entryId)}/withdraw`, body)
      expect(res.status).toBe(400)
      expect(res.body.message).toBe('Say why the office withdraws this entry: the pilot is told the reason.')
      expect(res.body.data.fieldErrors.reason).toEqual(['Say why the office withdraws this entry: the pilot is told the reason.'])
    }
    const long = await s.organiser.post(`${entryPath(entryId)}/withdraw`, { reason: 'x'.repeat(1001) })
    expect(long.status).toBe(400)
    expect(long.body.data.fieldErrors.reason).toEqual(['Keep the reason under 1000 characters.'])
    expect((await entryRow(entryId)).status).toBe('accepted')
  })

  it('is for the organiser alone among the staff; another entrant learns nothing of the entry', async () => {
    const scrutineer = await s.scrutineer.post(`${entryPath(entryId)}/withdraw`, { reason: 'Not mine to do' })
    expect(scrutineer.status).toBe(403)
    expect(scrutineer.body.message).toBe('Only the entry’s own entrant, or the competition’s organiser for the pilot, can withdraw it.')
    const other = await s.otherEntrant.post(`${entryPath(entryId)}/withdraw`)
    expect(other.status).toBe(404)
    expect(other.body.message).toBe('No such entry in this competition, or it is not yours.')
    expect((await entryRow(entryId)).status).toBe('accepted')
  })

  it('with a reason: the pilot is told the office withdrew it and why; audited with who and why', async () => {
    const res = await s.organiser.post(`${entryPath(entryId)}/withdraw`, { reason: 'The pilot phoned the office: a broken wrist.' })
    expect(res.status).toBe(200)
    expect(res.body.entry.status).toBe('withdrawn')
    expect(res.body.can.withdrawForPilot).toBe(false)

    const told = await mailTo(pilot.email, withdrawnSubject('WO'))
    expect(told.text).toContain('the competition office (Office Organiser) has withdrawn your entry WO')
    expect(told.text).toContain('Their reason: The pilot phoned the office: a broken wrist.')
    expect(told.text).toContain('No entry fee was paid for this entry')
    const notice = await mailTo(s.organiserEmail, 'Entry WO withdrawn — refund due: none')
    expect(notice.text).toContain('Office Organiser withdrew the entry WO')
    expect(notice.text).toContain('for the pilot.')
    expect(notice.text).toContain('The reason given: The pilot phoned the office: a broken wrist.')

    const [row] = await auditFor(entryId, 'entry.withdrawn')
    const organiserId = (await testDb()('users').where({ email: s.organiserEmail }).first()).id
    expect(row.actor_user_id).toBe(organiserId)
    expect(row.details).toMatchObject({ from: 'accepted', to: 'withdrawn', by: 'office', reason: 'The pilot phoned the office: a broken wrist.', paidMinor: 0 })
    expect((await s.organiser.post(`${entryPath(entryId)}/withdraw`, { reason: 'Again' })).status).toBe(409)
    // The pilot's own dossier shows it withdrawn.
    expect((await pilot.client.get(entryPath(entryId))).body.entry.status).toBe('withdrawn')
  })
})
