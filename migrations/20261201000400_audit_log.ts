import type { Knex } from 'knex'

// The audit log is append-only: a trigger refuses UPDATE and DELETE, so not even a bug in
// the application can rewrite history. Its ids are plain values, not foreign keys, so the
// record outlives the rows it speaks of. (TRUNCATE stays possible for a demo re-seed.)
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('audit_log', (t) => {
    t.bigIncrements('id').primary()
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.uuid('actor_user_id')
    t.uuid('competition_id')
    t.text('action').notNullable()
    t.text('subject_type').notNullable()
    t.text('subject_id')
    t.jsonb('details').notNullable().defaultTo('{}')
    t.index(['competition_id', 'at'])
  })
  await knex.raw(`
    CREATE FUNCTION audit_log_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'audit_log is append-only' USING ERRCODE = 'insufficient_privilege';
    END $$;
  `)
  await knex.raw(`CREATE TRIGGER audit_log_append_only BEFORE UPDATE OR DELETE ON audit_log
    FOR EACH ROW EXECUTE FUNCTION audit_log_refuse_change()`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS audit_log_append_only ON audit_log')
  await knex.raw('DROP FUNCTION IF EXISTS audit_log_refuse_change()')
  await knex.schema.dropTable('audit_log')
}
