import type { CompetitionDetail } from '#shared/types/api'

/** GET /api/competitions/:id — the competition as the signed-in user may see it. */
export function useCompetition(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<CompetitionDetail>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}`, {
    key: () => `competition:${toValue(competitionId)}`,
  })
}
