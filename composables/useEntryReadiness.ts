import type { EntryDayReadiness } from '#shared/types/api-board'

/** GET /api/competitions/:id/entries/:entryId/readiness — the entry on the open day's board (its entrant or staff). */
export function useEntryReadiness(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<EntryDayReadiness>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/readiness`,
    { key: () => `entry-readiness:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
