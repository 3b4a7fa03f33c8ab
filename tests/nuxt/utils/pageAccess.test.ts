import { describe, expect, it } from 'vitest'
import type { Role } from '#shared/constants/roles'
import { MESSAGES } from '#shared/constants/messages'
import { decidePageAccess, type PageAccessTarget, type PageViewer } from '~/utils/pageAccess'

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
