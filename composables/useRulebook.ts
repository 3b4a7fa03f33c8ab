import type { Rulebook } from '#shared/types/api-rulebook'

/** GET /api/competitions/:id/checks — the competition's rulebook (any member). */
export function useRulebook(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<Rulebook>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/checks`, {
    key: () => `rulebook:${toValue(competitionId)}`,
  })
}
