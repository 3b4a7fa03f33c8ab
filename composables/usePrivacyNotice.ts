import type { CompetitionPrivacyNotice, SitePrivacyNotice } from '#shared/types/api-privacy'

/** GET /api/competitions/:id/privacy-notice — the competition's privacy notice (public). */
export function usePrivacyNotice(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<CompetitionPrivacyNotice>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/privacy-notice`, {
    key: () => `privacy-notice:${toValue(competitionId)}`,
  })
}

/** GET /api/privacy-notices — the site's own notice and the open competitions' notices (public). */
export function useSitePrivacyNotice() {
  return useFetch<SitePrivacyNotice>('/api/privacy-notices', { key: 'site-privacy-notice' })
}
