// Sign-in, sign-up and password-reset throttling, shared by all app instances through
// PostgreSQL (rate-limiter-flexible).
//
// Sign-in: only failures count, against the client's address (generous: a whole airfield's
// Wi-Fi may be one address) and against the account at that address (so nobody elsewhere can
// lock a named pilot out). The points are taken before the password is checked — one atomic
// upsert each — and given back once it proved right: simultaneous guesses cannot all slip
// past the count, and a successful sign-in leaves both counters as they were.
// Sign-up and password-reset requests count per address, whatever their outcome.
import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible'
import { MESSAGES } from '#shared/constants/messages'
import { clientAddress } from '#server/utils/client-address'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { setResponseHeader } from 'h3'

/** The requests throttled per address alone; the names of their runtime settings. */
export type AddressLimited = 'signUpLimit' | 'passwordResetLimit'

const limiters = new Map<string, RateLimiterPostgres>()

function limiter(keyPrefix: string, points: unknown, windowSeconds: unknown): RateLimiterPostgres {
  let found = limiters.get(keyPrefix)
  if (!found) {
    found = new RateLimiterPostgres({
      storeClient: useDb(),
      storeType: 'knex',
      tableName: 'rate_limits',
      tableCreated: true, // created by migration 20261201000500_rate_limits
      clearExpiredByTimeout: false,
      keyPrefix,
      points: Number(points),
      duration: Number(windowSeconds),
    })
    limiters.set(keyPrefix, found)
  }
  return found
}

function signInLimiters() {
  const { perAddress, perAccountAtAddress, windowSeconds } = useRuntimeConfig().loginLimit
  return {
    address: limiter('login-address', perAddress, windowSeconds),
    pair: limiter('login-pair', perAccountAtAddress, windowSeconds),
  }
}

function tooMany(event: H3Event, res: RateLimiterRes, message: (minutes: number) => string): never {
  const seconds = Math.max(1, Math.ceil(res.msBeforeNext / 1000))
  setResponseHeader(event, 'Retry-After', seconds)
  throw httpError(429, message(Math.ceil(seconds / 60)))
}

/** Takes one point; a refusal answers 429, any other failure (the database) is rethrown. */
async function take(event: H3Event, limit: RateLimiterPostgres, key: string, message: (minutes: number) => string): Promise<void> {
  try {
    await limit.consume(key)
  }
  catch (err) {
    if (err instanceof RateLimiterRes) tooMany(event, err, message)
    throw err
  }
}

/** The account-at-address key: hashed, so the table holds no e-mail addresses. */
export function pairKey(email: string, address: string): string {
  return createHash('sha256').update(`${email.trim().toLowerCase()}\n${address}`).digest('hex')
}

export interface SignInAttempt {
  /** The password was right: the attempt gives its points back and the pair starts afresh. */
  succeeded: () => Promise<void>
}

/**
 * Counts this sign-in as a failure before its password is checked (429 when the address or
 * the account at this address has spent its budget); `succeeded()` takes it back.
 */
export async function takeSignInAttempt(event: H3Event, email: string): Promise<SignInAttempt> {
  const address = clientAddress(event)
  const key = pairKey(email, address)
  const limits = signInLimiters()
  await take(event, limits.address, address, MESSAGES.tooManyAttempts)
  try {
    await take(event, limits.pair, key, MESSAGES.tooManyAttempts)
  }
  catch (err) {
    // Refused before any password was checked: not a failure of this address.
    await limits.address.reward(address, 1)
    throw err
  }
  return {
    succeeded: async () => {
      await Promise.all([limits.address.reward(address, 1), limits.pair.delete(key)])
    },
  }
}

const ADDRESS_LIMITED: Record<AddressLimited, { keyPrefix: string, message: (minutes: number) => string }> = {
  signUpLimit: { keyPrefix: 'signup-address', message: MESSAGES.tooManySignUps },
  passwordResetLimit: { keyPrefix: 'reset-address', message: MESSAGES.tooManyResetRequests },
}

/**
 * Counts one request of this kind against the client's address; 429 once the budget is spent.
 * Sign-up uses it; the password-reset request is meant to (`passwordResetLimit`).
 */
export async function throttleByAddress(event: H3Event, kind: AddressLimited): Promise<void> {
  const { perAddress, windowSeconds } = useRuntimeConfig()[kind]
  const { keyPrefix, message } = ADDRESS_LIMITED[kind]
  await take(event, limiter(keyPrefix, perAddress, windowSeconds), clientAddress(event), message)
}
