/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Withdrawing a waiver against the built server and PostgreSQL: the director withdraws it with
// a reason; it is stored and audited, counts no more (the tile is held again and pushed, the
// phone's pack leaves it out), a second withdrawal is refused; the entrant is e-mailed when a
// waiver is granted and when it is withdrawn, and reads the entry's waivers.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../../../support/db'
import { checkBody, gridEntry, gridWorld, todayIn, type GridWorld } from '../../../support/grid'
import { auditRows } from '../../../support/entries'
import { boardSocket, joinBoard, openToday, type BoardSocket } from '../../../support/board'
import { waitForMail } from '../../../support/mail'

const baseUrl = inject('baseUrl')

let w: GridWorld
let unpaid: string
let socket: BoardSocket
let heldMailsBefore: number
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Waiver Withdrawal Cup')
  unpaid = await gridEntry(w, { compId: 'W1' })
  await testDb()('entries').where({ id: unpaid }).update({ payment_status: 'unpaid' })
  await openToday(w)
  expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(unpaid))).status).toBe(201)
  // Held on the grid by its unpaid fee: the board's own e-mail, with the entry page.
  const [held] = await testDb()('mail_outbox').where({ entry_id: unpaid, template: 'board-held' })
  expect(held.text_body).toContain('€300.00 of the entry fee is still to pay')
  expect(held.text_body).toContain(`Open your entry:\n${baseUrl}/competitions/${w.competitionId}/entries/${unpaid}`)
  socket = await boardSocket(baseUrl, w.director.client)
  await joinBoard(socket, w.competitionId)
})
afterAll(async () => {
  socket?.close()
  await closeTestDb()
})

const waive = (entryId: string, body: unknown) => w.director.client.post(`${w.base}/entries/${entryId}/waivers`, body)
const withdraw = (entryId: string, actionId: string, body: unknown, client = w.director.client) =>
  client.post(`${w.base}/entries/${entryId}/waivers/${actionId}/withdraw`, body)
const entryUrl = (entryId: string) => `/competitions/${w.competitionId}/entries/${entryId}`

