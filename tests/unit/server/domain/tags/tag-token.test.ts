// Glider tag tokens: 43 base64url characters, signed for one competition; anything forged,
// cut short or moved to another competition does not verify.
import { describe, expect, it } from 'vitest'
import { createTagToken, hashTagToken, tagTokenFromNonce, verifyTagToken } from '#domain/tags/tag-token'
import { TAG_TOKEN_PATTERN, tagTokenSchema } from '#shared/schemas/tags'

const SECRET = 'a-test-secret-that-is-at-least-32-characters'
const COMPETITION = '7c1f3a52-94e1-4b7e-9a3c-2f0d5e6b8a91'
const OTHER_COMPETITION = '0b9e2d44-1f6a-4c83-8e57-6a2b3c4d5e6f'

describe('tag tokens', () => {
  it('round-trips: a created token verifies, matches the shared schema, and is rebuilt from its nonce', () => {
    const { token, nonce } = createTagToken(SECRET, COMPETITION)
    expect(token).toHaveLength(43)
    expect(token).toMatch(TAG_TOKEN_PATTERN)
    expect(tagTokenSchema.safeParse(token).success).toBe(true)
    expect(verifyTagToken(token, SECRET, COMPETITION)).toBe(true)
    expect(tagTokenFromNonce(SECRET, COMPETITION, nonce)).toBe(token)
  })

  it('makes a different token every time', () => {
    const tokens = new Set(Array.from({ length: 50 }, () => createTagToken(SECRET, COMPETITION).token))
    expect(tokens.size).toBe(50)
  })

  it('refuses a forged signature (one character changed) and a token signed with another secret', () => {
    const { token } = createTagToken(SECRET, COMPETITION)
    const last = token.at(-1) === 'A' ? 'B' : 'A'
    expect(verifyTagToken(token.slice(0, -1) + last, SECRET, COMPETITION)).toBe(false)
    const tamperedNonce = (token[0] === 'A' ? 'B' : 'A') + token.slice(1)
    expect(verifyTagToken(tamperedNonce, SECRET, COMPETITION)).toBe(false)
    expect(verifyTagToken(token, 'another-secret-that-is-also-long-enough', COMPETITION)).toBe(false)
  })

  it('refuses a truncated or over-long token, and garbage', () => {
    const { token } = createTagToken(SECRET, COMPETITION)
    expect(verifyTagToken(token.slice(0, 42), SECRET, COMPETITION)).toBe(false)
    expect(verifyTagToken(`${token}A`, SECRET, COMPETITION)).toBe(false)
    expect(verifyTagToken('', SECRET, COMPETITION)).toBe(false)
    expect(verifyTagToken('!'.repeat(43), SECRET, COMPETITION)).toBe(false)
  })

  it('refuses a token of one competition for another', () => {
    const { token, nonce } = createTagToken(SECRET, COMPETITION)
    expect(verifyTagToken(token, SECRET, OTHER_COMPETITION)).toBe(false)
    expect(tagTokenFromNonce(SECRET, OTHER_COMPETITION, nonce)).not.toBe(token)
  })

  it('stores a sha256 hex hash, not the token', () => {
    const { token } = createTagToken(SECRET, COMPETITION)
    const hash = hashTagToken(token)
    expect(hash).toMatch(/^[0-9a-f]{64}$/)
    expect(hash).not.toContain(token)
    expect(hashTagToken(token)).toBe(hash)
  })
})
