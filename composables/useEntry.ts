import type { EntryDossier } from '#shared/types/api-entries'

/** GET /api/competitions/:id/entries/:entryId — the entry's whole dossier. */
export function useEntry(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<EntryDossier>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}`,
    { key: () => `entry:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
