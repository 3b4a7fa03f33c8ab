import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { setResponseStatus } from 'h3'
import { createPinia, setActivePinia } from 'pinia'
import type { MeResponse } from '#shared/types/api'

const competitionId = '7d1c2b8e-4a0f-4c55-9b7e-2f3c1d9a6e01'
const me: MeResponse = {
  user: { id: 'u1', email: 'pilot@example.org', name: 'Rosa Pilot', isAdmin: false, emailVerified: true },
  memberships: [{
    competitionId,
    slug: 'test-cup',
    name: 'Test Cup',
    airfieldName: 'Nowhere Field',
    firstContestDay: '2027-07-10',
    lastContestDay: '2027-07-17',
    roles: ['scrutineer', 'entrant'],
  }],
}

const cleanups: (() => void)[] = []
beforeEach(() => setActivePinia(createPinia()))
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

describe('session store', () => {
  it('treats a 401 from /api/me as signed out', async () => {
    cleanups.push(registerEndpoint('/api/me', (event) => {
      setResponseStatus(event, 401)
      return { statusCode: 401, message: 'Sign in first.' }
    }))
    const session = useSessionStore()
    await session.load()
    expect(session.loaded).toBe(true)
    expect(session.signedIn).toBe(false)
    expect(session.memberships).toEqual([])
  })

  it('rethrows other failures so the page can say the server is unreachable', async () => {
    cleanups.push(registerEndpoint('/api/me', (event) => {
      setResponseStatus(event, 500)
      return { statusCode: 500, message: 'boom' }
    }))
    const session = useSessionStore()
    await expect(session.load()).rejects.toBeTruthy()
    expect(session.loaded).toBe(false)
  })

  it('checks roles per competition', async () => {
    cleanups.push(registerEndpoint('/api/me', () => me))
    const session = useSessionStore()
    await session.load()
    expect(session.user?.name).toBe('Rosa Pilot')
    expect(session.rolesIn(competitionId)).toEqual(['scrutineer', 'entrant'])
    expect(session.hasRole(competitionId, ['scrutineer'])).toBe(true)
    expect(session.hasRole(competitionId, ['organiser', 'director'])).toBe(false)
    expect(session.hasRole('another-competition', ['entrant'])).toBe(false)
  })

  it('gives site administrators organiser rights in every competition, as the server does', async () => {
    cleanups.push(registerEndpoint('/api/me', () => ({ user: { ...me.user, isAdmin: true }, memberships: [] })))
    const session = useSessionStore()
    await session.load()
    expect(session.hasRole(competitionId, ['organiser'])).toBe(true)
    expect(session.hasRole(competitionId, ['scrutineer'])).toBe(false)
  })

  it('signs in, then loads memberships; signs out even when the server is unreachable', async () => {
    cleanups.push(registerEndpoint('/api/auth/login', { method: 'POST', handler: () => ({ user: me.user }) }))
    cleanups.push(registerEndpoint('/api/me', () => me))
    const session = useSessionStore()
    await session.signIn({ email: 'pilot@example.org', password: 'glide-demo-2027' })
    expect(session.memberships).toHaveLength(1)

    cleanups.push(registerEndpoint('/api/auth/logout', { method: 'POST', handler: (event) => {
      setResponseStatus(event, 503)
      return {}
    } }))
    await expect(session.signOut()).rejects.toBeTruthy()
    expect(session.signedIn).toBe(false)
  })
})
