// The field: what the competition-wide checks need of every entry. Built once per
// competition; its index (who holds which radio ID and competition ID) is computed once per
// Field object, so evaluating a whole competition stays linear.
import { normaliseId, normaliseRadioId } from './normalise'
import type { Dossier, Field } from './types'

/** Entries that no longer take part do not claim radio IDs or competition IDs. */
const OUT_OF_PLAY = new Set(['withdrawn', 'rejected'])

export function buildField(dossiers: readonly Dossier[]): Field {
  const entries: Field['entries'] = {}
  for (const d of dossiers) {
    if (d.entry.status && OUT_OF_PLAY.has(d.entry.status)) continue
    const radioIds: string[] = []
    for (const u of d.units) {
      if (u.kind === 'collision-warning' && u.radioId) radioIds.push(u.radioId)
    }
    entries[d.entry.id] = { compId: d.entry.compId, radioIds }
  }
  return { entries }
}

export interface FieldIndex {
  byRadioId: Map<string, string[]>
  byCompId: Map<string, string[]>
}

const cache = new WeakMap<Field, FieldIndex>()

/** The field's index; a Field is treated as immutable once indexed. */
export function fieldIndex(field: Field): FieldIndex {
  const hit = cache.get(field)
  if (hit) return hit
  const byRadioId = new Map<string, string[]>()
  const byCompId = new Map<string, string[]>()
  const add = (map: Map<string, string[]>, key: string, id: string) => {
    if (!key) return
    const list = map.get(key)
    if (!list) map.set(key, [id])
    else if (!list.includes(id)) list.push(id)
  }
  for (const id of Object.keys(field.entries).sort()) {
    const e = field.entries[id]!
    add(byCompId, normaliseId(e.compId), id)
    for (const r of e.radioIds) add(byRadioId, normaliseRadioId(r), id)
  }
  const index = { byRadioId, byCompId }
  cache.set(field, index)
  return index
}

/** The competition IDs of the other entries holding the key, for a reason. */
export function othersLabel(field: Field, ids: readonly string[], self: string): string[] {
  return ids.filter(id => id !== self).map(id => field.entries[id]?.compId ?? id).sort()
}

/**
 * The other entries whose field checks read what the `changed` entries hold now: those that
 * share a competition ID or a radio ID with them. (Entries that shared one before the change
 * carry that check's finding; the caller finds those among the findings it stored.)
 */
export function fieldNeighbours(field: Field, changed: readonly string[]): string[] {
  const { byCompId, byRadioId } = fieldIndex(field)
  const out = new Set<string>()
  for (const id of changed) {
    const e = field.entries[id]
    if (!e) continue
    for (const other of byCompId.get(normaliseId(e.compId)) ?? []) out.add(other)
    for (const r of e.radioIds) for (const other of byRadioId.get(normaliseRadioId(r)) ?? []) out.add(other)
  }
  for (const id of changed) out.delete(id)
  return [...out].sort()
}
