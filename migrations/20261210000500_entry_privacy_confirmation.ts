import type { Knex } from 'knex'

// The pilot confirms the competition's privacy notice when entering: the entry keeps when, and
// which wording (a digest of the notice as it read then: organisers, contact, retention), so a
// later change of the notice can be told apart. Entries older than this have neither.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('entries', (t) => {
    t.timestamp('privacy_confirmed_at', { useTz: true })
    t.string('privacy_notice_version', 64)
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('entries', (t) => {
    t.dropColumn('privacy_confirmed_at')
    t.dropColumn('privacy_notice_version')
  })
}
