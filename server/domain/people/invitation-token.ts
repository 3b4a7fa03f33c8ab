// Invitation tokens: 32 random bytes and their HMAC-SHA256 signature, both base64url, joined
// by a dot. The signature lets a forged or mistyped link be refused without a database
// look-up; the database keeps only the token's sha256, so a leaked table accepts nothing.
import { createHash, createHmac, randomBytes, timingSafeEqual } from 'node:crypto'

function sign(random: string, secret: string): string {
  return createHmac('sha256', secret).update(`invitation:${random}`).digest('base64url')
}

export function createInvitationToken(secret: string): string {
  const random = randomBytes(32).toString('base64url')
  return `${random}.${sign(random, secret)}`
}

/** True when the token has the right shape and was signed with this secret. */
export function verifyInvitationToken(token: string, secret: string): boolean {
  const match = /^([\w-]{43})\.([\w-]{43})$/.exec(token)
  if (!match) return false
  const expected = Buffer.from(sign(match[1]!, secret))
  const given = Buffer.from(match[2]!)
  return expected.length === given.length && timingSafeEqual(expected, given)
}

export function hashInvitationToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}
