import type { Knex } from 'knex'

// Glider tags: the printed QR sticker of an accepted entry. The QR code carries a signed
// token (a random nonce with an HMAC over it); only its SHA-256 is stored for lookup, with the
// nonce kept so the organiser can print the same tag again. The 8-character short code is for
// typing by hand; it stays reserved within the competition after its tag is revoked, so an old
// code never resolves to another glider. Reissuing revokes the entry's current tag.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('tags', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    /** SHA-256 (hex) of the token the QR code carries. */
    t.string('token_hash', 64).notNullable().unique()
    /** The token's random part (base64url); with the server's key it gives the token again. */
    t.string('nonce', 32).notNullable()
    t.string('short_code', 8).notNullable()
    t.uuid('issued_by').notNullable().references('users.id').onDelete('RESTRICT')
    t.timestamp('issued_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.timestamp('revoked_at', { useTz: true })
    t.uuid('revoked_by').references('users.id').onDelete('RESTRICT')
    t.unique(['competition_id', 'short_code'])
    t.index(['entry_id'])
  })
  await knex.raw('CREATE UNIQUE INDEX tags_current_entry ON tags (entry_id) WHERE revoked_at IS NULL')
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('tags')
}
