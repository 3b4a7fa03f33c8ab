// The one Knex instance of this server process, created on first use.
import { createHash } from 'node:crypto'
import knex, { type Knex } from 'knex'
import { createKnexConfig } from '../../knexfile'
import { noteStatement } from './errors'

let instance: Knex | undefined

export function databaseUrl(): string {
  // DATABASE_URL is the operators' usual name; NUXT_DATABASE_URL also works via runtimeConfig.
  const url = process.env.DATABASE_URL || useRuntimeConfig().databaseUrl
  if (!url) throw new Error('DATABASE_URL is not set: point it at a PostgreSQL database.')
  return url
}

export function useDb(): Knex {
  if (!instance) {
    instance = knex(createKnexConfig(databaseUrl()))
    // What each request sends, so an error can say "nothing was changed" when that is certain.
    instance.on('query', noteStatement)
  }
  return instance
}

/**
 * `query` as a prepared statement of the connection it runs on, named by a digest of its text:
 * PostgreSQL parses it once per connection and, after a few runs, stops planning it again —
 * for a large statement the planning took longer than running it. For the few statements run
 * again and again with only their values changing (a grid check's, under the board's lock);
 * a statement whose text changes with its input (a list of rows) would fill the cache.
 */
export function prepared<Q extends Knex.QueryBuilder | Knex.Raw>(query: Q): Q {
  const text = query.toSQL().toNative().sql
  return query.options({ name: `gm_${createHash('sha1').update(text).digest('hex').slice(0, 24)}` }) as Q
}

/** True when PostgreSQL answers a trivial query within the pool's timeout. */
export async function pingDatabase(): Promise<boolean> {
  try {
    await useDb().raw('select 1')
    return true
  }
  catch {
    return false
  }
}

export async function closeDb(): Promise<void> {
  await instance?.destroy()
  instance = undefined
}

let schemaReady!: () => void
const schemaReadyPromise = new Promise<void>((resolve) => {
  schemaReady = resolve
})

/** Called by the migration plugin once the schema is up to date. */
export function markSchemaReady(): void {
  schemaReady()
}

/** Resolves once this server has brought the schema up to date (work that reads new tables waits for it). */
export function whenSchemaReady(): Promise<void> {
  return schemaReadyPromise
}

type Task<T> = PromiseLike<T> | (() => PromiseLike<T>)
type Results<T extends readonly Task<unknown>[]> = { -readonly [K in keyof T]: T[K] extends Task<infer R> ? R : never }

/**
 * Independent reads: side by side on the pool, one after the other inside a transaction. A
 * transaction is one connection, which runs one query at a time anyway; handing it several at
 * once only queues them in the driver, which warns that it will stop doing so. Pass knex
 * query builders (they start when awaited) or functions that start the work.
 */
export async function together<T extends readonly Task<unknown>[]>(db: Knex, tasks: T): Promise<Results<T>> {
  const start = (t: Task<unknown>) => (typeof t === 'function' ? t() : t)
  if ((db as Knex.Transaction).isTransaction) {
    const out: unknown[] = []
    for (const t of tasks) out.push(await start(t))
    return out as Results<T>
  }
  return Promise.all(tasks.map(start)) as Promise<Results<T>>
}
