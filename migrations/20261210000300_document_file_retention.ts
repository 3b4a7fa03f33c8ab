import type { Knex } from 'knex'

// A document's stored file can be deleted on the retention schedule (server/domain/files/
// retention.ts) while its row stays: kind, validity, review outcome and sha256 remain, with
// when and why the file went and how many days it had been kept. storage_key becomes null at
// that moment, so no row points at a file that is gone; a file a crash left behind then has no
// row and is an orphan for the maintenance command to remove.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('documents', (t) => {
    t.timestamp('file_deleted_at', { useTz: true })
    t.text('file_deleted_reason')
    /** Days the file was kept after the last contest day (medical) or the accepted replacement (superseded). */
    t.integer('file_kept_days')
  })
  await knex.raw('ALTER TABLE documents ALTER COLUMN storage_key DROP NOT NULL')
  await knex.raw(`ALTER TABLE documents ADD CONSTRAINT documents_file_deleted_reason_known
    CHECK (file_deleted_reason IN ('retention-medical', 'retention-superseded'))`)
  // Either the file is there (a key, no deletion) or it is gone (no key, when and why).
  await knex.raw(`ALTER TABLE documents ADD CONSTRAINT documents_file_present_or_deleted
    CHECK ((storage_key IS NOT NULL AND file_deleted_at IS NULL AND file_deleted_reason IS NULL)
      OR (storage_key IS NULL AND file_deleted_at IS NOT NULL AND file_deleted_reason IS NOT NULL))`)
  // The retention job's candidates: files still there, by competition and kind.
  await knex.raw(`CREATE INDEX documents_file_kept ON documents (competition_id, kind) WHERE file_deleted_at IS NULL`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX documents_file_kept')
  await knex.raw('ALTER TABLE documents DROP CONSTRAINT documents_file_present_or_deleted')
  await knex.raw('ALTER TABLE documents DROP CONSTRAINT documents_file_deleted_reason_known')
  // A deleted file's row gets a key that points nowhere (unique, never a stored file's), so
  // the column can be required again; the fact of deletion itself is lost going down.
  await knex('documents').whereNull('storage_key').update({ storage_key: knex.raw(`'deleted:' || id::text`) })
  await knex.raw('ALTER TABLE documents ALTER COLUMN storage_key SET NOT NULL')
  await knex.schema.alterTable('documents', (t) => {
    t.dropColumn('file_kept_days')
    t.dropColumn('file_deleted_reason')
    t.dropColumn('file_deleted_at')
  })
}
