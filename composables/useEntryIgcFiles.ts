import type { IgcFileListResponse } from '#shared/types/files'

/** GET …/entries/:entryId/igc-files — the latest IGC file of each recorder, with history. */
export function useEntryIgcFiles(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<IgcFileListResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/igc-files`,
    { key: () => `entry-igc-files:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
