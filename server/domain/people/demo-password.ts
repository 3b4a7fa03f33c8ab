// Accounts that still have the demo's published password: a production start refuses to run
// while there is one (a database seeded by `npm start`, or someone who chose that password).
import type { Knex } from 'knex'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { DEMO_PASSWORD } from '#shared/constants/demo'
import { useDb } from '#server/utils/db'

// Reads the parameters from each stored hash, so it verifies whatever sign-up wrote.
const hasher = new Hash(new Scrypt({}))
/** Verifications at once: scrypt runs on libuv's pool of four threads. */
const PARALLEL = 4

/**
 * The e-mail addresses of accounts whose password is the demo's. Every distinct stored hash is
 * verified once (about 50 ms of one core each; the demo's accounts share one), so the time
 * grows with the number of accounts.
 */
export async function accountsWithDemoPassword(db: Knex = useDb()): Promise<string[]> {
  const rows = await db('users').select('email', 'password_hash').orderBy('email') as { email: string, password_hash: string | null }[]
  const byHash = new Map<string, string[]>()
  for (const row of rows) {
    if (!row.password_hash) continue
    byHash.set(row.password_hash, [...byHash.get(row.password_hash) ?? [], row.email])
  }
  const hashes = [...byHash.keys()]
  const found: string[] = []
  for (let i = 0; i < hashes.length; i += PARALLEL) {
    const batch = hashes.slice(i, i + PARALLEL)
    const matches = await Promise.all(batch.map(hash => hasher.verify(hash, DEMO_PASSWORD).catch(() => false)))
    batch.forEach((hash, j) => {
      if (matches[j]) found.push(...byHash.get(hash)!)
    })
  }
  return found.sort()
}
