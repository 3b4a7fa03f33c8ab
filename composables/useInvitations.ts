import type { InvitationListItem, InvitationPreview, MemberListEntry } from '#shared/types/api-mail'

/** GET /api/competitions/:id/invitations — organisers: every invitation with its state. */
export function useInvitations(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<{ invitations: InvitationListItem[] }>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/invitations`, {
    key: () => `invitations:${toValue(competitionId)}`,
  })
}

/** GET /api/competitions/:id/memberships — organisers: everyone with a role here. */
export function useMembers(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<{ members: MemberListEntry[] }>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/memberships`, {
    key: () => `members:${toValue(competitionId)}`,
  })
}

/** GET /api/invitations/:token — what an invitation link invites to (anyone holding it). */
export function useInvitationPreview(token: MaybeRefOrGetter<string>) {
  return useFetch<InvitationPreview>(() => `/api/invitations/${encodeURIComponent(toValue(token))}`, {
    key: () => `invitation:${toValue(token)}`,
  })
}
