// Invitations of officials: which roles can be invited, and for how long a link holds.
import type { Role } from './roles'

export const INVITABLE_ROLES = ['scrutineer', 'director', 'organiser'] as const satisfies readonly Role[]
export type InvitableRole = (typeof INVITABLE_ROLES)[number]

export const INVITATION_TTL_DAYS = 7

export const INVITATION_STATES = ['pending', 'accepted', 'expired', 'revoked'] as const
export type InvitationState = (typeof INVITATION_STATES)[number]

export const INVITATION_STATE_LABELS: Record<InvitationState, string> = {
  pending: 'Waiting',
  accepted: 'Accepted',
  expired: 'Expired',
  revoked: 'Withdrawn',
}
