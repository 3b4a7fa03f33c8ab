// Identifiers of grid checklist items: made once from the label when the organiser adds an
// item, then kept when the label changes, because recorded grid checks refer to them.
import { WATER_BALLAST_EMPTY_ITEM, type ChecklistItem } from '../constants/grid'

const MAX_ID = 40

/** "Canopy jettison handle secured!" → "canopy-jettison-handle-secured", unique among `taken`. */
export function checklistIdFor(label: string, taken: Iterable<string>): string {
  const used = new Set(taken)
  const base = label
    .normalize('NFKD')
    .replace(/[\u0300-\u036F]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, MAX_ID)
    .replace(/-+$/, '') || 'item'
  if (!used.has(base)) return base
  for (let n = 2; ; n++) {
    const suffix = `-${n}`
    const candidate = `${base.slice(0, MAX_ID - suffix.length).replace(/-+$/, '')}${suffix}`
    if (!used.has(candidate)) return candidate
  }
}

/** The items as the rules store them: trimmed, an empty hint left out. */
export function cleanChecklist(items: readonly ChecklistItem[]): ChecklistItem[] {
  return items.map(i => (i.hint?.trim() ? { id: i.id, label: i.label.trim(), hint: i.hint.trim() } : { id: i.id, label: i.label.trim() }))
}

/**
 * The day's checklist for one glider: the competition's items, and for a class without water
 * ballast the item "Water ballast tanks empty", added by the class itself (unless the
 * organiser's list already has it).
 */
export function checklistFor(items: readonly ChecklistItem[], classCarriesWaterBallast: boolean | undefined): ChecklistItem[] {
  if (classCarriesWaterBallast !== false || items.some(i => i.id === WATER_BALLAST_EMPTY_ITEM.id)) return [...items]
  return [...items, { ...WATER_BALLAST_EMPTY_ITEM }]
}
