// Brings the schema up to date when the server starts. The start and test scripts migrate
// first anyway; this covers a server deployed on its own. If PostgreSQL is down, the server
// still starts (health answers 503) and keeps retrying until the database returns.
// Migrations run on a connection of their own, without the statement and lock timeouts every
// request has: a schema change on a large table may rightly take long.
import knex from 'knex'
import { createKnexConfig } from '../../knexfile'
import { closeDb, databaseUrl, markSchemaReady } from '../utils/db'

const RETRY_MS = 5000

export default defineNitroPlugin((nitroApp) => {
  let stopped = false
  let timer: ReturnType<typeof setTimeout> | undefined

  const attempt = async () => {
    const migrator = knex({ ...createKnexConfig(databaseUrl(), { timeouts: false }), pool: { min: 0, max: 2 } })
    try {
      const [, applied] = await migrator.migrate.latest()
      if (applied.length) console.info(`[gridmark] applied migrations: ${applied.join(', ')}`)
      markSchemaReady()
    }
    catch (err) {
      console.warn(`[gridmark] migrations not run (${(err as Error).message}); retrying in ${RETRY_MS / 1000} s`)
      if (!stopped) timer = setTimeout(attempt, RETRY_MS)
    }
    finally {
      await migrator.destroy()
    }
  }
  void attempt()

  nitroApp.hooks.hook('close', async () => {
    stopped = true
    clearTimeout(timer)
    await closeDb()
  })
})
