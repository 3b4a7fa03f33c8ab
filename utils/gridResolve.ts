import { normaliseShortCode, shortCodeProblem } from '#shared/utils/short-code'
import type { GridPack } from '#shared/types/api-grid'
import type { ResolvedTag } from '#shared/types/api-tags'
import { packEntryByCode, packEntryByToken, tagTokenOf } from './gridTag'

// Where a scanned text or a typed short code leads on the grid: online through the tag routes
// (the server is the authority on revoked tags), and from the day's pack when there is no
// signal. Every dead end answers in words the scrutineer can act on.

export type GridResolution =
  | { ok: true, entryId: string, compId: string, offline: boolean }
  | { ok: false, message: string, kind: 'not-a-tag' | 'unknown' | 'other-competition' | 'not-in-pack' | 'no-pack' | 'own' }

export const GRID_UI_MESSAGES = {
  notATag: 'That code is not a Gridmark tag. Scan the QR code on the glider’s tag, or type the short code printed under it.',
  otherCompetition: 'This tag belongs to another competition. Open that competition’s grid page to check this glider.',
  notInPack: 'This glider is not in today’s pack kept on this phone. Go online once so the phone gets the current pack, then scan again.',
  noPack: 'This phone has no pack of the day yet. Go online once on this page; after that the grid works without signal.',
  unknownOffline: 'No glider in today’s pack has this tag. It may be a replaced tag; use the glider’s current tag, or go online to check.',
  unknownCodeOffline: 'No glider in today’s pack has that short code. Check the characters under the QR code.',
} as const

const RESOLVE_TIMEOUT_MS = 4000

/** The request's answer, or a failure with no status (as no signal) once `ms` have passed. */
function answerWithin<T>(request: Promise<T>, ms: number): Promise<T> {
  let timer: ReturnType<typeof setTimeout> | undefined
  const late = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error('No answer from the server in time')), ms)
  })
  return Promise.race([request, late]).finally(() => clearTimeout(timer))
}

const isNetworkFailure = (error: unknown) => apiStatus(error) === undefined

async function fromServer(competitionId: string, url: string, pack: GridPack | null, offlineFallback: () => Promise<GridResolution>): Promise<GridResolution> {
  let resolved: ResolvedTag
  try {
    // A weak signal that neither answers nor fails must not leave the scan hanging: after a
    // few seconds the day's pack answers instead, as with no signal at all.
    resolved = await answerWithin($fetch<ResolvedTag>(url), RESOLVE_TIMEOUT_MS)
  }
  catch (error) {
    if (isNetworkFailure(error)) return offlineFallback()
    return { ok: false, kind: 'unknown', message: apiErrorBody(error).message ?? GRID_UI_MESSAGES.notATag }
  }
  if (resolved.competitionId !== competitionId) return { ok: false, kind: 'other-competition', message: GRID_UI_MESSAGES.otherCompetition }
  if (pack && !pack.entries.some(e => e.dossier.entry.id === resolved.entryId)) {
    return { ok: false, kind: 'not-in-pack', message: GRID_UI_MESSAGES.notInPack }
  }
  return { ok: true, entryId: resolved.entryId, compId: resolved.compId, offline: false }
}

function fromPack(pack: GridPack | null, find: (p: GridPack) => Promise<{ dossier: { entry: { id: string, compId: string } } } | undefined>, unknown: string) {
  return async (): Promise<GridResolution> => {
    if (!pack) return { ok: false, kind: 'no-pack', message: GRID_UI_MESSAGES.noPack }
    const hit = await find(pack)
    if (!hit) return { ok: false, kind: 'unknown', message: unknown }
    return { ok: true, entryId: hit.dossier.entry.id, compId: hit.dossier.entry.compId, offline: true }
  }
}

/** A decoded QR text: a /t/<token> URL on any origin, or a bare token. */
export async function resolveGridScan(competitionId: string, text: string, pack: GridPack | null, online: boolean): Promise<GridResolution> {
  const token = tagTokenOf(text)
  if (!token) return { ok: false, kind: 'not-a-tag', message: GRID_UI_MESSAGES.notATag }
  const offline = fromPack(pack, p => packEntryByToken(p, token), GRID_UI_MESSAGES.unknownOffline)
  if (!online) return offline()
  return fromServer(competitionId, `/api/tags/${encodeURIComponent(token)}`, pack, offline)
}

/** A typed short code (case, spaces and dashes do not matter). */
export async function resolveGridCode(competitionId: string, input: string, pack: GridPack | null, online: boolean): Promise<GridResolution> {
  // The same rule as the server's shortCodeSchema, without loading zod on the grid page.
  const code = normaliseShortCode(input)
  const problem = shortCodeProblem(code)
  if (problem) return { ok: false, kind: 'not-a-tag', message: problem }
  const offline = fromPack(pack, async p => packEntryByCode(p, code), GRID_UI_MESSAGES.unknownCodeOffline)
  if (!online) return offline()
  return fromServer(competitionId, `/api/competitions/${encodeURIComponent(competitionId)}/tags/by-code/${encodeURIComponent(code)}`, pack, offline)
}
