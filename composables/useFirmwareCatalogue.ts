import type { FirmwareCatalogueResponse } from '#shared/types/setup'

/** GET /api/competitions/:id/firmware — the competition's firmware catalogue (staff). */
export function useFirmwareCatalogue(competitionId: MaybeRefOrGetter<string>) {
  return useFetch<FirmwareCatalogueResponse>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/firmware`, {
    key: () => `firmware-catalogue:${toValue(competitionId)}`,
  })
}
