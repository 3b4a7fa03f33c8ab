// Users: the aggregate behind sign-up, sign-in and /api/me.
import type { Knex } from 'knex'
import type { PublicUser } from '#shared/types/api'
import type { UserRow } from '#shared/types/rows'
import { MESSAGES } from '#shared/constants/messages'
import { useDb } from '#server/utils/db'
import { audit } from '#domain/audit/audit'
import { httpError } from '#server/utils/errors'

export function toPublicUser(row: UserRow): PublicUser {
  return { id: row.id, email: row.email, name: row.name, isAdmin: row.is_admin }
}

export async function findUserByEmail(email: string, db: Knex = useDb()): Promise<UserRow | undefined> {
  return db<UserRow>('users').whereRaw('lower(email) = lower(?)', [email]).first()
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
 * Signs up a new user, audited in the same transaction; 409 when the address already has an
 * account (two sign-ups racing for one address: the unique index decides).
 */
export async function signUpUser(input: { email: string, name: string, passwordHash: string }): Promise<UserRow> {
  if (await findUserByEmail(input.email)) throw httpError(409, MESSAGES.emailTaken)
  return useDb().transaction(async (trx) => {
    const created = await createUser(input, trx)
    await audit(trx, { actorUserId: created.id, action: 'user.signed-up', subjectType: 'user', subjectId: created.id })
    return created
  }).catch((err) => {
    if ((err as { code?: string }).code === '23505') throw httpError(409, MESSAGES.emailTaken)
    throw err
  })
}
