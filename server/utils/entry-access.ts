// Who may read or act on one entry: its own entrant, or the competition's staff. The one
// entry-level access helper of every entry route (dossier, units, documents, IGC files,
// payments); it builds on requireRole, so competition-level refusals stay the same.
import type { H3Event } from 'h3'
import type { Role } from '#shared/constants/roles'
import { STAFF_ROLES } from '#shared/constants/roles'
import type { EntryRow } from '#shared/types/rows'
import { MESSAGES } from '#shared/constants/messages'
import type { CompetitionAccess } from './authz'

export interface EntryAccess extends CompetitionAccess {
  entry: EntryRow
  /** The caller is the entry's own entrant. */
  isOwner: boolean
  /** The caller holds a staff role (organiser, scrutineer, director; admins count as organisers). */
  isStaff: boolean
}

/**
 * `who`: 'owner-or-staff' (read the dossier, upload for it), 'owner' (only its entrant, e.g.
 * withdraw, pay), or a list of staff roles (e.g. ['organiser'] to accept, ['organiser',
 * 'scrutineer'] to review documents).
 * Anyone else learns nothing: 404 as if the entry did not exist. A staff member without
 * the listed role gets 403 naming it; an owner asking for a staff action also gets 403.
 */
export async function requireEntryAccess(
  event: H3Event,
  competitionId: string,
  entryId: string,
  who: 'owner-or-staff' | 'owner' | readonly Role[] = 'owner-or-staff',
): Promise<EntryAccess> {
  const access = await requireRole(event, competitionId, 'any')
  const entry = await useDb()<EntryRow>('entries').where({ id: entryId, competition_id: competitionId }).first()
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
