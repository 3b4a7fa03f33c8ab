import type { Knex } from 'knex'

// Every opening of a pilot's medical or licence file: which document, whose entry, who opened it
// under which role, when and from which address. Written by the file route before the bytes
// leave. The document's kind is kept on the row, and the row outlives the document (a deleted
// account's medical file goes; the record that someone read it stays, pointing at nothing).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('document_views', (t) => {
    t.bigIncrements('id').primary()
    t.uuid('document_id').references('documents.id').onDelete('SET NULL')
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.text('document_kind').notNullable()
    t.uuid('viewer_user_id').notNullable().references('users.id').onDelete('RESTRICT')
    t.text('viewer_role').notNullable()
    t.text('client_address').notNullable()
    t.timestamp('viewed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    // The pilot's list (one entry) and the office's (one competition), newest first.
    t.index(['entry_id', 'viewed_at'])
    t.index(['competition_id', 'viewed_at'])
  })
  await knex.raw(`ALTER TABLE document_views ADD CONSTRAINT document_views_kind_personal
    CHECK (document_kind IN ('licence', 'medical'))`)
  await knex.raw(`ALTER TABLE document_views ADD CONSTRAINT document_views_role_known
    CHECK (viewer_role IN ('entrant', 'scrutineer', 'organiser'))`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('document_views')
}
