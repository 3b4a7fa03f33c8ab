import type { Knex } from 'knex'

// Invitations of officials to a competition: a signed, single-use link that expires. Only the
// token's hash is stored, so the table alone cannot be used to accept an invitation.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'))
    t.uuid('competition_id').notNullable().references('competitions.id').onDelete('CASCADE')
    t.text('email').notNullable()
    t.text('role').notNullable()
    /** sha256 of the whole token, hex. */
    t.text('token_hash').notNullable().unique()
    t.timestamp('expires_at', { useTz: true }).notNullable()
    t.uuid('invited_by').references('users.id').onDelete('SET NULL')
    t.timestamp('accepted_at', { useTz: true })
    t.uuid('accepted_by').references('users.id').onDelete('SET NULL')
    t.timestamp('revoked_at', { useTz: true })
    t.uuid('revoked_by').references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now())
    t.index(['competition_id', 'created_at'])
  })
  await knex.raw(`ALTER TABLE invitations ADD CONSTRAINT invitations_role_known
    CHECK (role IN ('organiser', 'scrutineer', 'director'))`)
  // Accepted or revoked, never both.
  await knex.raw(`ALTER TABLE invitations ADD CONSTRAINT invitations_one_outcome
    CHECK (accepted_at IS NULL OR revoked_at IS NULL)`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('invitations')
}
