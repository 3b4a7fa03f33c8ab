// Authorization by role and competition, through real routes and memberships.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedUpClient } from '../../../support/api'
import { closeTestDb, createCompetition, testDb } from '../../../support/db'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let ours: string
let theirs: string
let entrant: ApiClient
let organiser: ApiClient
let admin: ApiClient

beforeAll(async () => {
  const e = await signedUpClient(baseUrl, 'Entrant Person')
  const o = await signedUpClient(baseUrl, 'Organiser Person')
  const a = await signedUpClient(baseUrl, 'Admin Person')
  await testDb()('users').where({ id: a.user.id }).update({ is_admin: true })
  entrant = e.client
  organiser = o.client
  admin = a.client
  ours = await createCompetition('Ours Open', [
    { userId: e.user.id, role: 'entrant' },
    { userId: o.user.id, role: 'organiser' },
  ])
  theirs = await createCompetition('Theirs Cup')
})

describe('competition access', () => {
  it('answers 401 with a message when not signed in', async () => {
    const res = await new ApiClient(baseUrl).get(`/api/competitions/${ours}`)
    expect(res.status).toBe(401)
    expect(res.body.message).toBe('Please sign in to continue.')
  })

  it('shows a member their competition and their roles', async () => {
    const res = await entrant.get(`/api/competitions/${ours}`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ id: ours, name: 'Ours Open', roles: ['entrant'], firstContestDay: '2027-05-01' })
  })

  it('answers 403 naming the role when an entrant calls an organiser route', async () => {
    const res = await entrant.get(`/api/competitions/${ours}/memberships`)
    expect(res.status).toBe(403)
    expect(res.body.message).toBe('This needs the organiser role in this competition.')
  })

  it('lets the organiser list the members', async () => {
    const res = await organiser.get(`/api/competitions/${ours}/memberships`)
    expect(res.status).toBe(200)
    expect(res.body.members.map((m: { name: string, roles: string[] }) => [m.name, m.roles])).toEqual([
      ['Entrant Person', ['entrant']],
      ['Organiser Person', ['organiser']],
    ])
  })

  it('hides another competition: 404 for its detail and its members', async () => {
    for (const path of [`/api/competitions/${theirs}`, `/api/competitions/${theirs}/memberships`]) {
      const res = await organiser.get(path)
      expect(res.status).toBe(404)
      expect(res.body.message).toBe('No such competition, or you are not part of it.')
    }
  })

  it('lists only the competitions the user belongs to, in /api/me and /api/competitions', async () => {
    const me = await entrant.get('/api/me')
    expect(me.body.memberships.map((m: { competitionId: string }) => m.competitionId)).toEqual([ours])
    const list = await entrant.get('/api/competitions')
    expect(list.body.competitions.map((c: { competitionId: string }) => c.competitionId)).toEqual([ours])
  })

  it('gives a site administrator organiser rights everywhere', async () => {
    const res = await admin.get(`/api/competitions/${theirs}/memberships`)
    expect(res.status).toBe(200)
    const list = await admin.get('/api/competitions')
    const byId = new Map(list.body.competitions.map((c: { competitionId: string, roles: string[] }) => [c.competitionId, c.roles]))
    expect(byId.get(ours)).toEqual(['organiser'])
    expect(byId.get(theirs)).toEqual(['organiser'])
  })

  it('answers 404 for an identifier in the address that is not one', async () => {
    const res = await entrant.get('/api/competitions/not-a-uuid')
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('Nothing was found at this address.')
  })

  it('answers unknown API addresses with a JSON 404', async () => {
    const res = await entrant.get('/api/no-such-thing')
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('Nothing was found at this address.')
  })
})
