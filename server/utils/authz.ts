// The one place a route asks who is calling and whether they may act: signed in at all
// (requireUser, requireAdmin), with a role in a competition (requireRole), on one entry
// (requireEntryAccess), recording on the grid (requireGridRecorder), naming a recorder of the
// entry (requireEntryRecorder), opening a document's file or reading who opened the medical and
// licence files (requireDocumentFile, requireEntryDocumentViews). The decisions are
// shared/utils/access.ts and shared/utils/document-access.ts; the session itself is the people
// area's (server/domain/people/sessions.ts).
import type { H3Event } from 'h3'
import type { User } from '#auth-utils'
import { STAFF_ROLES, type Role } from '#shared/constants/roles'
import type { CompetitionRow, DocumentRow, EntryRow } from '#shared/types/rows'
import { decideAccess } from '#shared/utils/access'
import { decideDocumentFile, decideEntryDocumentViews, type DocumentReader, type DocumentViewerRole } from '#shared/utils/document-access'
import { MESSAGES } from '#shared/constants/messages'
import { sessionUser, sessionUserIn } from '#domain/people/sessions'
import { rolesInCompetition } from '#domain/people/memberships'
import { findCompetitionEntry } from '#domain/entries/entries'
import { isEntryRecorder } from '#domain/files/igc-files'
import { findEntryDocument } from '#domain/files/documents'
import { httpError } from './errors'

export interface CompetitionAccess {
  user: User
  roles: Role[]
  competition: CompetitionRow
}

export interface EntryAccess extends CompetitionAccess {
  entry: EntryRow
  /** The caller is the entry's own entrant. */
  isOwner: boolean
  /** The caller holds a staff role (organiser, scrutineer, director; admins count as organisers). */
  isStaff: boolean
}

/** The signed-in user, fresh from the database; 401 when there is none or it was revoked. */
export function requireUser(event: H3Event): Promise<User> {
  return sessionUser(event)
}

export async function requireAdmin(event: H3Event): Promise<User> {
  const user = await requireUser(event)
  if (!user.isAdmin) throw httpError(403, MESSAGES.adminRequired)
  return user
}

/**
 * An account whose e-mail address is not confirmed may look around but not commit to anything
 * (enter a glider, accept an invitation): 403 saying how to confirm it, with the resend action.
 */
export function requireVerified(user: User): User {
  if (!user.emailVerified) throw httpError(403, MESSAGES.verificationRequired, { action: 'resend-verification' })
  return user
}

export async function requireRole(
  event: H3Event,
  competitionId: string,
  allowed: readonly Role[] | 'any',
): Promise<CompetitionAccess> {
  const { user, competition, rolesHeld } = await sessionUserIn(event, competitionId)
  const decision = decideAccess({ user, competitionExists: Boolean(competition), rolesHeld }, allowed)
  if (!decision.allowed) throw httpError(decision.status, decision.message)
  return { user, roles: decision.roles, competition: competition! }
}

/**
 * Who may read or act on one entry, the access helper of every entry route: its own entrant,
 * or the competition's staff. `who`: 'owner-or-staff' (read the dossier, upload for it),
 * 'owner' (only its entrant, e.g. withdraw, pay), or a list of staff roles (e.g. ['organiser']
 * to accept, ['organiser', 'scrutineer'] to review documents).
 * Anyone else learns nothing: 404 as if the entry did not exist. A staff member without the
 * listed role gets 403 naming it; an owner asking for a staff action also gets 403.
 */
export async function requireEntryAccess(
  event: H3Event,
  competitionId: string,
  entryId: string,
  who: 'owner-or-staff' | 'owner' | readonly Role[] = 'owner-or-staff',
): Promise<EntryAccess> {
  const access = await requireRole(event, competitionId, 'any')
  const entry = await findCompetitionEntry(competitionId, entryId)
  const isStaff = access.roles.some(r => STAFF_ROLES.includes(r))
  const isOwner = Boolean(entry && entry.entrant_user_id === access.user.id)
  if (!entry || (!isOwner && !isStaff)) throw httpError(404, MESSAGES.entryNotFound)

  if (who === 'owner-or-staff') return { ...access, entry, isOwner, isStaff }
  if (who === 'owner') {
    if (!isOwner) throw httpError(403, MESSAGES.entrantOnly)
    return { ...access, entry, isOwner, isStaff }
  }
  if (!access.roles.some(r => who.includes(r))) {
    const names = who.map(r => r === 'director' ? 'contest director' : r).join(' or ')
    throw httpError(403, MESSAGES.roleRequired(names))
  }
  return { ...access, entry, isOwner, isStaff }
}

/**
 * Who may record a grid check: a scrutineer, director or organiser of the competition. A site
 * administrator records only where they hold one of those roles themselves.
 */
export async function requireGridRecorder(event: H3Event, competitionId: string): Promise<CompetitionAccess> {
  const access = await requireRole(event, competitionId, STAFF_ROLES)
  if (access.user.isAdmin) {
    const held = await rolesInCompetition(access.user.id, competitionId)
    if (!held.some(r => STAFF_ROLES.includes(r))) throw httpError(403, MESSAGES.roleRequired('scrutineer, contest director or organiser'))
  }
  return access
}

/** 400 beside the unit field unless the unit is a flight recorder of this entry. */
export async function requireEntryRecorder(entryId: string, unitId: string): Promise<void> {
  if (!await isEntryRecorder(entryId, unitId)) {
    throw httpError(400, MESSAGES.unitNotRecorder, { fieldErrors: { unitId: [MESSAGES.unitNotRecorder] }, formErrors: [] })
  }
}

/**
 * The caller as the need-to-know rule of medical and licence files reads them: the roles they
 * hold themselves (a site administrator's organiser rights everywhere are not a role held) and
 * whether the entry is theirs. Without an entry (the review queue) nobody counts as its pilot.
 */
export async function documentReaderOf(access: CompetitionAccess & { isOwner?: boolean }): Promise<DocumentReader> {
  const rolesHeld = access.user.isAdmin ? await rolesInCompetition(access.user.id, access.competition.id) : access.roles
  return { isEntrant: access.isOwner ?? false, rolesHeld }
}

/**
 * Who may open one document's file: first the entry's own access (its entrant or the
 * competition's staff; anyone else 404), then the document (404 when it is not this entry's),
 * then need to know by its kind (403 for a medical or licence file to anyone but the pilot, a
 * scrutineer or an organiser holding that role here). `loggedAs`: the role the opening is
 * recorded under, null where it is not recorded.
 */
export async function requireDocumentFile(
  event: H3Event,
  competitionId: string,
  entryId: string,
  documentId: string,
): Promise<{ access: EntryAccess, document: DocumentRow, loggedAs: DocumentViewerRole | null }> {
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const document = await findEntryDocument(entryId, documentId)
  if (!document) throw httpError(404, MESSAGES.documentNotFound)
  const decision = decideDocumentFile(document.kind, await documentReaderOf(access))
  if (!decision.allowed) throw httpError(decision.status, decision.message)
  return { access, document, loggedAs: decision.logged ? decision.as : null }
}

/** Who reads the log of openings of an entry's medical and licence files: its pilot, or an organiser. */
export async function requireEntryDocumentViews(event: H3Event, competitionId: string, entryId: string): Promise<EntryAccess> {
  const access = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const decision = decideEntryDocumentViews(access)
  if (!decision.allowed) throw httpError(decision.status, decision.message)
  return access
}
