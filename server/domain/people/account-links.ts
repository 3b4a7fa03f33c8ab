// The account's one-time links, kept in account_tokens as hashes: a password reset by e-mail,
// the confirmation of an address at sign-up or after a change, and the first administrator's
// password. None of the requests that anyone may make (sign-up, reset) tells whether an
// address has an account: the answer, and roughly the time it takes, are the same.
import type { Knex } from 'knex'
import type { UserRow } from '#shared/types/rows'
import { MESSAGES } from '#shared/constants/messages'
import { useDb } from '#server/utils/db'
import { fieldError, httpError } from '#server/utils/errors'
import { audit } from '#domain/audit/audit'
import { enqueueMail } from '#domain/mail/outbox'
import {
  addressReplacedMail,
  confirmAddressMail,
  confirmNewAddressMail,
  passwordResetMail,
  signUpAgainMail,
} from '#domain/mail/templates-account'
import { disconnectSessionSockets } from '#domain/realtime/realtime'
import { ACCOUNT_TOKEN_LIFETIME_MS, accountLink, hashAccountToken, newAccountToken, type AccountTokenPurpose } from './account-token-hash'
import { createUnverifiedUser, findUserByEmail, findUserById } from './users'

/** The requests anyone may make answer no sooner than this, whichever path they took. */
const NON_REVEALING_FLOOR_MS = 300
/** Confirmation links one account may ask for in an hour. */
const VERIFICATION_MAILS_PER_HOUR = 5

interface AccountTokenRow {
  id: string
  user_id: string
  purpose: AccountTokenPurpose
  token_hash: string
  email: string
  expires_at: Date
  used_at: Date | null
}

async function notSoonerThan(startedAt: number): Promise<void> {
  const wait = startedAt + NON_REVEALING_FLOOR_MS - Date.now()
  if (wait > 0) await new Promise(resolve => setTimeout(resolve, wait))
}

/**
 * Stores a new token of this purpose for the user and returns it (the only time it exists in
 * the clear). Older unused tokens of the same purpose stop working: the newest link wins.
 */
export async function issueAccountToken(trx: Knex, input: { userId: string, purpose: AccountTokenPurpose, email: string }): Promise<string> {
  await trx('account_tokens')
    .where({ user_id: input.userId, purpose: input.purpose })
    .whereNull('used_at')
    .where('expires_at', '>', trx.fn.now())
    .update({ expires_at: trx.fn.now() })
  const { token, hash } = newAccountToken()
  await trx('account_tokens').insert({
    user_id: input.userId,
    purpose: input.purpose,
    token_hash: hash,
    email: input.email,
    expires_at: new Date(Date.now() + ACCOUNT_TOKEN_LIFETIME_MS[input.purpose]),
  })
  return token
}

/** Spends a token: 400 with a sentence when it is unknown, of another kind, used or expired. */
async function takeAccountToken(trx: Knex, token: string, purposes: readonly AccountTokenPurpose[]): Promise<AccountTokenRow> {
  const row = await trx<AccountTokenRow>('account_tokens')
    .where({ token_hash: hashAccountToken(token) })
    .forUpdate()
    .first()
  if (!row || !purposes.includes(row.purpose)) throw httpError(400, MESSAGES.tokenInvalid)
  if (row.used_at) throw httpError(400, MESSAGES.tokenUsed)
  if (new Date(row.expires_at).getTime() <= Date.now()) throw httpError(400, MESSAGES.tokenExpired)
  await trx('account_tokens').where({ id: row.id }).update({ used_at: trx.fn.now() })
  return row
}

function sameAddress(a: string, b: string): boolean {
  return a.trim().toLowerCase() === b.trim().toLowerCase()
}

/**
 * Sign-up that does not reveal whether an address has an account. A new address gets an
 * unconfirmed account and a link to confirm it; an address with an account gets a note that
 * someone tried, with the way to a new password. The caller hashes the password first, in both
 * cases.
 */
