import type { z } from 'zod'
import type { firmwareReleaseSchema } from '#shared/schemas/firmware'
import type { FirmwareImportResult } from '#shared/types/setup'

type FirmwareReleaseBody = z.output<typeof firmwareReleaseSchema>

/**
 * The organiser's changes to the firmware catalogue ($fetch). Errors are thrown for the form
 * or page to show; callers refresh useFirmwareCatalogue afterwards.
 */
export function useFirmwareActions(competitionId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${toValue(competitionId)}/firmware`
  return {
    add: (body: FirmwareReleaseBody) => $fetch(base(), { method: 'POST', body }),
    update: (releaseId: string, body: FirmwareReleaseBody) => $fetch(`${base()}/${releaseId}`, { method: 'PATCH', body }),
    remove: (releaseId: string) => $fetch(`${base()}/${releaseId}`, { method: 'DELETE' }),
    /** The CSV file's text as it is (unit_family, version, expires_on); all lines or none. */
    importCsv: (csv: string) => $fetch<FirmwareImportResult>(`${base()}/import`, {
      method: 'POST', body: csv, headers: { 'content-type': 'text/csv' },
    }),
  }
}
