// Invitations of officials and the organiser's changes to memberships. An invitation's link
// carries a signed token; only its hash is stored, and the e-mail that carried it is emptied
// once sent. Accepting is single-use and only by the account of the invited address: the row
// is locked, the membership created and the invitation marked in one transaction.
import type { Knex } from 'knex'
import type { H3Event } from 'h3'
import type { User } from '#auth-utils'
import { INVITATION_TTL_DAYS, type InvitableRole, type InvitationState } from '#shared/constants/invitations'
import type { InvitationRow } from '#shared/types/rows'
import { MESSAGES } from '#shared/constants/messages'
import type { InvitationAccepted, InvitationListItem, InvitationPreview } from '#shared/types/api-mail'
import { STAFF_ROLES } from '#shared/constants/roles'
import { effectiveRoles } from '#shared/utils/access'
import { audit } from '#domain/audit/audit'
import { enqueueMail } from '#domain/mail/outbox'
import { invitationMail } from '#domain/mail/templates'
import { leaveCompetitionRooms } from '#domain/realtime/realtime'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { siteUrl } from '#server/utils/site-url'
import { createInvitationToken, hashInvitationToken, verifyInvitationToken } from './invitation-token'
import { signingSecret } from './secrets'
import { rolesInCompetition } from './memberships'

/** The key that signs invitation links: NUXT_INVITATION_SECRET (only the demo falls back to the session password). */
export function invitationSecret(): string {
  return signingSecret('invitation')
}

export function invitationState(row: Pick<InvitationRow, 'accepted_at' | 'revoked_at' | 'expires_at'>, now = new Date()): InvitationState {
  if (row.accepted_at) return 'accepted'
  if (row.revoked_at) return 'revoked'
  if (row.expires_at.getTime() <= now.getTime()) return 'expired'
  return 'pending'
}

export async function createInvitation(event: H3Event, input: {
  competitionId: string
  competitionName: string
  email: string
  role: InvitableRole
  invitedBy: User
}): Promise<InvitationListItem> {
  const token = createInvitationToken(invitationSecret())
  const expiresAt = new Date(Date.now() + INVITATION_TTL_DAYS * 24 * 60 * 60 * 1000)
  const url = `${siteUrl(event)}/invitations/${token}`

  return useDb().transaction(async (trx) => {
    const holder = await trx('memberships as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where({ 'm.competition_id': input.competitionId, 'm.role': input.role })
      .whereRaw('lower(u.email) = ?', [input.email])
      .first('m.id')
    if (holder) throw httpError(409, MESSAGES.alreadyHoldsRole)

    // A new invitation to the same address and role replaces the one still waiting.
    const replaced = await trx('invitations')
      .where({ competition_id: input.competitionId, email: input.email, role: input.role })
      .whereNull('accepted_at')
      .whereNull('revoked_at')
      .update({ revoked_at: trx.fn.now(), revoked_by: input.invitedBy.id })
      .returning('id')

    const [row] = await trx('invitations').insert({
      competition_id: input.competitionId,
      email: input.email,
      role: input.role,
      token_hash: hashInvitationToken(token),
      expires_at: expiresAt,
      invited_by: input.invitedBy.id,
    }).returning('*') as InvitationRow[]

    const mail = invitationMail({
      competitionName: input.competitionName,
      role: input.role,
      invitedByName: input.invitedBy.name,
      url,
      expiresAt,
    })
    await enqueueMail(trx, { to: input.email, subject: mail.subject, text: mail.text, html: mail.html, template: 'invitation', competitionId: input.competitionId, secret: true })
    await audit(trx, {
      actorUserId: input.invitedBy.id,
      competitionId: input.competitionId,
      action: 'invitation.create',
      subjectType: 'invitation',
      subjectId: row!.id,
      // The address stays in the invitation's own row, not in the log (personal-fields.ts).
      details: { role: input.role, replaced: replaced.map((r: { id: string }) => r.id) },
    })
    return toListItem({ ...row!, invited_by_name: input.invitedBy.name, accepted_by_name: null })
  })
}

type ListRow = InvitationRow & { invited_by_name: string | null, accepted_by_name: string | null }

function toListItem(row: ListRow, now = new Date()): InvitationListItem {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    state: invitationState(row, now),
    expiresAt: row.expires_at.toISOString(),
    createdAt: row.created_at.toISOString(),
    invitedByName: row.invited_by_name,
    acceptedAt: row.accepted_at?.toISOString() ?? null,
    acceptedByName: row.accepted_by_name,
    revokedAt: row.revoked_at?.toISOString() ?? null,
  }
}

export async function listInvitations(competitionId: string, db: Knex = useDb()): Promise<InvitationListItem[]> {
  const rows: ListRow[] = await db('invitations as i')
    .leftJoin('users as inv', 'inv.id', 'i.invited_by')
    .leftJoin('users as acc', 'acc.id', 'i.accepted_by')
    .where('i.competition_id', competitionId)
    .orderBy('i.created_at', 'desc')
    .select('i.*', 'inv.name as invited_by_name', 'acc.name as accepted_by_name')
  const now = new Date()
  return rows.map(r => toListItem(r, now))
}

