import { describe, expect, it } from 'vitest'
import type { Role } from '#shared/constants/roles'
import { MESSAGES } from '#shared/constants/messages'
import { KEPT_SESSION_MAX_AGE_MS, decidePageAccess, mayUseKeptSession, offlinePageOf, type PageAccessTarget, type PageViewer } from '~/utils/pageAccess'

const competitionId = 'c1'
const visitor: PageViewer = { user: null, rolesIn: () => [] }
const scrutineer: PageViewer = { user: { isAdmin: false }, rolesIn: (id): Role[] => (id === competitionId ? ['scrutineer'] : []) }
const admin: PageViewer = { user: { isAdmin: true }, rolesIn: () => [] }

function page(overrides: Partial<PageAccessTarget> = {}): PageAccessTarget {
  return { matched: true, fullPath: `/competitions/${competitionId}/grid`, query: {}, params: { competitionId }, ...overrides }
}

describe('decidePageAccess', () => {
  it('sends a visitor to sign in and remembers where they were going', () => {
    expect(decidePageAccess(page(), visitor)).toEqual({
      kind: 'redirect',
      to: { path: '/sign-in', query: { next: `/competitions/${competitionId}/grid` } },
    })
  })

  it('lets anyone see public pages and lets unknown addresses reach their 404', () => {
    expect(decidePageAccess(page({ auth: 'public' }), visitor)).toEqual({ kind: 'allow' })
    expect(decidePageAccess(page({ matched: false }), visitor)).toEqual({ kind: 'allow' })
  })

  it('sends a signed-in user away from guest pages, to a safe ?next only', () => {
    expect(decidePageAccess(page({ auth: 'guest', query: { next: '/competitions/c1' } }), scrutineer))
      .toEqual({ kind: 'redirect', to: '/competitions/c1' })
    expect(decidePageAccess(page({ auth: 'guest', query: { next: '//elsewhere.example' } }), scrutineer))
      .toEqual({ kind: 'redirect', to: '/' })
    expect(decidePageAccess(page({ auth: 'guest' }), visitor)).toEqual({ kind: 'allow' })
  })

  it('checks the roles a page asks for in the competition of the address', () => {
    expect(decidePageAccess(page({ roles: ['scrutineer', 'director'] }), scrutineer)).toEqual({ kind: 'allow' })
    expect(decidePageAccess(page({ roles: ['organiser', 'director'] }), scrutineer)).toEqual({
      kind: 'deny',
      status: 403,
      message: MESSAGES.roleRequired('organiser or contest director'),
    })
  })

  it('treats another competition, or a page without one, as not found', () => {
    expect(decidePageAccess(page({ roles: ['scrutineer'], params: { competitionId: 'c2' } }), scrutineer))
      .toMatchObject({ kind: 'deny', status: 404 })
    expect(decidePageAccess(page({ roles: ['scrutineer'], params: {} }), scrutineer))
      .toMatchObject({ kind: 'deny', status: 404 })
  })

  it('gives site administrators organiser pages everywhere, but not the roles they do not hold', () => {
    expect(decidePageAccess(page({ roles: ['organiser'] }), admin)).toEqual({ kind: 'allow' })
    expect(decidePageAccess(page({ roles: ['scrutineer'] }), admin)).toMatchObject({ kind: 'deny', status: 403 })
  })
})

describe('offlinePageOf', () => {
  it('names the pages that open from the day’s pack: the launch grid, a grid check, a tag link', () => {
    expect(offlinePageOf('/competitions/c1/grid')).toEqual({ kind: 'grid', competitionId: 'c1' })
    expect(offlinePageOf('/competitions/c1/grid/')).toEqual({ kind: 'grid', competitionId: 'c1' })
    expect(offlinePageOf('/competitions/c1/grid/e9')).toEqual({ kind: 'grid', competitionId: 'c1' })
    expect(offlinePageOf(`/t/${'A'.repeat(43)}`)).toEqual({ kind: 'tag' })
  })

  it('names no other page', () => {
    for (const path of ['/', '/competitions/c1', '/competitions/c1/board', '/competitions/c1/grid/e9/extra', '/competitions/c1/entries/e9', '/t/', '/sign-in', '/competitions/%E0%A4%A/grid']) {
      expect(offlinePageOf(path), path).toBeNull()
    }
  })
})

describe('mayUseKeptSession', () => {
  const now = new Date('2027-07-12T09:00:00Z')
  const grid = offlinePageOf('/competitions/c1/grid/e9')
  const fresh = { page: grid, status: undefined, keptSeenAt: '2027-07-11T18:00:00Z', packKept: true, now }

  it('goes on offline with a recently confirmed session when the competition’s pack is on the phone', () => {
    expect(mayUseKeptSession(fresh)).toBe(true)
    expect(mayUseKeptSession({ ...fresh, keptSeenAt: new Date(now.getTime() - KEPT_SESSION_MAX_AGE_MS).toISOString() })).toBe(true)
  })

  it('does not when the server answered, with no pack of that competition, or with no page from the pack', () => {
    expect(mayUseKeptSession({ ...fresh, status: 500 })).toBe(false)
    expect(mayUseKeptSession({ ...fresh, status: 401 })).toBe(false)
    expect(mayUseKeptSession({ ...fresh, packKept: false })).toBe(false)
    expect(mayUseKeptSession({ ...fresh, page: offlinePageOf('/competitions/c1/board') })).toBe(false)
  })

  it('does not without a kept session, or with one older than the sign-in cookie or from the future', () => {
    expect(mayUseKeptSession({ ...fresh, keptSeenAt: null })).toBe(false)
    expect(mayUseKeptSession({ ...fresh, keptSeenAt: new Date(now.getTime() - KEPT_SESSION_MAX_AGE_MS - 1).toISOString() })).toBe(false)
    expect(mayUseKeptSession({ ...fresh, keptSeenAt: '2027-07-13T09:00:00Z' })).toBe(false)
    expect(mayUseKeptSession({ ...fresh, keptSeenAt: 'not a date' })).toBe(false)
  })

  it('lets a tag link through without a particular pack: its page says when no kept pack knows the tag', () => {
    expect(mayUseKeptSession({ ...fresh, page: { kind: 'tag' }, packKept: false })).toBe(true)
    expect(mayUseKeptSession({ ...fresh, page: { kind: 'tag' }, keptSeenAt: null })).toBe(false)
  })
})
