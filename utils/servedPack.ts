import type { GridPack } from '#shared/types/api-grid'

/**
 * Which pack a grid page opens with when the server's render brought one: `served` when it
 * is newer than the one kept on the phone (the server made it for this page: keep it, no
 * fresh one needed), `kept` when the phone holds a newer one (the page is a copy the worker
 * kept from an earlier visit), `same` when it is the pack kept (a copy of a page whose pack
 * the phone already holds: a fresh one is asked for as on any other opening).
 */
export function servedPackUse(served: Pick<GridPack, 'generatedAt'>, kept: Pick<GridPack, 'generatedAt'> | undefined): 'served' | 'kept' | 'same' {
  if (!kept) return 'served'
  const a = Date.parse(served.generatedAt)
  const b = Date.parse(kept.generatedAt)
  if (a > b) return 'served'
  return a < b ? 'kept' : 'same'
}