export async function signUp(input: { email: string, name: string, passwordHash: string, next?: string }, base: string): Promise<void> {
  const startedAt = Date.now()
  await useDb().transaction(async (trx) => {
    const created = await createUnverifiedUser(trx, input)
    if (created) {
      const token = await issueAccountToken(trx, { userId: created.id, purpose: 'email-verify', email: created.email })
      const mail = confirmAddressMail({ name: created.name, url: accountLink(base, 'email-verify', token, input.next) })
      await enqueueMail(trx, { to: created.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'account-confirm', secret: true })
      return
    }
    const owner = await findUserByEmail(input.email, trx)
    if (!owner) return
    const mail = signUpAgainMail({ name: owner.name, signInUrl: `${base}/sign-in`, resetUrl: `${base}/password/forgot` })
    await enqueueMail(trx, { to: owner.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'account-sign-up-again', secret: true })
  })
  await notSoonerThan(startedAt)
}

/** A reset link to the address when it has an account; nothing otherwise. Same time either way. */
export async function requestPasswordReset(email: string, base: string): Promise<void> {
  const startedAt = Date.now()
  await useDb().transaction(async (trx) => {
    const user = await findUserByEmail(email, trx)
    if (!user) return
    const token = await issueAccountToken(trx, { userId: user.id, purpose: 'password-reset', email: user.email })
    const mail = passwordResetMail({ name: user.name, url: accountLink(base, 'password-reset', token) })
    await enqueueMail(trx, { to: user.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'account-password-reset', secret: true })
    await audit(trx, { actorUserId: null, action: 'user.password-reset-requested', subjectType: 'user', subjectId: user.id })
  })
  await notSoonerThan(startedAt)
}

/**
 * Sets the password of a reset (or first-password) link and spends it. Every session of the
 * account ends, on every instance; the address counts as confirmed, since the link was read
 * there. Returns the user.
 */
export async function resetPassword(token: string, passwordHash: string): Promise<UserRow> {
  const { user, sessionIds } = await useDb().transaction(async (trx) => {
    const spent = await takeAccountToken(trx, token, ['password-reset', 'set-password'])
    const current = await findUserById(spent.user_id, trx)
    if (!current || !sameAddress(current.email, spent.email)) throw httpError(400, MESSAGES.tokenInvalid)
    const [updated] = await trx<UserRow>('users').where({ id: current.id }).update({
      password_hash: passwordHash,
      email_verified_at: trx.raw('coalesce(email_verified_at, now())'),
      updated_at: trx.fn.now(),
    }).returning('*')
    // Any other reset link of the account is spent with this one.
    await trx('account_tokens').where({ user_id: current.id }).whereIn('purpose', ['password-reset', 'set-password'])
      .whereNull('used_at').update({ used_at: trx.fn.now() })
    const revoked = await trx('user_sessions').where({ user_id: current.id }).whereNull('revoked_at')
      .update({ revoked_at: trx.fn.now() }).returning('id') as { id: string }[]
    await audit(trx, {
      actorUserId: current.id,
      action: spent.purpose === 'set-password' ? 'user.password-set' : 'user.password-reset',
      subjectType: 'user',
      subjectId: current.id,
      details: { sessionsEnded: revoked.length },
    })
    return { user: updated!, sessionIds: revoked.map(r => r.id) }
  })
  for (const id of sessionIds) disconnectSessionSockets(id)
  return user
}

/**
 * Opens a confirmation link: the account's address is confirmed, or — for a link sent to a new
 * address — becomes that address (the old one is told). Returns the user, to be signed in.
 */
