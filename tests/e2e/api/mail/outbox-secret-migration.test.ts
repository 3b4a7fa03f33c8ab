// The migration that marks invitation e-mails secret: on a database of its own, the invitation
// e-mails already sent lose their bodies (and with them the links), those still waiting are
// marked and keep theirs until sent, and every other e-mail is left as it was.
import knex from 'knex'
import { afterAll, describe, expect, it } from 'vitest'
import { createKnexConfig } from '../../../../knexfile'
import { migrationSource } from '../../../../migrations/index'
import { closeTestDb, testDb } from '../../../support/db'

const dbName = `gridmark_outbox_secret_${process.pid}`
afterAll(async () => {
  await testDb().raw(`DROP DATABASE IF EXISTS ${dbName}`)
  await closeTestDb()
})

describe('20261209000500_outbox_secret_bodies', () => {
  it('empties the sent invitation e-mails, marks the waiting ones, leaves the rest', async () => {
    await testDb().raw(`CREATE DATABASE ${dbName}`)
    const url = new URL(process.env.DATABASE_URL!)
    url.pathname = `/${dbName}`
    const db = knex(createKnexConfig(url.toString()))
    try {
      const target = '20261209000500_outbox_secret_bodies'
      for (const m of await migrationSource.getMigrations([])) {
        if (m === target) break
        await db.migrate.up()
      }
      const link = 'http://127.0.0.1/invitations/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA.BBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBBB'
      const rows = await db('mail_outbox').insert([
        { to_address: 'sent@example.org', subject: 'Invitation: scrutineer at Old Cup', text_body: `Open the invitation:\n${link}`, html_body: `<a href="${link}">Open</a>`, template: 'invitation', sent_at: new Date(), attempts: 1 },
        { to_address: 'waiting@example.org', subject: 'Invitation: organiser at Old Cup', text_body: `Open the invitation:\n${link}`, html_body: `<a href="${link}">Open</a>`, template: 'invitation' },
        { to_address: 'pilot@example.org', subject: 'Entry accepted', text_body: 'Your entry was accepted.', html_body: '<p>Accepted</p>', template: 'entry-accepted', sent_at: new Date(), attempts: 1 },
      ]).returning('id')
      const byAddress = async () => Object.fromEntries((await db('mail_outbox').whereIn('id', rows.map(r => r.id)).select('*')).map(r => [r.to_address, r]))

      const [, applied] = await db.migrate.up()
      expect(applied).toEqual([target])
      const after = await byAddress()
      expect(after['sent@example.org']).toMatchObject({ secret_body: true, html_body: null, subject: 'Invitation: scrutineer at Old Cup' })
      expect(after['sent@example.org'].text_body).not.toContain('/invitations/')
      expect(after['sent@example.org'].text_body).toMatch(/one-time link/)
      // Still to send: the recipient must get the link, so the body stays until it goes.
      expect(after['waiting@example.org']).toMatchObject({ secret_body: true, text_body: `Open the invitation:\n${link}` })
      expect(after['pilot@example.org']).toMatchObject({ secret_body: false, text_body: 'Your entry was accepted.', html_body: '<p>Accepted</p>' })

      await db.migrate.down()
      const columns = await db('information_schema.columns').where({ table_name: 'mail_outbox', column_name: 'secret_body' })
      expect(columns).toEqual([])
    }
    finally {
      await db.destroy()
    }
  })
})
