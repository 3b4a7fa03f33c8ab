import type { EntryTimeline } from '#shared/types/api-board'

/** GET /api/competitions/:id/entries/:entryId/timeline — the entry's grid checks, finding changes, holds, releases and waivers (its entrant or staff). */
export function useEntryTimeline(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<EntryTimeline>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/timeline`,
    { key: () => `entry-timeline:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
