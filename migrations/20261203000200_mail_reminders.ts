import type { Knex } from 'knex'

// Which pre-event reminders went out: one row per entry and kind, so the reminder job can run
// as often as it likes and still sends each reminder exactly once.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_reminders', (t) => {
    t.uuid('entry_id').notNullable().references('entries.id').onDelete('CASCADE')
    t.text('kind').notNullable()
    t.bigInteger('outbox_id').references('mail_outbox.id').onDelete('SET NULL')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.primary(['entry_id', 'kind'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mail_reminders')
}
