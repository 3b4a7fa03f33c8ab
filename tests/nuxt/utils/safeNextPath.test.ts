import { describe, expect, it } from 'vitest'
import { safeNextPath } from '~/utils/safeNextPath'

describe('safeNextPath', () => {
  it('follows same-site paths', () => {
    expect(safeNextPath('/competitions/abc?tab=classes')).toBe('/competitions/abc?tab=classes')
    expect(safeNextPath(['/a', '/b'])).toBe('/a')
  })

  it.each(['https://elsewhere.example/', '//elsewhere.example', '/\\elsewhere.example', 'javascript:alert(1)', '', undefined, 42])(
    'refuses %s and goes home',
    value => expect(safeNextPath(value)).toBe('/'),
  )

  it('never sends a signed-in user back to the sign-in pages', () => {
    expect(safeNextPath('/sign-in?next=/x')).toBe('/')
    expect(safeNextPath('/sign-up')).toBe('/')
    expect(safeNextPath('/sign-in-help')).toBe('/sign-in-help')
  })
})
