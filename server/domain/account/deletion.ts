// Deleting one's own account, in one transaction, after the password is typed again:
// - refused (409) while the person is the only organiser of a competition not yet over (its
//   last contest day not passed in its own time zone, or not set), or the only site
//   administrator;
// - their entries of competitions not yet over are withdrawn as by their entrant (the office
//   gets its usual notice with the refund due);
// - every entry of theirs keeps its record (results, payments, grid checks) with the pilot's
//   name replaced by "Deleted account" and the pilot's own contact fields cleared; the licence
//   and medical documents of their entries (identity and health data) are deleted, rows and
//   stored files; documents about the glider stay with the entry;
// - memberships removed, every session revoked and its sockets closed;
// - the users row stays (grid checks, tags and the audit log point at it) but is anonymised:
//   a placeholder address, so the person's own address can sign up again, and a password
//   nobody knows.
// - the audit log keeps what they did and when, under the anonymised account, but forgets who
//   they were: their name, address and their entries' contact values leave every row about them
//   (server/domain/audit/forget.ts).
// Audited; the former address is told what went and what the office keeps.
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import type { Knex } from 'knex'
import type { User } from '#auth-utils'
import { MESSAGES } from '#shared/constants/messages'
// Documents about the person rather than the glider: deleted with the account.
import { PERSONAL_DOCUMENT_KINDS } from '#shared/utils/document-access'
import type { AccountDeleteInput } from '#shared/schemas/account'
import type { AccountDeleteResponse } from '#shared/types/api-account'
import type { CompetitionRow, EntryRow } from '#shared/types/rows'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { siteUrl } from '#server/utils/site-url'
import { audit } from '#domain/audit/audit'
import { forgetPersonInAudit } from '#domain/audit/forget'
import { dossierChanged } from '#domain/board/dossier-changed'
import { findCompetition } from '#domain/competitions/competitions'
import { enqueueMail } from '#domain/mail/outbox'
import { accountDeletedMail } from '#domain/mail/templates-account-changes'
import { confirmOwnPassword, disconnectSessions, revokeSessionsOf } from '#domain/people/account'
import { withdrawEntryIn } from '#domain/entries/entries'
import { removeFile } from '#domain/files/storage'

/** What a deleted account's entries show as their pilot, and the account as its name. */
export const DELETED_NAME = 'Deleted account'
const WITHDRAWAL_REASON = 'The pilot deleted their Gridmark account.'

/** The placeholder address of a deleted account (unique, and never deliverable). */
export function deletedAddress(userId: string): string {
  return `deleted-${userId}@deleted.invalid`
}

/** The competitions not yet over where the user is the only organiser; their rows are locked. */
async function competitionsLeftWithoutOrganiser(trx: Knex.Transaction, userId: string): Promise<string[]> {
  const organised: string[] = await trx('memberships').where({ user_id: userId, role: 'organiser' }).pluck('competition_id')
  if (!organised.length) return []
  // Two organisers deleting their accounts at once: each waits for the other's rows.
  await trx('memberships').whereIn('competition_id', organised).where('role', 'organiser').orderBy('id').forUpdate().select('id')
  const rows: { name: string }[] = await trx('competitions as c').whereIn('c.id', organised)
    .whereRaw('(c.last_contest_day IS NULL OR c.last_contest_day >= (now() at time zone c.time_zone)::date)')
    .whereNotExists(q => q.from('memberships as o').whereRaw('o.competition_id = c.id').where('o.role', 'organiser').whereNot('o.user_id', userId))
    .orderBy('c.name').select('c.name')
  return rows.map(r => r.name)
}

