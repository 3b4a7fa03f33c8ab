import type { MembershipSummary } from '#shared/types/api'

/** GET /api/competitions — the competitions the signed-in user may open, with their roles. */
export function useCompetitions() {
  return useFetch<{ competitions: MembershipSummary[] }>('/api/competitions', { key: 'competitions' })
}
