import type { CompetitionSetupResponse } from '#shared/types/setup'

/** GET /api/competitions/:id/setup — everything the organiser's set-up form shows. */
export function useCompetitionSetup(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<CompetitionSetupResponse>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/setup`, {
    key: () => `competition-setup:${toValue(competitionId)}`,
  })
}
