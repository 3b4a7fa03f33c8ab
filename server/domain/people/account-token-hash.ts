// The one-time tokens of account links: 32 random bytes in base64url, kept only as their
// SHA-256 hash. Plain node:crypto with no imports of the app, so the admin:create script shares it.
import { createHash, randomBytes } from 'node:crypto'

export type AccountTokenPurpose = 'password-reset' | 'email-verify' | 'set-password'

/** How long each kind of link works. */
export const ACCOUNT_TOKEN_LIFETIME_MS: Record<AccountTokenPurpose, number> = {
  'password-reset': 60 * 60 * 1000,
  'email-verify': 24 * 60 * 60 * 1000,
  'set-password': 24 * 60 * 60 * 1000,
}

export function hashAccountToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

export function newAccountToken(): { token: string, hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashAccountToken(token) }
}

/** The page each kind of link opens, under the site's address. */
export function accountLink(base: string, purpose: AccountTokenPurpose, token: string, next?: string): string {
  const path = purpose === 'email-verify' ? '/verify-email' : '/password/reset'
  const query = new URLSearchParams({ token })
  if (next) query.set('next', next)
  return `${base.replace(/\/+$/, '')}${path}?${query.toString()}`
}
