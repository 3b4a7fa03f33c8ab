// Checklist item identifiers: made from the label, valid for the rules schema, unique.
import { describe, expect, it } from 'vitest'
import { checklistIdFor, cleanChecklist } from '../../../../shared/utils/checklist'
import { checklistItemSchema, checklistSchema } from '../../../../shared/schemas/competition'
import { DEFAULT_CHECKLIST } from '../../../../shared/constants/grid'

describe('checklistIdFor', () => {
  it('slugs the label', () => {
    expect(checklistIdFor('Canopy jettison handle secured!', [])).toBe('canopy-jettison-handle-secured')
    expect(checklistIdFor('  Élévateur — côté gauche ', [])).toBe('elevateur-cote-gauche')
  })

  it('never repeats an identifier already in the list', () => {
    const taken = DEFAULT_CHECKLIST.map(i => i.id)
    expect(checklistIdFor('Antennas', taken)).toBe('antennas-2')
    expect(checklistIdFor('Antennas', [...taken, 'antennas-2'])).toBe('antennas-3')
  })

  it('gives identifiers the rules schema accepts, even for long or symbol-only labels', () => {
    const long = 'Tail dolly removed and the tail wheel free to turn before the tow'
    for (const label of [long, '!!!', '42', long]) {
      const id = checklistIdFor(label, ['tail-dolly-removed-and-the-tail-wheel-f'])
      expect(checklistItemSchema.safeParse({ id, label: label || 'x' }).success, id).toBe(true)
      expect(id.length).toBeLessThanOrEqual(40)
    }
    expect(checklistIdFor('!!!', [])).toBe('item')
  })
})

describe('cleanChecklist', () => {
  it('trims labels and hints and leaves out empty hints', () => {
    const items = cleanChecklist([{ id: 'a', label: ' Wings ', hint: '  ' }, { id: 'b', label: 'Tail', hint: ' Dolly off ' }])
    expect(items).toEqual([{ id: 'a', label: 'Wings' }, { id: 'b', label: 'Tail', hint: 'Dolly off' }])
    expect(checklistSchema.safeParse(items).success).toBe(true)
  })
})
