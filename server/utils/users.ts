// Users: the aggregate behind sign-up, sign-in and /api/me.
import type { Knex } from 'knex'
import type { PublicUser } from '#shared/types/api'
import type { UserRow } from '#shared/types/rows'

export function toPublicUser(row: UserRow): PublicUser {
  return { id: row.id, email: row.email, name: row.name, isAdmin: row.is_admin }
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
