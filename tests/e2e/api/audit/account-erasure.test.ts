/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Erasing an account (DELETE /api/me) pseudonymises its audit rows, against the real server and
// PostgreSQL: every row stays with its action, time and actor (the anonymised account, shown as
// "Deleted account"), and no row about the person holds their name, address or their entry's
// contact values any more, even rows written before the log stopped keeping them. The log stays
// append-only for everything else: a plain UPDATE or DELETE is refused, as is any change but the
// details' while forgetting.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD, signedUpClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, testDb } from '../../../support/db'
import { createEntryVia, entryBody } from '../../../support/entries'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

const NAME = 'Wren Leavingsworth'
const PHONE = '+44 7700 900321'
const CONTACT = 'Kit Leavingsworth, +44 7700 900654'
const LICENCE = 'GBR.FCL.77077'

let leaving: Awaited<ReturnType<typeof signedUpClient>>
let office: Awaited<ReturnType<typeof signedUpClient>>
let competitionId: string
let entryId: string
type Row = { id: string, at: Date, action: string, actor_user_id: string | null, subject_id: string | null, details: Record<string, unknown> }
let before: Row[]

const aboutThePerson = () => testDb()('audit_log')
  .where(q => q.where('actor_user_id', leaving.user.id).orWhere('subject_id', leaving.user.id).orWhere('subject_id', entryId)
    .orWhereRaw(`details->>'entryId' = ?`, [entryId]))
  .orderBy('id').select('id', 'at', 'action', 'actor_user_id', 'subject_id', 'details') as Promise<Row[]>

beforeAll(async () => {
  leaving = await signedUpClient(baseUrl, NAME)
  office = await signedUpClient(baseUrl, 'Orla Office')
  competitionId = await createCompetition('Erasure Open', [{ userId: office.user.id, role: 'organiser' }])
  const classId = await createClass(competitionId)
  entryId = await createEntryVia(leaving.client, competitionId, entryBody(classId, { pilotName: NAME, pilotPhone: '+44 7700 900320', emergencyContact: CONTACT, pilotLicenceNumber: LICENCE, compId: 'WL' }))
  expect((await leaving.client.request('PATCH', `/api/competitions/${competitionId}/entries/${entryId}`, { pilotPhone: PHONE, mtomKg: 520 })).status).toBe(200)
  expect((await office.client.request('PATCH', `/api/competitions/${competitionId}/entries/${entryId}`, { spanM: 15.2 })).status).toBe(200)
  // Rows as the log wrote them before it kept personal values out (inserting stays allowed).
  await testDb()('audit_log').insert([
    { actor_user_id: leaving.user.id, competition_id: competitionId, action: 'entry.updated', subject_type: 'entry', subject_id: entryId, details: { field: 'pilotPhone', from: '+44 7700 900320', to: PHONE } },
    { actor_user_id: leaving.user.id, competition_id: competitionId, action: 'invitation.accept', subject_type: 'invitation', subject_id: 'old', details: { role: 'scrutineer', invitedEmail: leaving.email, acceptedEmail: leaving.email.toUpperCase() } },
    { actor_user_id: null, competition_id: competitionId, action: 'findings.changed', subject_type: 'entry', subject_id: entryId, details: { entryId, added: [{ checkId: 'declaration.matches-entry', severity: 'advisory', reason: `Logger names the pilot “${NAME.toUpperCase()}”, the entry says “${NAME}”.` }] } },
  ])
  before = await aboutThePerson()
})

describe('erasing an account', () => {
  it('keeps every row about the person with its action, time and actor, and forgets who they were', async () => {
    expect(before.filter(r => r.actor_user_id === leaving.user.id).length).toBeGreaterThan(3)
    expect(JSON.stringify(before.map(r => r.details))).toContain(PHONE)

    const res = await leaving.client.request('DELETE', '/api/me', { password: GOOD_PASSWORD, confirm: 'delete' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)

    const after = await aboutThePerson()
    const kept = new Map(after.map(r => [r.id, r]))
    for (const r of before) {
      expect(kept.get(r.id), `row ${r.id} (${r.action})`).toMatchObject({ action: r.action, at: r.at, actor_user_id: r.actor_user_id, subject_id: r.subject_id })
    }
    // The erasure's own rows came after, under the same pseudonymous actor.
    expect(after.filter(r => r.action === 'user.deleted').map(r => r.actor_user_id)).toEqual([leaving.user.id])

    const text = JSON.stringify(after.map(r => r.details)).toLowerCase()
    for (const v of [NAME, leaving.email, PHONE, '+44 7700 900320', CONTACT, LICENCE]) expect(text, v).not.toContain(v.toLowerCase())
    const old = after.find(r => r.action === 'findings.changed' && JSON.stringify(r.details).includes('Logger names'))!
    expect((old.details.added as any[])[0].reason).toBe('Logger names the pilot “…”, the entry says “…”.')
    expect(after.find(r => r.action === 'invitation.accept')!.details).toEqual({ role: 'scrutineer' })
    expect(after.find(r => r.action === 'entry.updated' && (r.details as any).field === 'mtomKg')!.details).toMatchObject({ from: 525, to: 520 })

    // The account row that stands for the person says nothing of them.
    expect(await testDb()('users').where({ id: leaving.user.id }).first('name', 'email')).toEqual({ name: 'Deleted account', email: `deleted-${leaving.user.id}@deleted.invalid` })
    const page = await office.client.get(`/api/competitions/${competitionId}/audit?entryId=${entryId}`)
    expect(page.status).toBe(200)
    const theirs = page.body.rows.filter((r: any) => r.actor?.id === leaving.user.id)
    expect(theirs.length).toBeGreaterThan(0)
    expect(theirs.every((r: any) => r.actor.name === 'Deleted account')).toBe(true)
    expect(page.body.rows.some((r: any) => r.actor?.id === office.user.id && r.details.field === 'spanM')).toBe(true)
  })
})

describe('the audit log stays append-only', () => {
  it('refuses a plain UPDATE and DELETE', async () => {
    const [row] = before
    await expect(testDb()('audit_log').where({ id: row!.id }).update({ details: { forged: true } })).rejects.toThrow(/append-only/)
    await expect(testDb()('audit_log').where({ id: row!.id }).delete()).rejects.toThrow(/append-only/)
  })

  it('while forgetting, refuses any change but the details’, and every DELETE', async () => {
    const [row] = before
    const forgetting = (work: (trx: any) => Promise<unknown>) => testDb().transaction(async (trx) => {
      await trx.raw(`SELECT set_config('gridmark.audit_forgetting', 'on', true)`)
      return work(trx)
    })
    await expect(forgetting(trx => trx('audit_log').where({ id: row!.id }).update({ actor_user_id: null }))).rejects.toThrow(/append-only/)
    await expect(forgetting(trx => trx('audit_log').where({ id: row!.id }).update({ action: 'user.forged' }))).rejects.toThrow(/append-only/)
    await expect(forgetting(trx => trx('audit_log').where({ id: row!.id }).delete())).rejects.toThrow(/append-only/)
    const still = await testDb()('audit_log').where({ id: row!.id }).first('action', 'actor_user_id')
    expect(still).toEqual({ action: row!.action, actor_user_id: row!.actor_user_id })
  })
})
