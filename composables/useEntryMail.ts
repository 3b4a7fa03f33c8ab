import type { EntryMailResponse } from '#shared/types/api-mail'

/** GET /api/competitions/:id/entries/:entryId/mail — the organiser's log of an entry's e-mail. */
export function useEntryMail(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  return useFetch<EntryMailResponse>(
    () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/mail`,
    { key: () => `entry-mail:${toValue(competitionId)}:${toValue(entryId)}` },
  )
}
