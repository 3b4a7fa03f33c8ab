import type { Knex } from 'knex'

// The id of the key each stored file is sealed under (server/domain/files/file-crypt.ts), beside
// the file's row, so a key rotation can count with SQL what is still under an older key. Null is
// a file stored before encryption, plain: `npm run files:rekey` seals it too.
const TABLES = ['documents', 'igc_files'] as const

export async function up(knex: Knex): Promise<void> {
  for (const table of TABLES) {
    await knex.schema.alterTable(table, (t) => {
      /** 16 hex digits (the start of the key's SHA-256); null for a plain file stored before encryption. */
      t.string('file_key_id', 16)
    })
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const table of TABLES) {
    await knex.schema.alterTable(table, (t) => {
      t.dropColumn('file_key_id')
    })
  }
}