export async function confirmEmail(token: string): Promise<UserRow> {
  return useDb().transaction(async (trx) => {
    const spent = await takeAccountToken(trx, token, ['email-verify'])
    const current = await findUserById(spent.user_id, trx)
    if (!current) throw httpError(400, MESSAGES.tokenInvalid)
    if (sameAddress(current.email, spent.email)) {
      const [updated] = await trx<UserRow>('users').where({ id: current.id })
        .update({ email_verified_at: trx.raw('coalesce(email_verified_at, now())'), updated_at: trx.fn.now() }).returning('*')
      if (!current.email_verified_at) {
        await audit(trx, { actorUserId: current.id, action: 'user.email-confirmed', subjectType: 'user', subjectId: current.id })
      }
      return updated!
    }
    // A new address: taken meanwhile by another account, the link cannot apply.
    const other = await findUserByEmail(spent.email, trx)
    if (other && other.id !== current.id) throw httpError(400, MESSAGES.tokenInvalid)
    const [updated] = await trx<UserRow>('users').where({ id: current.id })
      .update({ email: spent.email, email_verified_at: trx.fn.now(), updated_at: trx.fn.now() }).returning('*')
    // Links sent to the old address no longer fit the account.
    await trx('account_tokens').where({ user_id: current.id }).whereNull('used_at').whereRaw('lower(email) <> lower(?)', [spent.email])
      .update({ used_at: trx.fn.now() })
    const notice = addressReplacedMail({ name: current.name, newEmail: spent.email })
    await enqueueMail(trx, { to: current.email, subject: notice.subject, text: notice.text, html: notice.html, template: 'account-email-replaced' })
    await audit(trx, { actorUserId: current.id, action: 'user.email-changed', subjectType: 'user', subjectId: current.id })
    return updated!
  }).catch((err) => {
    // Two accounts confirming the same new address at once: the unique index decides.
    if ((err as { code?: string }).code === '23505') throw httpError(400, MESSAGES.tokenInvalid)
    throw err
  })
}

/** A new confirmation link to the account's address; 409 when confirmed, 429 after a few an hour. */
export async function resendConfirmation(userId: string, base: string): Promise<string> {
  return useDb().transaction(async (trx) => {
    const user = await trx<UserRow>('users').where({ id: userId }).forUpdate().first()
    if (!user) throw httpError(401, MESSAGES.sessionEnded)
    if (user.email_verified_at) throw httpError(409, MESSAGES.alreadyVerified)
    const sent = await trx('account_tokens')
      .where({ user_id: userId, purpose: 'email-verify' })
      .where('created_at', '>', trx.raw("now() - interval '1 hour'"))
      .count<{ count: string }[]>('id as count')
    if (Number(sent[0]?.count ?? 0) >= VERIFICATION_MAILS_PER_HOUR) throw httpError(429, MESSAGES.tooManyVerificationMails)
    const token = await issueAccountToken(trx, { userId, purpose: 'email-verify', email: user.email })
    const mail = confirmAddressMail({ name: user.name, url: accountLink(base, 'email-verify', token) })
    await enqueueMail(trx, { to: user.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'account-confirm', secret: true })
    return user.email
  })
}

/**
 * Asks to move the account to another address: the current password is required, and the
 * address changes only when the link sent to the new one is opened. An address that belongs to
 * another account gets nothing and changes nothing, with the same answer.
 */
export async function requestEmailChange(userId: string, input: { email: string, password: string }, base: string): Promise<void> {
  const startedAt = Date.now()
  const user = await findUserById(userId)
  if (!user) throw httpError(401, MESSAGES.sessionEnded)
  if (!await verifyPassword(user.password_hash, input.password)) throw fieldError('password', MESSAGES.wrongPassword)
  if (sameAddress(user.email, input.email)) throw fieldError('email', MESSAGES.emailChangeSame)
  await useDb().transaction(async (trx) => {
    if (await findUserByEmail(input.email, trx)) return
    const token = await issueAccountToken(trx, { userId, purpose: 'email-verify', email: input.email })
    const mail = confirmNewAddressMail({ name: user.name, url: accountLink(base, 'email-verify', token) })
    await enqueueMail(trx, { to: input.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'account-confirm-new', secret: true })
    await audit(trx, { actorUserId: userId, action: 'user.email-change-requested', subjectType: 'user', subjectId: userId })
  })
  await notSoonerThan(startedAt)
}
