// Schema and demo data, through the same knex configuration the server uses.
import knex from 'knex'
import type { Knex } from 'knex'
import { createKnexConfig } from '../../knexfile'
import { seedDemo } from '../../seeds/demo'
import { ScriptError } from './common'

/**
 * Opens a connection pool for one task and always closes it, so the script can exit. Without
 * the server's statement and lock timeouts: a migration or a seed may rightly take long.
 */
async function withKnex<T>(url: string, task: (db: Knex) => Promise<T>): Promise<T> {
  const db = knex(createKnexConfig(url, { timeouts: false }))
  try {
    return await task(db)
  }
  catch (error) {
    throw new ScriptError(`${describeTarget(url)}: ${(error as Error).message}`, { cause: error })
  }
  finally {
    await db.destroy()
  }
}

/** The URL without any password, for messages. */
function describeTarget(url: string): string {
  try {
    const parsed = new URL(url)
    parsed.password = ''
    return `Database ${parsed.toString()}`
  }
  catch {
    return 'Database (unparsable DATABASE_URL)'
  }
}

/** Applies every pending migration. Returns the names of those applied. */
export function migrate(url: string): Promise<string[]> {
  return withKnex(url, async (db) => {
    const [, applied] = await db.migrate.latest() as [number, string[]]
    return applied
  })
}

/**
 * Seeds the demo data: once (no-op when present), or wiped and re-seeded with reset.
 * `sessionPassword` is the one the server will get: unless NUXT_TAG_SECRET is set, it signs
 * the demo's glider tags. `filesKey` is the server's NUXT_FILES_KEY: it seals the demo's files.
 */
export function seed(url: string, reset: boolean, sessionPassword: string, filesKey: string): Promise<{ seeded: boolean }> {
  return withKnex(url, db => seedDemo(db, { reset, tagSecret: process.env.NUXT_TAG_SECRET || sessionPassword, filesKey }))
}
