// API response types of invitations and the reminder job.
import type { InvitableRole, InvitationState } from '../constants/invitations'
import type { Role } from '../constants/roles'

export interface InvitationListItem {
  id: string
  email: string
  role: InvitableRole
  state: InvitationState
  expiresAt: string
  createdAt: string
  invitedByName: string | null
  acceptedAt: string | null
  acceptedByName: string | null
  revokedAt: string | null
}

/** What a link invites to, shown to anyone holding it. */
export interface InvitationPreview {
  role: InvitableRole
  email: string
  expiresAt: string
  invitedByName: string | null
  competition: {
    id: string
    name: string
    airfieldName: string
    firstContestDay: string | null
    lastContestDay: string | null
  }
}

export interface InvitationAccepted {
  competitionId: string
  role: InvitableRole
}

export interface ReminderRunResult {
  queued: number
  entryIds: string[]
  /** Each reminder queued: its entry and kind (`pre-event-30`, `draft-14`, …). */
  reminders: { entryId: string, kind: string }[]
}

/** One person in GET /api/competitions/:id/memberships, with each role's membership id. */
export interface MemberListEntry {
  userId: string
  name: string
  email: string
  roles: Role[]
  memberships: { id: string, role: Role }[]
}

/** One e-mail about an entry, as the organiser's mail log shows it. */
export interface EntryMailItem {
  id: string
  to: string
  subject: string
  template: string
  queuedAt: string
  sentAt: string | null
  attempts: number
  lastError: string | null
}

export interface EntryMailResponse {
  mail: EntryMailItem[]
}
