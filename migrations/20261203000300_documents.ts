import type { Knex } from 'knex'

// Documents of an entry (airworthiness review, insurance, licence, medical, other). The file
// lives in the uploads storage under storage_key; this row holds its metadata and checksum.
// A re-upload of the same kind supersedes the current row, which stays as history.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('documents', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.text('kind').notNullable()
    t.text('original_filename').notNullable()
    t.text('media_type').notNullable()
    t.integer('size_bytes').notNullable()
    t.string('sha256', 64).notNullable()
    t.text('storage_key').notNullable().unique()
    t.date('expires_on').notNullable()
    t.text('status').notNullable().defaultTo('pending')
    t.text('review_reason')
    t.uuid('reviewed_by').references('users.id').onDelete('SET NULL')
    t.timestamp('reviewed_at', { useTz: true })
    t.uuid('uploaded_by').notNullable().references('users.id').onDelete('RESTRICT')
    t.timestamp('uploaded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.uuid('replaced_by').references('documents.id').onDelete('SET NULL')
    t.boolean('superseded').notNullable().defaultTo(false)
    t.index(['entry_id', 'kind'])
  })
  await knex.raw(`ALTER TABLE documents ADD CONSTRAINT documents_kind_known
    CHECK (kind IN ('airworthiness', 'insurance', 'licence', 'medical', 'other'))`)
  await knex.raw(`ALTER TABLE documents ADD CONSTRAINT documents_status_known
    CHECK (status IN ('pending', 'accepted', 'rejected'))`)
  await knex.raw(`ALTER TABLE documents ADD CONSTRAINT documents_media_type_known
    CHECK (media_type IN ('application/pdf', 'image/jpeg', 'image/png'))`)
  // One current document per kind and entry; the queue reads pending current ones, oldest first.
  await knex.raw('CREATE UNIQUE INDEX documents_current_kind ON documents (entry_id, kind) WHERE NOT superseded')
  await knex.raw(`CREATE INDEX documents_queue ON documents (competition_id, uploaded_at)
    WHERE status = 'pending' AND NOT superseded`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('documents')
}