export async function revokeInvitation(competitionId: string, invitationId: string, actor: User): Promise<InvitationListItem> {
  return useDb().transaction(async (trx) => {
    const row: InvitationRow | undefined = await trx('invitations')
      .where({ id: invitationId, competition_id: competitionId })
      .forUpdate()
      .first()
    if (!row) throw httpError(404, MESSAGES.invitationNotFound)
    if (row.accepted_at || row.revoked_at) throw httpError(409, MESSAGES.invitationNotPending)
    const [updated] = await trx('invitations')
      .where({ id: invitationId })
      .update({ revoked_at: trx.fn.now(), revoked_by: actor.id })
      .returning('*') as InvitationRow[]
    await audit(trx, {
      actorUserId: actor.id,
      competitionId,
      action: 'invitation.revoke',
      subjectType: 'invitation',
      subjectId: invitationId,
      details: { role: row.role },
    })
    return toListItem({ ...updated!, invited_by_name: null, accepted_by_name: null })
  })
}

/** The row a token names, after checking its signature; 404 for a bad or unknown token. */
async function findByToken(token: string, db: Knex, lock: boolean): Promise<InvitationRow> {
  if (!verifyInvitationToken(token, invitationSecret())) throw httpError(404, MESSAGES.invitationInvalid)
  const query = db('invitations').where({ token_hash: hashInvitationToken(token) }).first()
  const row: InvitationRow | undefined = await (lock ? query.forUpdate() : query)
  if (!row) throw httpError(404, MESSAGES.invitationInvalid)
  return row
}

/** 410 with the reason when the invitation can no longer be used. */
function assertUsable(row: InvitationRow): void {
  const state = invitationState(row)
  if (state === 'accepted') throw httpError(410, MESSAGES.invitationUsed)
  if (state === 'revoked') throw httpError(410, MESSAGES.invitationRevoked)
  if (state === 'expired') throw httpError(410, MESSAGES.invitationExpired)
}

export async function previewInvitation(token: string, db: Knex = useDb()): Promise<InvitationPreview> {
  const row = await findByToken(token, db, false)
  assertUsable(row)
  const competition = await db('competitions').where({ id: row.competition_id }).first(
    'id', 'name', 'airfield_name',
    'first_contest_day',
    'last_contest_day',
  )
  const inviter = row.invited_by ? await db('users').where({ id: row.invited_by }).first('name') : undefined
  return {
    role: row.role,
    email: row.email,
    expiresAt: row.expires_at.toISOString(),
    invitedByName: inviter?.name ?? null,
    competition: {
      id: competition.id,
      name: competition.name,
      airfieldName: competition.airfield_name,
      firstContestDay: competition.first_contest_day,
      lastContestDay: competition.last_contest_day,
    },
  }
}

export async function acceptInvitation(token: string, user: User): Promise<InvitationAccepted> {
  return useDb().transaction(async (trx) => {
    const row = await findByToken(token, trx, true)
    assertUsable(row)
    // The link is bound to the address it was sent to: whoever else holds it (a forwarded
    // e-mail, a shared screen) cannot take the role. The address is read from the account, not
    // the session, which may predate a change of address.
    const account = await trx('users').where({ id: user.id }).first('email')
    if (!account || account.email.toLowerCase() !== row.email.toLowerCase()) {
      throw httpError(403, MESSAGES.invitationForOtherAddress(row.email))
    }
    await trx('memberships')
      .insert({ user_id: user.id, competition_id: row.competition_id, role: row.role, granted_by: row.invited_by })
      .onConflict(['user_id', 'competition_id', 'role'])
      .ignore()
    await trx('invitations').where({ id: row.id }).update({ accepted_at: trx.fn.now(), accepted_by: user.id })
    await audit(trx, {
      actorUserId: user.id,
      competitionId: row.competition_id,
      action: 'invitation.accept',
      subjectType: 'invitation',
      subjectId: row.id,
      details: { role: row.role },
    })
    return { competitionId: row.competition_id, role: row.role }
  })
}

/**
 * Removes one role of one person; the last organiser stays. Once committed, that person's open
 * sockets leave the competition's rooms their remaining roles no longer allow.
 */
export async function removeMembership(competitionId: string, membershipId: string, actor: User): Promise<void> {
  const left = await useDb().transaction(async (trx) => {
    const row = await trx('memberships').where({ id: membershipId, competition_id: competitionId }).forUpdate().first()
    if (!row) throw httpError(404, MESSAGES.membershipNotFound)
    if (row.role === 'organiser') {
      // Lock every organiser row, so two removals at once cannot leave none.
      const organisers = await trx('memberships').where({ competition_id: competitionId, role: 'organiser' }).forUpdate().select('id')
      if (organisers.length <= 1) throw httpError(409, MESSAGES.lastOrganiser)
    }
    await trx('memberships').where({ id: membershipId }).delete()
    await audit(trx, {
      actorUserId: actor.id,
      competitionId,
      action: 'membership.remove',
      subjectType: 'membership',
      subjectId: membershipId,
      details: { userId: row.user_id, role: row.role },
    })
    const member = await trx('users').where({ id: row.user_id }).first('is_admin')
    const roles = effectiveRoles(await rolesInCompetition(row.user_id, competitionId, trx), Boolean(member?.is_admin))
    return { userId: row.user_id as string, staff: roles.some(r => STAFF_ROLES.includes(r)), entrant: roles.includes('entrant') }
  })
  leaveCompetitionRooms(left.userId, competitionId, left)
}