describe('granting a waiver', () => {
  let waiverId: string
  it('e-mails the entrant: the check in words with its rule, the day, who, why, and their entry page', async () => {
    const res = await waive(unpaid, { scope: 'day', checkId: 'entry.paid', reason: 'Paid in cash at the office' })
    expect(res.status).toBe(201)
    waiverId = res.body.action.id
    expect(res.body.action.withdrawal).toBeNull()
    const [mail] = await testDb()('mail_outbox').where({ entry_id: unpaid, template: 'director-waiver' })
    expect(mail.to_address).toBe(w.entrant.email)
    expect(mail.subject).toMatch(/finding on W1 is waived/)
    expect(mail.text_body).toContain('The entry fee is paid before the first contest day.')
    expect(mail.text_body).toContain(`/competitions/${w.competitionId}/checks#entry.paid`)
    expect(mail.text_body).toMatch(/Dana Director waived one finding on your entry W1 .* for \d{1,2} \w+ \d{4} only/)
    expect(mail.text_body).toContain('The director’s reason: Paid in cash at the office')
    expect(mail.text_body).toContain(`See the waiver on your entry:\nhttp`)
    expect(mail.text_body).toContain(entryUrl(unpaid))
    expect(mail.html_body).toContain(`href="http`)
    // The message reaches the entrant (after the board's "held" e-mail of the grid check) with
    // the link to their entry page.
    let sent = await waitForMail(w.entrant.email)
    while (!sent.some(m => m.subject === mail.subject)) sent = await waitForMail(w.entrant.email, { count: sent.length + 1 })
    const received = sent.find(m => m.subject === mail.subject)!
    expect(received.links).toContain(`${baseUrl}${entryUrl(unpaid)}`)
  })

  it('the entrant reads it on their entry: check, scope, until when, by whom and why', async () => {
    const res = await w.entrant.client.get(`${w.base}/entries/${unpaid}/waivers`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual([expect.objectContaining({
      id: waiverId, scope: 'day', day: todayIn(), until: todayIn(), checkId: 'entry.paid',
      checkTitle: 'The entry fee is paid before the first contest day.',
      reason: 'Paid in cash at the office', by: 'Dana Director', withdrawal: null,
      finding: expect.objectContaining({ severity: 'blocking' }),
    })])
    expect((await w.otherEntrant.client.get(`${w.base}/entries/${unpaid}/waivers`)).status).toBe(404)
    expect((await w.scrutineer.client.get(`${w.base}/entries/${unpaid}/waivers`)).status).toBe(200)
    expect((await w.anonymous.get(`${w.base}/entries/${unpaid}/waivers`)).status).toBe(401)
  })
})

describe('withdrawing a waiver', () => {
  let waiverId: string
  beforeAll(async () => {
    waiverId = (await testDb()('director_actions').where({ entry_id: unpaid, kind: 'waiver' }).first()).id
  })

  it('refuses a bad reason with a message naming the field and its limit, and never cuts it', async () => {
    for (const body of [{}, { reason: '  ' }, { reason: 'ok' }]) {
      const res = await withdraw(unpaid, waiverId, body)
      expect(res.status).toBe(400)
      expect(res.body.data.fieldErrors.reason[0]).toMatch(/reason/)
    }
    const long = await withdraw(unpaid, waiverId, { reason: 'x'.repeat(501) })
    expect(long.status).toBe(400)
    expect(long.body.data.fieldErrors.reason[0]).toMatch(/500 characters/)
    expect((await withdraw(unpaid, waiverId, { reason: 'Fee still missing', extra: 1 })).status).toBe(400)
    expect((await testDb()('director_actions').where({ id: waiverId }).first()).withdrawn_at).toBeNull()
  })

  it('refuses an entrant, a scrutineer and the organiser (403), an outsider (404), signed out (401)', async () => {
    for (const c of [w.entrant.client, w.scrutineer.client, w.organiser.client]) {
      expect((await withdraw(unpaid, waiverId, { reason: 'Fee still missing' }, c)).status).toBe(403)
    }
    expect((await withdraw(unpaid, waiverId, { reason: 'Fee still missing' }, w.outsider.client)).status).toBe(404)
    expect((await withdraw(unpaid, waiverId, { reason: 'Fee still missing' }, w.anonymous)).status).toBe(401)
  })

  it('refuses a waiver of another entry, an unknown one and a hold, in words', async () => {
    const other = await gridEntry(w, { compId: 'W2' })
    const elsewhere = await withdraw(other, waiverId, { reason: 'Fee still missing' })
    expect(elsewhere.status).toBe(404)
    expect(elsewhere.body.message).toMatch(/not on this entry/)
    expect((await withdraw(unpaid, '00000000-0000-4000-8000-000000000000', { reason: 'Fee still missing' })).status).toBe(404)
    const held = await w.director.client.post(`${w.base}/entries/${other}/hold`, { reason: 'Canopy lock sticks' })
    const notAWaiver = await withdraw(other, held.body.action.id, { reason: 'Fee still missing' })
    expect(notAWaiver.status).toBe(409)
    expect(notAWaiver.body.message).toMatch(/Only a waiver can be withdrawn/)
  })

  it('withdraws it: stored, audited, the tile held again and pushed; a second withdrawal is refused', async () => {
    const before = (await w.director.client.get(`${w.base}/board`)).body.tiles.find((t: any) => t.entryId === unpaid)
    expect(before.readiness).toBe('ready')
    heldMailsBefore = (await testDb()('mail_outbox').where({ entry_id: unpaid, template: 'board-held' })).length
    const res = await withdraw(unpaid, waiverId, { reason: 'The office found no cash payment' })
    expect(res.status).toBe(200)
    expect(res.body.action).toMatchObject({ id: waiverId, kind: 'waiver', withdrawal: { by: { id: w.director.user.id, name: 'Dana Director' }, reason: 'The office found no cash payment' } })
    expect(res.body.tile).toMatchObject({ readiness: 'held', headline: { checkId: 'entry.paid' }, counts: { waived: 0 } })
    const row = await testDb()('director_actions').where({ id: waiverId }).first()
    expect(row).toMatchObject({ withdrawn_by: w.director.user.id, withdrawal_reason: 'The office found no cash payment', reason: 'Paid in cash at the office' })
    expect(row.withdrawn_at).toBeInstanceOf(Date)

    const audited = await auditRows(unpaid, 'director.waiver-withdrawn')
    expect(audited).toHaveLength(1)
    expect(audited[0]).toMatchObject({ actor_user_id: w.director.user.id, details: { actionId: waiverId, checkId: 'entry.paid', reason: 'The office found no cash payment' } })

    const pushed = await socket.next('board:tile', e => e.entryId === unpaid && e.tile?.readiness === 'held' && e.cause === 'waiver')
    expect(pushed.seq).toBe(res.body.tile.seq)
    expect((await w.director.client.get(`${w.base}/board`)).body.tiles.find((t: any) => t.entryId === unpaid).readiness).toBe('held')

    const twice = await withdraw(unpaid, waiverId, { reason: 'Again' })
    expect(twice.status).toBe(409)
    expect(twice.body.message).toMatch(/withdrawn already, by Dana Director/)
  })

  it('counts nowhere any more: not on the desk’s finding, not in the phone’s pack; listed as withdrawn', async () => {
    const detail = await w.director.client.get(`${w.base}/board/entries/${unpaid}`)
    expect(detail.body.findings.find((f: any) => f.checkId === 'entry.paid').waiver).toBeNull()
    expect(detail.body.actions.find((a: any) => a.id === waiverId).withdrawal).toMatchObject({ reason: 'The office found no cash payment' })
    const pack = await w.scrutineer.client.get(`${w.base}/grid/pack`)
    expect(pack.body.entries.find((e: any) => e.dossier.entry.id === unpaid).directorActions).toEqual([])
    const mine = await w.entrant.client.get(`${w.base}/entries/${unpaid}/waivers`)
    expect(mine.body[0]).toMatchObject({ id: waiverId, withdrawal: { by: 'Dana Director', reason: 'The office found no cash payment' } })
    const timeline = await w.entrant.client.get(`${w.base}/entries/${unpaid}/timeline`)
    expect(timeline.body.items[0].summary).toBe('Waiver of entry.paid withdrawn: The office found no cash payment')
  })

  it('e-mails the entrant: what counts again, who withdrew it and why, held again, and their entry page', async () => {
    const [mail] = await testDb()('mail_outbox').where({ entry_id: unpaid, template: 'director-waiver-withdrawn' })
    expect(mail.to_address).toBe(w.entrant.email)
    expect(mail.subject).toMatch(/waiver on W1 is withdrawn/)
    expect(mail.text_body).toMatch(/Dana Director withdrew the waiver granted for .* only on your entry W1/)
    expect(mail.text_body).toContain('The reason for withdrawing it: The office found no cash payment')
    expect(mail.text_body).toContain('The entry fee is paid before the first contest day.')
    expect(mail.text_body).toContain(`/competitions/${w.competitionId}/checks#entry.paid`)
    expect(mail.text_body).toMatch(/held on today’s board/)
    expect(mail.text_body).toContain(`Open your entry:\nhttp`)
    expect(mail.text_body).toContain(entryUrl(unpaid))
    // The director's own message: no second "held" e-mail from the board.
    expect(await testDb()('mail_outbox').where({ entry_id: unpaid, template: 'board-held' })).toHaveLength(heldMailsBefore)
  })
})
