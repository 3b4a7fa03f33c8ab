import type { EntryTableResponse } from '#shared/types/setup'

export interface EntryTableParams {
  sort: string
  direction: 'asc' | 'desc'
  class: string
  status: string
  payment: string
  /** '' (any), 'blocking', 'advisory' or 'none': which findings the entries have. */
  findings: string
  q: string
  page: number
  pageSize: number
}

/** Only the parameters that are set, so addresses stay short and shareable. */
export function entryTableQuery(p: Partial<EntryTableParams>): Record<string, string> {
  return Object.fromEntries(Object.entries(p).filter(([, v]) => v !== '' && v !== undefined && v !== null).map(([k, v]) => [k, String(v)]))
}

/** GET /api/competitions/:id/entries — the staff entries table, refetched when the parameters change. */
export function useEntryTable(competitionId: MaybeRefOrGetter<string>, params: MaybeRefOrGetter<EntryTableParams>) {
  return useFetch<EntryTableResponse>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries`, {
    key: () => `entry-table:${toValue(competitionId)}:${JSON.stringify(entryTableQuery(toValue(params)))}`,
    query: computed(() => entryTableQuery(toValue(params))),
  })
}

/** Address of the CSV export under the same filters and sort (no paging). */
export function entryExportUrl(competitionId: string, p: Partial<EntryTableParams>): string {
  const { page: _page, pageSize: _size, ...filters } = p
  const qs = new URLSearchParams(entryTableQuery(filters)).toString()
  return `/api/competitions/${encodeURIComponent(competitionId)}/entries/export${qs ? `?${qs}` : ''}`
}
