// The organiser's member list and removing a role; the last organiser stays.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createCompetition, testDb } from '../../../support/db'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let competitionId: string
let organiser: Awaited<ReturnType<typeof signedUpClient>>
let scrutineer: Awaited<ReturnType<typeof signedUpClient>>
let outsider: ApiClient

interface Member { userId: string, roles: string[], memberships: { id: string, role: string }[] }

async function membershipId(userId: string, role: string): Promise<string> {
  const res = await organiser.client.get(`/api/competitions/${competitionId}/memberships`)
  const member = (res.body.members as Member[]).find(m => m.userId === userId)!
  return member.memberships.find(m => m.role === role)!.id
}

beforeAll(async () => {
  organiser = await signedUpClient(baseUrl, 'Mo Organiser')
  scrutineer = await signedUpClient(baseUrl, 'Sol Scrutineer')
  outsider = (await signedUpClient(baseUrl, 'Out Sider')).client
  competitionId = await createCompetition('Members Cup', [
    { userId: organiser.user.id, role: 'organiser' },
    { userId: scrutineer.user.id, role: 'scrutineer' },
    { userId: scrutineer.user.id, role: 'director' },
  ])
  await createCompetition('Members Elsewhere', [{ userId: (await testDb()('users').where({ name: 'Out Sider' }).first()).id, role: 'organiser' }])
})

describe('DELETE /api/competitions/:id/memberships/:membershipId', () => {
  it('lists each role with its membership id', async () => {
    const res = await organiser.client.get(`/api/competitions/${competitionId}/memberships`)
    const sol = (res.body.members as Member[]).find(m => m.userId === scrutineer.user.id)!
    expect(sol.roles).toEqual(['director', 'scrutineer'])
    expect(sol.memberships.map(m => m.role)).toEqual(['director', 'scrutineer'])
  })

  it('refuses the wrong callers', async () => {
    const id = await membershipId(scrutineer.user.id, 'director')
    const path = `/api/competitions/${competitionId}/memberships/${id}`
    expect((await new ApiClient(baseUrl).request('DELETE', path)).status).toBe(401)
    expect((await scrutineer.client.request('DELETE', path)).status).toBe(403)
    expect((await outsider.request('DELETE', path)).status).toBe(404)
    expect((await organiser.client.request('DELETE', `/api/competitions/${competitionId}/memberships/bad-id`)).status).toBe(404)
    const unknown = await organiser.client.request('DELETE', `/api/competitions/${competitionId}/memberships/00000000-0000-4000-8000-000000000000`)
    expect(unknown.status).toBe(404)
    expect(unknown.body.message).toBe(MESSAGES.membershipNotFound)
  })

  it('removes one role and keeps the others, with an audit entry', async () => {
    const id = await membershipId(scrutineer.user.id, 'director')
    const res = await organiser.client.request('DELETE', `/api/competitions/${competitionId}/memberships/${id}`)
    expect(res.status).toBe(204)
    expect((await scrutineer.client.get(`/api/competitions/${competitionId}`)).body.roles).toEqual(['scrutineer'])
    expect(await testDb()('audit_log').where({ action: 'membership.remove', subject_id: id }).first()).toBeTruthy()
  })

  it('keeps the last organiser, and allows removing one of two', async () => {
    const own = await membershipId(organiser.user.id, 'organiser')
    const refused = await organiser.client.request('DELETE', `/api/competitions/${competitionId}/memberships/${own}`)
    expect(refused.status).toBe(409)
    expect(refused.body.message).toBe(MESSAGES.lastOrganiser)

    await testDb()('memberships').insert({ user_id: scrutineer.user.id, competition_id: competitionId, role: 'organiser' })
    const second = await membershipId(scrutineer.user.id, 'organiser')
    const res = await organiser.client.request('DELETE', `/api/competitions/${competitionId}/memberships/${second}`)
    expect(res.status).toBe(204)
    expect((await organiser.client.request('DELETE', `/api/competitions/${competitionId}/memberships/${own}`)).status).toBe(409)
  })
})
