import type { HoldBody, ReleaseBody, WaiverBody, WaiverWithdrawBody } from '#shared/schemas/board'
import type { DirectorActionResult } from '#shared/types/api-board'

/**
 * The contest director's actions on one entry ($fetch): hold, release, waive a finding, withdraw
 * a waiver. Errors
 * are thrown for useSchemaForm to show; callers refresh useBoardEntry and useEntryTimeline.
 */
export function useDirectorActions(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}`
  return {
    hold: (body: HoldBody) => $fetch<DirectorActionResult>(`${base()}/hold`, { method: 'POST', body }),
    release: (body: ReleaseBody) => $fetch<DirectorActionResult>(`${base()}/release`, { method: 'POST', body }),
    waive: (body: WaiverBody) => $fetch<DirectorActionResult>(`${base()}/waivers`, { method: 'POST', body }),
    withdrawWaiver: (actionId: string, body: WaiverWithdrawBody) =>
      $fetch<DirectorActionResult>(`${base()}/waivers/${encodeURIComponent(actionId)}/withdraw`, { method: 'POST', body }),
  }
}
