// Invitation tokens: signed with the server's secret, refused when forged or malformed.
import { describe, expect, it } from 'vitest'
import { createInvitationToken, hashInvitationToken, verifyInvitationToken } from '#domain/people/invitation-token'

const SECRET = 'a-test-secret-that-is-at-least-32-characters'

describe('invitation tokens', () => {
  it('verifies a token it created, and each token is different', () => {
    const a = createInvitationToken(SECRET)
    const b = createInvitationToken(SECRET)
    expect(a).toMatch(/^[\w-]{43}\.[\w-]{43}$/)
    expect(a).not.toBe(b)
    expect(verifyInvitationToken(a, SECRET)).toBe(true)
  })

  it('refuses a token signed with another secret', () => {
    expect(verifyInvitationToken(createInvitationToken('another-secret-of-enough-length-here!'), SECRET)).toBe(false)
  })

  it('refuses a changed random part or signature', () => {
    const token = createInvitationToken(SECRET)
    const [random, signature] = token.split('.') as [string, string]
    const flip = (s: string) => `${s[0] === 'A' ? 'B' : 'A'}${s.slice(1)}`
    expect(verifyInvitationToken(`${flip(random)}.${signature}`, SECRET)).toBe(false)
    expect(verifyInvitationToken(`${random}.${flip(signature)}`, SECRET)).toBe(false)
    expect(verifyInvitationToken(`${random}.${random}`, SECRET)).toBe(false)
  })

  it('refuses malformed input', () => {
    for (const bad of ['', 'abc', 'a.b', `${'a'.repeat(43)}.${'b'.repeat(42)}`, `${'a'.repeat(43)}:${'b'.repeat(43)}`, `${createInvitationToken(SECRET)}x`]) {
      expect(verifyInvitationToken(bad, SECRET)).toBe(false)
    }
  })

  it('hashes to 64 hex digits, the same for the same token', () => {
    const token = createInvitationToken(SECRET)
    expect(hashInvitationToken(token)).toMatch(/^[0-9a-f]{64}$/)
    expect(hashInvitationToken(token)).toBe(hashInvitationToken(token))
    expect(hashInvitationToken(token)).not.toBe(hashInvitationToken(createInvitationToken(SECRET)))
  })
})
