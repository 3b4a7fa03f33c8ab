import type { Knex } from 'knex'

// One-time account tokens (password reset, e-mail verification, the first admin's password)
// and when each user's e-mail address was confirmed. A token is stored only as its SHA-256
// hash: whoever reads this table cannot use what is in it. Accounts that exist before this
// migration count as confirmed, so nobody already signed up is locked out of entering.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.timestamp('email_verified_at', { useTz: true })
  })
  await knex.raw('UPDATE users SET email_verified_at = created_at')

  await knex.schema.createTable('account_tokens', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE')
    t.text('purpose').notNullable()
    t.text('token_hash').notNullable().unique()
    // The address the link was sent to: a changed address becomes the account's once it is opened.
    t.text('email').notNullable()
    t.timestamp('expires_at', { useTz: true }).notNullable()
    t.timestamp('used_at', { useTz: true })
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['user_id', 'purpose'])
  })
  await knex.raw(`ALTER TABLE account_tokens ADD CONSTRAINT account_tokens_purpose_check
    CHECK (purpose IN ('password-reset', 'email-verify', 'set-password'))`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('account_tokens')
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('email_verified_at')
  })
}
