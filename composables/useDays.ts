import type { DayList } from '#shared/types/api-board'

/** GET /api/competitions/:id/days — today, the scheduled days and the days opened so far (staff). */
export function useDays(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<DayList>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/days`, {
    key: () => `days:${toValue(competitionId)}`,
  })
}
