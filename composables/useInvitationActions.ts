import type { InvitationInput } from '#shared/schemas/invitation'
import type { InvitationAccepted } from '#shared/types/api-mail'

/** The organiser invites officials and withdraws invitations ($fetch); callers refresh useInvitations afterwards. */
export function useInvitationActions(competitionId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${toValue(competitionId)}/invitations`
  return {
    invite: (body: InvitationInput) => $fetch(base(), { method: 'POST', body }),
    revoke: (invitationId: string) => $fetch(`${base()}/${invitationId}`, { method: 'DELETE' }),
  }
}

/** The organiser removes a role ($fetch); callers refresh useMembers afterwards. */
export function useMembershipActions(competitionId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${toValue(competitionId)}/memberships`
  return {
    remove: (membershipId: string) => $fetch(`${base()}/${membershipId}`, { method: 'DELETE' }),
  }
}

/** Whoever holds an invitation link accepts it ($fetch); the caller reloads the session. */
export function useInvitationLinkActions(token: MaybeRefOrGetter<string>) {
  return {
    accept: () => $fetch<InvitationAccepted>(`/api/invitations/${encodeURIComponent(toValue(token))}/accept`, { method: 'POST' }),
  }
}
