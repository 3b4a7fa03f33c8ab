import { describe, expect, it } from 'vitest'
import { decideAccess, effectiveRoles } from '#shared/utils/access'

const member = { isAdmin: false }
const admin = { isAdmin: true }

describe('decideAccess', () => {
  it('answers 401 when nobody is signed in', () => {
    expect(decideAccess({ user: null, competitionExists: true, rolesHeld: [] }, 'any'))
      .toMatchObject({ allowed: false, status: 401 })
  })

  it('answers 404 for a competition that does not exist', () => {
    expect(decideAccess({ user: admin, competitionExists: false, rolesHeld: [] }, 'any'))
      .toMatchObject({ allowed: false, status: 404 })
  })

  it('hides a competition the user has no role in behind 404, even for a role-free route', () => {
    expect(decideAccess({ user: member, competitionExists: true, rolesHeld: [] }, 'any'))
      .toMatchObject({ allowed: false, status: 404 })
  })

  it('lets any member through a route open to every role', () => {
    expect(decideAccess({ user: member, competitionExists: true, rolesHeld: ['entrant'] }, 'any'))
      .toEqual({ allowed: true, roles: ['entrant'] })
  })

  it('refuses a member without the role with 403 naming the role needed', () => {
    const d = decideAccess({ user: member, competitionExists: true, rolesHeld: ['entrant'] }, ['organiser'])
    expect(d).toEqual({ allowed: false, status: 403, message: 'This needs the organiser role in this competition.' })
  })

  it('names every acceptable role in the refusal', () => {
    const d = decideAccess({ user: member, competitionExists: true, rolesHeld: ['entrant'] }, ['scrutineer', 'director'])
    expect(d).toMatchObject({ status: 403, message: 'This needs the scrutineer or contest director role in this competition.' })
  })

  it('accepts a user holding one of several roles and reports all they hold', () => {
    const d = decideAccess({ user: member, competitionExists: true, rolesHeld: ['entrant', 'scrutineer'] }, ['scrutineer'])
    expect(d).toEqual({ allowed: true, roles: ['scrutineer', 'entrant'] })
  })

  it('gives site administrators organiser rights in every competition', () => {
    expect(decideAccess({ user: admin, competitionExists: true, rolesHeld: [] }, ['organiser']))
      .toEqual({ allowed: true, roles: ['organiser'] })
  })

  it('does not let a site administrator act as scrutineer or director without holding the role', () => {
    expect(decideAccess({ user: admin, competitionExists: true, rolesHeld: [] }, ['scrutineer', 'director']))
      .toMatchObject({ allowed: false, status: 403 })
    expect(decideAccess({ user: admin, competitionExists: true, rolesHeld: ['director'] }, ['director']))
      .toEqual({ allowed: true, roles: ['organiser', 'director'] })
  })
})

describe('effectiveRoles', () => {
  it('orders roles from most to least responsibility and drops duplicates', () => {
    expect(effectiveRoles(['entrant', 'scrutineer', 'organiser', 'director'], true))
      .toEqual(['organiser', 'director', 'scrutineer', 'entrant'])
  })
})
