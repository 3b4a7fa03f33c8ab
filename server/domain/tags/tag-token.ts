// Glider tag tokens: a 16-byte random nonce and the first 16 bytes of
// HMAC-SHA256(secret, 'tag:<competitionId>:<nonce>'), joined and written base64url (43
// characters). The competition is inside the signature, so a token moved to another
// competition does not verify; the database keeps the token's sha256 and the nonce, so the
// same sticker can be printed again while nobody can rebuild a token from a leaked table.
import { createHash, createHmac, randomBytes, timingSafeEqual } from 'node:crypto'

const NONCE_BYTES = 16
const SIGNATURE_BYTES = 16
const TOKEN_RE = /^[\w-]{43}$/

function signature(secret: string, competitionId: string, nonce: Buffer): Buffer {
  return createHmac('sha256', secret)
    .update(`tag:${competitionId}:${nonce.toString('base64url')}`)
    .digest()
    .subarray(0, SIGNATURE_BYTES)
}

/** The token of a nonce (base64url, as stored) in a competition. */
export function tagTokenFromNonce(secret: string, competitionId: string, nonce: string): string {
  const raw = Buffer.from(nonce, 'base64url')
  if (raw.length !== NONCE_BYTES) throw new Error('A tag nonce has 16 bytes.')
  return Buffer.concat([raw, signature(secret, competitionId, raw)]).toString('base64url')
}

/** A new token and the nonce to store beside its hash. */
export function createTagToken(secret: string, competitionId: string, nonce = randomBytes(NONCE_BYTES)): { token: string, nonce: string } {
  const nonceText = nonce.toString('base64url')
  return { token: tagTokenFromNonce(secret, competitionId, nonceText), nonce: nonceText }
}

/** True when the token has the right shape and was signed with this secret for this competition. */
export function verifyTagToken(token: string, secret: string, competitionId: string): boolean {
  if (!TOKEN_RE.test(token)) return false
  const raw = Buffer.from(token, 'base64url')
  if (raw.length !== NONCE_BYTES + SIGNATURE_BYTES) return false
  // 43 characters carry 258 bits for 256: the last one has two spare bits. Only the canonical
  // spelling counts, so one changed character is always a different token.
  if (raw.toString('base64url') !== token) return false
  const expected = signature(secret, competitionId, raw.subarray(0, NONCE_BYTES))
  return timingSafeEqual(expected, raw.subarray(NONCE_BYTES))
}

export function hashTagToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}
