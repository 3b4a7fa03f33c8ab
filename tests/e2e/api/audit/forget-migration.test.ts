// The migration that makes the audit log forget: on a database of its own, the rows already
// written lose their personal values (changes of personal fields keep only that they changed,
// addresses go, the pilot's own withdrawal reason goes, names quoted in finding reasons — also
// a name the pilot had before — become "…"), everything else stays as it was; the log stays
// append-only, and going down makes it strictly so again.
import knex from 'knex'
import { afterAll, describe, expect, it } from 'vitest'
import { createKnexConfig } from '../../../../knexfile'
import { migrationSource } from '../../../../migrations/index'
import { closeTestDb, testDb } from '../../../support/db'

const dbName = `gridmark_audit_forgets_${process.pid}`
afterAll(async () => {
  await testDb().raw(`DROP DATABASE IF EXISTS ${dbName}`)
  await closeTestDb()
})

describe('20261210000400_audit_log_forgets', () => {
  it('scrubs the personal values of the rows already written, keeps the rest, and only lets the details change', async () => {
    await testDb().raw(`CREATE DATABASE ${dbName}`)
    const url = new URL(process.env.DATABASE_URL!)
    url.pathname = `/${dbName}`
    const db = knex(createKnexConfig(url.toString()))
    try {
      const target = '20261210000400_audit_log_forgets'
      for (const m of await migrationSource.getMigrations([])) {
        if (m === target) break
        await db.migrate.up()
      }
      const [user] = await db('users').insert({ email: 'old.pilot@example.org', name: 'Old Pilot', password_hash: 'x' }).returning('id')
      const [competition] = await db('competitions').insert({ slug: 'old-cup', name: 'Old Cup', airfield_name: 'Field', time_zone: 'Europe/Berlin' }).returning('id')
      const [klass] = await db('classes').insert({ competition_id: competition.id, name: 'Club', code: 'club' }).returning('id')
      const [entry] = await db('entries').insert({
        competition_id: competition.id, class_id: klass.id, entrant_user_id: user.id, status: 'accepted',
        pilot_name: 'Oriel Newname', copilot_name: 'Cato Second', glider_type: 'G', registration: 'D-OLD', comp_id: 'OL',
      }).returning('id')
      const row = (action: string, details: Record<string, unknown>, subjectType = 'entry', subjectId: string = entry.id) =>
        ({ actor_user_id: user.id, competition_id: competition.id, action, subject_type: subjectType, subject_id: subjectId, details })
      const inserted = await db('audit_log').insert([
        row('entry.updated', { field: 'pilotPhone', from: '+49 151 5550100', to: '+49 151 5550999' }),
        row('entry.updated', { field: 'pilotName', from: 'Oriel Oldname', to: 'Oriel Newname' }),
        row('entry.updated', { field: 'mtomKg', from: 525, to: 500 }),
        row('findings.changed', { entryId: entry.id, day: '2027-05-02', added: [{ checkId: 'declaration.matches-entry', severity: 'advisory', reason: 'Logger names the pilot “oriel oldname”, the entry says “Oriel Oldname”.' }], removed: [] }),
        row('director.waiver', { entryId: entry.id, checkId: 'declaration.matches-entry', finding: 'Logger names the co-pilot “Cato Second”; the entry has none.', reason: 'Checked by hand' }),
        row('invitation.create', { email: 'someone@example.org', role: 'scrutineer', replaced: [] }, 'invitation', 'i1'),
        row('invitation.accept', { role: 'scrutineer', invitedEmail: 'someone@example.org', acceptedEmail: 'someone@example.org' }, 'invitation', 'i1'),
        row('competition.created', { name: 'Old Cup', organiserUserId: user.id, organiserEmail: 'old.pilot@example.org' }, 'competition', competition.id),
        row('entry.withdrawn', { from: 'accepted', to: 'withdrawn', by: 'entrant', reason: 'A family matter', paidMinor: 0 }),
        row('entry.withdrawn', { from: 'accepted', to: 'withdrawn', by: 'office', reason: 'Failed the weigh-in twice', paidMinor: 0 }),
      ]).returning(['id', 'at'])
      const details = async () => (await db('audit_log').whereIn('id', inserted.map(r => r.id)).orderBy('id').select('details')).map(r => r.details)

      const [, applied] = await db.migrate.up()
      expect(applied).toEqual([target])
      expect(await details()).toEqual([
        { field: 'pilotPhone', changed: true },
        { field: 'pilotName', changed: true },
        { field: 'mtomKg', from: 525, to: 500 },
        { entryId: entry.id, day: '2027-05-02', added: [{ checkId: 'declaration.matches-entry', severity: 'advisory', reason: 'Logger names the pilot “…”, the entry says “…”.' }], removed: [] },
        { entryId: entry.id, checkId: 'declaration.matches-entry', finding: 'Logger names the co-pilot “…”; the entry has none.', reason: 'Checked by hand' },
        { role: 'scrutineer', replaced: [] },
        { role: 'scrutineer' },
        { name: 'Old Cup', organiserUserId: user.id },
        { from: 'accepted', to: 'withdrawn', by: 'entrant', reasonGiven: true, paidMinor: 0 },
        { from: 'accepted', to: 'withdrawn', by: 'office', reason: 'Failed the weigh-in twice', paidMinor: 0 },
      ])
      // Times stay as they were.
      expect((await db('audit_log').whereIn('id', inserted.map(r => r.id)).orderBy('id').pluck('at')).map(String)).toEqual(inserted.map(r => String(r.at)))

      const first = inserted[0]!.id
      await expect(db('audit_log').where({ id: first }).update({ details: {} })).rejects.toThrow(/append-only/)
      await expect(db('audit_log').where({ id: first }).delete()).rejects.toThrow(/append-only/)
      // The forgetting function changes details, and nothing else can ride on it.
      await db.raw('SELECT audit_log_forget(?::bigint[], ?::jsonb[])', [[first], [JSON.stringify({ field: 'pilotPhone', changed: true, checked: 1 })]])
      expect((await db('audit_log').where({ id: first }).first('details')).details).toEqual({ field: 'pilotPhone', changed: true, checked: 1 })
      await expect(db.raw(`SELECT audit_log_forget(ARRAY[?]::bigint[], ARRAY[]::jsonb[])`, [first])).rejects.toThrow(/as many details as rows/)

      await db.migrate.down()
      const fn = await db.raw(`SELECT 1 FROM pg_proc WHERE proname = 'audit_log_forget'`)
      expect(fn.rows).toEqual([])
      await expect(db.transaction(async (trx) => {
        await trx.raw(`SELECT set_config('gridmark.audit_forgetting', 'on', true)`)
        await trx('audit_log').where({ id: first }).update({ details: {} })
      })).rejects.toThrow(/append-only/)
    }
    finally {
      await db.destroy()
    }
  })
})
