import type { EntryWaiver } from '#shared/types/api-board'

/** GET /api/competitions/:id/entries/:entryId/waivers — the entry's waivers, in force and withdrawn (its entrant or staff). */
export function useEntryWaivers(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<EntryWaiver[]>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/waivers`,
    { key: () => `entry-waivers:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
