// Every migration is reversible: on a database of its own, the whole chain goes up, all the
// way down, and up again.
import knex from 'knex'
import { afterAll, describe, expect, it } from 'vitest'
import { createKnexConfig } from '../../knexfile'
import { migrationSource } from '../../migrations/index'
import { closeTestDb, testDb } from '../support/db'

const name = `gridmark_migrations_${process.pid}`
afterAll(async () => {
  await testDb().raw(`DROP DATABASE IF EXISTS ${name}`)
  await closeTestDb()
})

describe('migrations', () => {
  it('apply, roll back completely, and apply again', async () => {
    await testDb().raw(`CREATE DATABASE ${name}`)
    const url = new URL(process.env.DATABASE_URL!)
    url.pathname = `/${name}`
    const db = knex(createKnexConfig(url.toString()))
    try {
      const all = await migrationSource.getMigrations([])
      const [, applied] = await db.migrate.latest()
      expect(applied).toEqual(all)
      await db.migrate.rollback(undefined, true)
      const left = await db.raw(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename NOT LIKE 'knex_migrations%'`)
      expect(left.rows).toEqual([])
      const [, again] = await db.migrate.latest()
      expect(again).toEqual(all)
    }
    finally {
      await db.destroy()
    }
  })
})
