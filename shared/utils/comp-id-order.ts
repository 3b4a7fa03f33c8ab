// Competition IDs in the order people read them on a board: numbers by value, then letters
// (3, 7, 12, 33, A1, A2, A10, AB), case aside — the same order as the database's comp_id_order
// collation (ICU with numeric ordering), so a glider added to a screen lands where a fresh
// board would put it.
const collator = new Intl.Collator('und', { numeric: true, sensitivity: 'base' })

export function compareCompIds(a: string, b: string): number {
  return collator.compare(a, b)
}
