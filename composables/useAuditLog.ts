import type { AuditPage } from '#shared/types/api-board'

export interface AuditFilters {
  day?: string
  entryId?: string
  actorId?: string
  action?: string
  /** Page back: the `nextBefore` of the page shown. */
  before?: string | number
}

/** Only the filters that are set, so addresses stay short and shareable. */
export function auditQuery(f: AuditFilters): Record<string, string> {
  return Object.fromEntries(Object.entries(f).filter(([, v]) => v !== '' && v !== undefined && v !== null).map(([k, v]) => [k, String(v)]))
}

/** GET /api/competitions/:id/audit — the audit log (organiser, director), newest first, refetched when the filters change. */
export function useAuditLog(competitionId: MaybeRefOrGetter<string>, filters: MaybeRefOrGetter<AuditFilters>) {
  return useFetch<AuditPage>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/audit`, {
    key: () => `audit:${toValue(competitionId)}:${JSON.stringify(auditQuery(toValue(filters)))}`,
    query: computed(() => auditQuery(toValue(filters))),
  })
}
