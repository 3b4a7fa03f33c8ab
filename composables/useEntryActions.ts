import type { EntryBody, EntryPatch, UnitBody, OccupantMasses } from '#shared/schemas/entry'
import type { EntryDossier, FirmwareSuggestion, UnitView } from '#shared/types/api-entries'

/**
 * The entry's write actions ($fetch; each answer is the new dossier or unit, so callers
 * refresh or patch useEntry's data). Errors are thrown for useSchemaForm to map.
 */
export function useEntryActions(competitionId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}`
  const entry = (entryId: string) => `${base()}/entries/${encodeURIComponent(entryId)}`
  return {
    create: (body: EntryBody) => $fetch<{ id: string }>(`${base()}/entries`, { method: 'POST', body }),
    update: (entryId: string, body: EntryPatch) => $fetch<EntryDossier>(entry(entryId), { method: 'PATCH', body }),
    addUnit: (entryId: string, body: UnitBody) => $fetch<UnitView>(`${entry(entryId)}/units`, { method: 'POST', body }),
    updateUnit: (entryId: string, unitId: string, body: UnitBody) =>
      $fetch<UnitView>(`${entry(entryId)}/units/${encodeURIComponent(unitId)}`, { method: 'PATCH', body }),
    deleteUnit: (entryId: string, unitId: string) =>
      $fetch(`${entry(entryId)}/units/${encodeURIComponent(unitId)}`, { method: 'DELETE' }),
    submit: (entryId: string) => $fetch<EntryDossier>(`${entry(entryId)}/submit`, { method: 'POST' }),
    /** The entrant withdraws their entry; the organiser withdraws it for the pilot with a reason. */
    withdraw: (entryId: string, reason?: string) =>
      $fetch<EntryDossier>(`${entry(entryId)}/withdraw`, { method: 'POST', ...(reason ? { body: { reason } } : {}) }),
    accept: (entryId: string) => $fetch<EntryDossier>(`${entry(entryId)}/accept`, { method: 'POST' }),
    reject: (entryId: string, reason: string) => $fetch<EntryDossier>(`${entry(entryId)}/reject`, { method: 'POST', body: { reason } }),
    /** Staff: the pilot's and co-pilot's mass with parachute from the registration weighing. */
    recordOccupantMasses: (entryId: string, body: OccupantMasses) => $fetch<EntryDossier>(`${entry(entryId)}/occupant-masses`, { method: 'PUT', body }),
    suggestFirmware: (family: string, version: string) =>
      $fetch<FirmwareSuggestion>(`${base()}/firmware/suggest`, { query: { family, version } }),
  }
}
