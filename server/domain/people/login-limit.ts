// Sign-in throttling, shared by all app instances through PostgreSQL (rate-limiter-flexible).
// Every attempt counts against the client's address; failed ones also count against the
// account, so guessing one person's password from many addresses is slowed too.
import type { H3Event } from 'h3'
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible'
import { MESSAGES } from '#shared/constants/messages'
import { clientAddress } from '#server/utils/client-address'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { setResponseHeader } from 'h3'

let limiters: { address: RateLimiterPostgres, account: RateLimiterPostgres } | undefined

function useLimiters() {
  if (!limiters) {
    const { perAccount, perAddress, windowSeconds } = useRuntimeConfig().loginLimit
    const common = {
      storeClient: useDb(),
      storeType: 'knex',
      tableName: 'rate_limits',
      tableCreated: true, // created by migration 20261201000500_rate_limits
      clearExpiredByTimeout: false,
      duration: Number(windowSeconds),
    }
    limiters = {
      address: new RateLimiterPostgres({ ...common, keyPrefix: 'login-address', points: Number(perAddress) }),
      account: new RateLimiterPostgres({ ...common, keyPrefix: 'login-account', points: Number(perAccount) }),
    }
  }
  return limiters
}

function tooMany(event: H3Event, res: RateLimiterRes): never {
  const seconds = Math.max(1, Math.ceil(res.msBeforeNext / 1000))
  setResponseHeader(event, 'Retry-After', seconds)
  throw httpError(429, MESSAGES.tooManyAttempts(Math.ceil(seconds / 60)))
}

/** Limiter failures that are not a verdict (e.g. the database is down) are rethrown. */
function verdict(event: H3Event, err: unknown): never {
  if (err instanceof RateLimiterRes) tooMany(event, err)
  throw err
}

/** Counts this attempt against the address and refuses when either budget is spent. */
export async function guardLoginAttempt(event: H3Event, email: string): Promise<void> {
  const { address, account } = useLimiters()
  await address.consume(clientAddress(event)).catch(err => verdict(event, err))
  const spent = await account.get(email)
  if (spent && spent.consumedPoints >= account.points) tooMany(event, spent)
}

export async function recordFailedLogin(event: H3Event, email: string): Promise<void> {
  await useLimiters().account.consume(email).catch((err) => {
    if (!(err instanceof RateLimiterRes)) throw err
  })
}

export async function clearFailedLogins(email: string): Promise<void> {
  await useLimiters().account.delete(email)
}
