// The account page's changes to one's own account: the name, and the password (which signs
// out every other device). Export and deletion read and change more than people, so they
// live in the account area above (server/domain/account/).
import type { H3Event } from 'h3'
import type { Knex } from 'knex'
import type { User } from '#auth-utils'
import type { AccountNameInput, AccountPasswordInput } from '#shared/schemas/account'
import type { PublicUser } from '#shared/types/api'
import type { UserRow } from '#shared/types/rows'
import { MESSAGES } from '#shared/constants/messages'
import { useDb } from '#server/utils/db'
import { fieldError } from '#server/utils/errors'
import { siteUrl } from '#server/utils/site-url'
import { audit } from '#domain/audit/audit'
import { enqueueMail } from '#domain/mail/outbox'
import { passwordChangedMail } from '#domain/mail/templates-account-changes'
import { disconnectSessionSockets } from '#domain/realtime/realtime'
import { takeSignInAttempt } from './login-limit'
import { toPublicUser } from './users'

/** The id of the request's own session row (the one that stays signed in). */
export async function currentSessionId(event: H3Event): Promise<string | null> {
  const session = await getUserSession(event)
  return (session as { sessionId?: string }).sessionId ?? null
}

/**
 * Checks a password the signed-in person typed to confirm a change, counted like a sign-in at
 * this address (only a wrong one counts): a stolen session cannot guess the password faster
 * than sign-in could. 400 beside `field` when it is wrong; 429 when throttled.
 */
export async function confirmOwnPassword(event: H3Event, user: User, password: string, field: string, wrong: string): Promise<UserRow> {
  const attempt = await takeSignInAttempt(event, user.email)
  const row = await useDb()<UserRow>('users').where({ id: user.id }).first()
  if (!row || !await verifyPassword(row.password_hash, password)) throw fieldError(field, wrong)
  await attempt.succeeded()
  return row
}

/** Revokes every open session of the user but `keep`, in the transaction; their ids. */
export async function revokeSessionsOf(trx: Knex.Transaction, userId: string, keep: string | null): Promise<string[]> {
  const query = trx('user_sessions').where({ user_id: userId }).whereNull('revoked_at')
  if (keep) query.whereNot('id', keep)
  const rows: { id: string }[] = await query.update({ revoked_at: trx.fn.now() }).returning('id')
  return rows.map(r => r.id)
}

/** Closes the live screens of revoked sessions, on every instance (after the commit). */
export function disconnectSessions(sessionIds: readonly string[]): void {
  for (const id of sessionIds) disconnectSessionSockets(id)
}

/**
 * Renames the account (audited without the name: the audit log keeps ids only). Entries keep
 * the pilot's name as it was entered: an entry's pilot is typed per entry. The session's cookie
 * gets the new name too.
 */
export async function renameAccount(event: H3Event, user: User, input: AccountNameInput): Promise<PublicUser> {
  const row = await useDb().transaction(async (trx) => {
    const [updated] = await trx<UserRow>('users').where({ id: user.id }).update({ name: input.name, updated_at: trx.fn.now() }).returning('*')
    await audit(trx, { actorUserId: user.id, action: 'user.renamed', subjectType: 'user', subjectId: user.id })
    return updated!
  })
  const sessionId = await currentSessionId(event)
  if (sessionId) await replaceUserSession(event, { user: toPublicUser(row), sessionId })
  return toPublicUser(row)
}

/**
 * Changes the password after checking the current one (a wrong one answers 400 and counts as a
 * failed sign-in). Every other session of the user is revoked and its sockets closed; this one
 * stays signed in. The account's address is e-mailed, in the same transaction.
 */
export async function changeOwnPassword(event: H3Event, user: User, input: AccountPasswordInput): Promise<{ signedOut: number }> {
  await confirmOwnPassword(event, user, input.currentPassword, 'currentPassword', MESSAGES.currentPasswordWrong)
  if (input.newPassword === input.currentPassword) throw fieldError('newPassword', MESSAGES.newPasswordSame)
  const passwordHash = await hashPassword(input.newPassword)
  const keep = await currentSessionId(event)
  const base = siteUrl(event)
  const revoked = await useDb().transaction(async (trx) => {
    const [row] = await trx<UserRow>('users').where({ id: user.id }).update({ password_hash: passwordHash, updated_at: trx.fn.now() }).returning('*')
    const ids = await revokeSessionsOf(trx, user.id, keep)
    await audit(trx, {
      actorUserId: user.id, action: 'user.password-changed', subjectType: 'user', subjectId: user.id,
      details: { otherSessionsEnded: ids.length },
    })
    const mail = passwordChangedMail({ name: row!.name, accountUrl: `${base}/account`, signInUrl: `${base}/sign-in` })
    await enqueueMail(trx, { to: row!.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'password-changed' })
    return ids
  })
  disconnectSessions(revoked)
  return { signedOut: revoked.length }
}
