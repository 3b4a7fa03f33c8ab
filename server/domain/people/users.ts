// Users: the aggregate behind sign-up, sign-in and /api/me.
import type { Knex } from 'knex'
import type { PublicUser } from '#shared/types/api'
import type { UserRow } from '#shared/types/rows'
import { useDb } from '#server/utils/db'
import { audit } from '#domain/audit/audit'

export function toPublicUser(row: UserRow): PublicUser {
  return { id: row.id, email: row.email, name: row.name, isAdmin: row.is_admin, emailVerified: row.email_verified_at != null }
}

export async function findUserByEmail(email: string, db: Knex = useDb()): Promise<UserRow | undefined> {
  return db<UserRow>('users').whereRaw('lower(email) = lower(?)', [email]).first()
}

export async function findUserById(id: string, db: Knex = useDb()): Promise<UserRow | undefined> {
  return db<UserRow>('users').where({ id }).first()
}

export async function createUser(
  input: { email: string, name: string, passwordHash: string },
  db: Knex = useDb(),
): Promise<UserRow> {
  const [row] = await db<UserRow>('users')
    .insert({ email: input.email, name: input.name, password_hash: input.passwordHash })
    .returning('*')
  return row!
}

export async function updatePasswordHash(id: string, passwordHash: string, db: Knex = useDb()): Promise<void> {
  await db('users').where({ id }).update({ password_hash: passwordHash, updated_at: db.fn.now() })
}

/**
 * Creates an account whose address is not confirmed yet, audited in the same transaction;
 * undefined when the address already has one (checked first, and by the unique index when two
 * sign-ups race), so the caller can answer the same either way.
 */
export async function createUnverifiedUser(trx: Knex.Transaction, input: { email: string, name: string, passwordHash: string }): Promise<UserRow | undefined> {
  if (await findUserByEmail(input.email, trx)) return undefined
  const [created] = await trx<UserRow>('users')
    .insert({ email: input.email, name: input.name, password_hash: input.passwordHash })
    .onConflict(trx.raw('(lower(email))')).ignore()
    .returning('*')
  if (!created) return undefined
  await audit(trx, { actorUserId: created.id, action: 'user.signed-up', subjectType: 'user', subjectId: created.id })
  return created
}