export async function deleteAccount(event: H3Event, user: User, input: AccountDeleteInput): Promise<AccountDeleteResponse> {
  await confirmOwnPassword(event, user, input.password, 'password', MESSAGES.accountPasswordWrong)
  // A password nobody knows: the row can never be signed in to again.
  const unusableHash = await hashPassword(randomBytes(32).toString('base64url'))
  const base = siteUrl(event)

  const done = await useDb().transaction(async (trx) => {
    const me = await trx('users').where({ id: user.id }).whereNull('deleted_at').forUpdate().first()
    if (!me) throw httpError(401, MESSAGES.sessionEnded)
    if (me.is_admin) {
      const otherAdmins = await trx('users').where({ is_admin: true }).whereNull('deleted_at').whereNot('id', me.id).count<{ count: string }[]>('* as count')
      if (Number(otherAdmins[0]!.count) === 0) throw httpError(409, MESSAGES.onlySiteAdmin)
    }
    const orphaned = await competitionsLeftWithoutOrganiser(trx, me.id)
    if (orphaned.length) throw httpError(409, MESSAGES.onlyOrganiserOf(orphaned))

    // Memberships go first, so the office notices of the withdrawals below reach the other
    // organisers, not the person leaving.
    await trx('memberships').where({ user_id: me.id }).delete()

    const entries: (EntryRow & { over: boolean })[] = await trx('entries as e').join('competitions as c', 'c.id', 'e.competition_id')
      .where('e.entrant_user_id', me.id).orderBy('e.created_at')
      .select('e.*', trx.raw('(c.last_contest_day IS NOT NULL AND c.last_contest_day < (now() at time zone c.time_zone)::date) as over'))
    const competitions = new Map<string, CompetitionRow>()
    for (const id of new Set(entries.map(e => e.competition_id))) competitions.set(id, (await findCompetition(id, trx))!)

    const withdrawn: string[] = []
    for (const entry of entries) {
      if (entry.over || entry.status === 'withdrawn') continue
      const competition = competitions.get(entry.competition_id)!
      await withdrawEntryIn(trx, { user, roles: [], competition, entry, isOwner: true, isStaff: false }, { reason: WITHDRAWAL_REASON })
      withdrawn.push(`${entry.comp_id} (${entry.glider_type}, ${entry.registration}) in ${competition.name}`)
    }

    const entryIds = entries.map(e => e.id)
    const personal: { id: string, entry_id: string, competition_id: string, storage_key: string }[] = await trx('documents')
      .whereIn('entry_id', entryIds).whereIn('kind', PERSONAL_DOCUMENT_KINDS).select('id', 'entry_id', 'competition_id', 'storage_key')
    if (personal.length) {
      // Who opened them and when stays on record; from where goes with the files (as on schedule).
      await trx('document_views').whereIn('document_id', personal.map(d => d.id)).update({ client_address: '' })
      await trx('documents').whereIn('id', personal.map(d => d.id)).delete()
    }
    await trx('entries').whereIn('id', entryIds).update({
      pilot_name: DELETED_NAME, pilot_nationality: null, pilot_licence_number: null, pilot_phone: null, emergency_contact: null,
      updated_at: trx.fn.now(),
    })
    await audit(trx, entries.map(e => ({
      actorUserId: me.id, competitionId: e.competition_id, action: 'entry.anonymised', subjectType: 'entry', subjectId: e.id,
      details: { documentsDeleted: personal.filter(d => d.entry_id === e.id).map(d => d.id) },
    })))
    for (const competitionId of competitions.keys()) {
      await dossierChanged(trx, competitionId, entries.filter(e => e.competition_id === competitionId).map(e => e.id), me.id)
    }

    const revoked = await revokeSessionsOf(trx, me.id, null)
    // An unused reset or confirmation link must not bring the account back.
    await trx('account_tokens').where({ user_id: me.id }).delete()
    await trx('users').where({ id: me.id }).update({
      email: deletedAddress(me.id), name: DELETED_NAME, password_hash: unusableHash, is_admin: false,
      deleted_at: trx.fn.now(), updated_at: trx.fn.now(),
    })
    const kept = entries.filter(e => e.over).length
    await audit(trx, {
      actorUserId: me.id, action: 'user.deleted', subjectType: 'user', subjectId: me.id,
      details: { entriesWithdrawn: withdrawn.length, entriesKept: kept, documentsDeleted: personal.length, sessionsEnded: revoked.length },
    })
    await forgetPersonInAudit(trx, {
      userId: me.id,
      entryIds,
      values: [me.name, me.email, ...entries.flatMap(e => [e.pilot_name, e.pilot_licence_number, e.pilot_phone, e.emergency_contact])],
    })
    const mail = accountDeletedMail({ name: me.name, withdrawn, keptPast: kept, signUpUrl: `${base}/sign-up` })
    await enqueueMail(trx, { to: me.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'account-deleted' })
    return { revoked, files: personal.map(d => d.storage_key), withdrawn: withdrawn.length, kept }
  })

  disconnectSessions(done.revoked)
  // The rows are gone for good; a file that cannot be removed now is only logged (no row
  // points at it any more, so nobody can open it through Gridmark).
  for (const key of done.files) {
    await removeFile(key).catch(err => console.error('[gridmark] could not remove a deleted account’s document', key, err))
  }
  await clearUserSession(event)
  return { ok: true, withdrawn: done.withdrawn, kept: done.kept }
}
