// What a production start says about its three secrets (server/plugins/00.production-start.ts).
import { describe, expect, it } from 'vitest'
import { secretProblems } from '#domain/people/secrets'

const a = 'a'.repeat(32)
const b = 'b'.repeat(40)
const c = 'c'.repeat(33)

describe('secretProblems', () => {
  it('accepts three different secrets of at least 32 characters', () => {
    expect(secretProblems({ session: a, tag: b, invitation: c })).toEqual([])
  })

  it('names each missing or short secret and its length', () => {
    expect(secretProblems({ session: '', tag: 'short', invitation: c })).toEqual([
      'NUXT_SESSION_PASSWORD is not set.',
      'NUXT_TAG_SECRET is 5 characters long; it needs at least 32.',
    ])
  })

  it('refuses one value for two secrets, and says which', () => {
    expect(secretProblems({ session: a, tag: b, invitation: b })).toEqual(['NUXT_TAG_SECRET and NUXT_INVITATION_SECRET are the same; each needs its own value.'])
    expect(secretProblems({ session: a, tag: a, invitation: a })).toHaveLength(3)
  })
})
