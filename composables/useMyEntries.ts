import type { MyEntrySummary } from '#shared/types/api-entries'

/** GET /api/me/entries — the signed-in user's own entries with what is missing and the next step. */
export function useMyEntries() {
  return useFetch<{ entries: MyEntrySummary[] }>('/api/me/entries', { key: 'my-entries' })
}
