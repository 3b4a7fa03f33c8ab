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
  await testDb().raw(`DROP DATABASE IF EXISTS ${name}_reminders`)
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

  it('turn the single reminder setting into a one-item schedule, and keep a reminder sent as sent', async () => {
    const dbName = `${name}_reminders`
    await testDb().raw(`CREATE DATABASE ${dbName}`)
    const url = new URL(process.env.DATABASE_URL!)
    url.pathname = `/${dbName}`
    const db = knex(createKnexConfig(url.toString()))
    try {
      const schedule = '20261208000200_reminder_schedule'
      for (const m of await migrationSource.getMigrations([])) {
        if (m === schedule) break
        await db.migrate.up()
      }
      const [user] = await db('users').insert({ email: 'old@example.org', name: 'Old Entrant', password_hash: 'x' }).returning('id')
      const competitions = await db('competitions').insert([
        { slug: 'ten', name: 'Ten', airfield_name: 'Field', time_zone: 'Europe/Berlin', settings: { reminderDaysBefore: 10, recordersRequired: 2 } },
        { slug: 'odd', name: 'Odd', airfield_name: 'Field', time_zone: 'Europe/Berlin', settings: { reminderDaysBefore: 'soon' } },
        { slug: 'none', name: 'None', airfield_name: 'Field', time_zone: 'Europe/Berlin', settings: { recordersRequired: 1 } },
      ]).returning('id')
      const [klass] = await db('classes').insert({ competition_id: competitions[0].id, name: 'Club', code: 'club' }).returning('id')
      const [entry] = await db('entries').insert({ competition_id: competitions[0].id, class_id: klass.id, entrant_user_id: user.id, status: 'submitted', pilot_name: 'Old', glider_type: 'G', registration: 'D-OLD', comp_id: 'OL' }).returning('id')
      await db('mail_reminders').insert({ entry_id: entry.id, kind: 'pre-event' })

      const [, applied] = await db.migrate.up()
      expect(applied).toEqual([schedule])
      const settings = async () => (await db('competitions').orderBy('slug').select('slug', 'settings')).map(r => [r.slug, r.settings])
      expect(await settings()).toEqual([
        ['none', { recordersRequired: 1 }],
        ['odd', { reminderDays: [30, 14, 3] }],
        ['ten', { recordersRequired: 2, reminderDays: [10] }],
      ])
      expect((await db('mail_reminders').where({ entry_id: entry.id })).map(r => r.kind)).toEqual(['pre-event-10'])

      await db.migrate.down()
      expect((await settings()).find(([slug]) => slug === 'ten')).toEqual(['ten', { recordersRequired: 2, reminderDaysBefore: 10 }])
      expect((await db('mail_reminders').where({ entry_id: entry.id })).map(r => r.kind)).toEqual(['pre-event'])
    }
    finally {
      await db.destroy()
    }
  })
})
