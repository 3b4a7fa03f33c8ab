// `prepared` (server/utils/db.ts): the grid check's statements run as prepared statements of
// their connection, named by their text, so PostgreSQL parses and plans them once per
// connection instead of at every check. Checked on the real server: the statement is kept by
// PostgreSQL under its name, gives the right answer for each value, and another text gets
// another name (one name for two texts would make the driver refuse the second).
import { afterAll, describe, expect, it } from 'vitest'
import { prepared } from '../../server/utils/db'
import { closeTestDb, testDb } from '../support/db'

afterAll(closeTestDb)

describe('prepared statements', () => {
  it('are kept by the connection under a name of their text and answer for each value', async () => {
    await testDb().transaction(async (trx) => {
      const twice = (n: number) => prepared(trx.raw('select ?::int * 2 as n', [n]))
      const plus = (n: number) => prepared(trx.raw('select ?::int + 2 as n', [n]))
      const answers: number[] = []
      for (const n of [21, 5, 8]) answers.push(Number((await twice(n)).rows[0].n))
      answers.push(Number((await plus(1)).rows[0].n))
      expect(answers).toEqual([42, 10, 16, 3])

      // The transaction keeps one connection: its prepared statements are the ones above.
      const { rows } = await trx.raw(`select name, statement from pg_prepared_statements where name like 'gm\\_%' order by statement`)
      expect(rows.map((r: { statement: string }) => r.statement)).toEqual(['select $1::int * 2 as n', 'select $1::int + 2 as n'])
      expect(rows[0].name).not.toBe(rows[1].name)
      expect(rows[0].name).toMatch(/^gm_[0-9a-f]{24}$/)
    })
  })

  it('name a query builder’s statement by its text, whatever the values', () => {
    const db = testDb()
    const a = prepared(db('entries').where({ id: '00000000-0000-4000-8000-000000000001' }).first('id'))
    const b = prepared(db('entries').where({ id: '00000000-0000-4000-8000-000000000002' }).first('id'))
    const c = prepared(db('entries').where({ comp_id: 'AB1' }).first('id'))
    // The name the driver is handed, as knex compiles the statement for it.
    const nameOf = (q: typeof a) => (q.toSQL() as { options?: { name?: string } }).options?.name
    expect(nameOf(a)).toMatch(/^gm_[0-9a-f]{24}$/)
    expect(nameOf(b)).toBe(nameOf(a))
    expect(nameOf(c)).not.toBe(nameOf(a))
  })
})
