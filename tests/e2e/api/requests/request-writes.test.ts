// What a request may have changed, as knex reports it against the real PostgreSQL: the
// record behind "nothing was changed" (server/utils/errors.ts), with the same hook the server's
// knex instance has (server/utils/db.ts). A transaction rolled back changed nothing; a write
// outside one, or a committed transaction that wrote, may have.
import { randomUUID } from 'node:crypto'
import knex, { type Knex } from 'knex'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createKnexConfig } from '../../../../knexfile'
import { mayHaveChanged, noteStatement, trackRequestWrites } from '../../../../server/utils/errors'

let db: Knex
beforeAll(() => {
  db = knex(createKnexConfig(process.env.DATABASE_URL!))
  db.on('query', noteStatement)
})
afterAll(() => db.destroy())

const key = () => `request-writes-test:${randomUUID()}`
/** Runs `work` as one request would, and tells whether it may have changed anything. */
const changedBy = (work: () => Promise<unknown>) => trackRequestWrites(async () => {
  await work().catch(() => {})
  return mayHaveChanged()
})

describe('what a request may have changed', () => {
  it('nothing, when it only read, or when its transaction wrote and rolled back', async () => {
    expect(await changedBy(() => db('rate_limits').where({ key: key() }).first())).toBe(false)
    expect(await changedBy(() => db.transaction(async (trx) => {
      await trx('rate_limits').insert({ key: key(), points: 1 })
      throw new Error('refused after the write')
    }))).toBe(false)
    expect(await changedBy(() => db.transaction(trx => trx('rate_limits').where({ key: key() }).forShare().first()))).toBe(false)
  })

  it('maybe something, once a write outside a transaction was sent, or a transaction that wrote committed', async () => {
    const k1 = key()
    expect(await changedBy(() => db('rate_limits').insert({ key: k1, points: 1 }))).toBe(true)
    const k2 = key()
    expect(await changedBy(async () => {
      await db.transaction(trx => trx('rate_limits').insert({ key: k2, points: 1 }))
      throw new Error('failed after the commit')
    })).toBe(true)
    await db('rate_limits').whereIn('key', [k1, k2]).delete()
  })

  it('keeps each request’s record apart while they run side by side', async () => {
    const k = key()
    const [writer, reader] = await Promise.all([
      changedBy(() => db('rate_limits').insert({ key: k, points: 1 })),
      changedBy(() => db('rate_limits').where({ key: k }).first()),
    ])
    expect([writer, reader]).toEqual([true, false])
    await db('rate_limits').where({ key: k }).delete()
  })
})
