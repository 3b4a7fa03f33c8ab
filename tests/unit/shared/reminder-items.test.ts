// What a pre-event reminder lists as open on an entry: the decision, then the engine's findings,
// each naming its check (the e-mail links it to its rule).
import { describe, expect, it } from 'vitest'
import { HARDWARE_CAUTION, type Finding } from '../../../shared/engine'
import { reminderOpenItems } from '../../../shared/utils/reminder-items'

const expired: Finding = { checkId: 'firmware.valid-through-contest', severity: 'blocking', reason: 'The firmware expires 2031-06-15.', fixHint: 'Update it.', caution: HARDWARE_CAUTION, unitId: 'u1' }
const soon: Finding = { checkId: 'firmware.expires-soon', severity: 'advisory', reason: 'Another unit expires soon.', fixHint: 'Plan the update.', caution: HARDWARE_CAUTION, unitId: 'u2' }
const unpaid: Finding = { checkId: 'entry.paid', severity: 'blocking', reason: 'The entry fee is not paid yet.', fixHint: 'Pay it.' }

describe('reminderOpenItems', () => {
  it('lists nothing for an accepted entry without findings', () => {
    expect(reminderOpenItems({ status: 'accepted' }, [])).toEqual([])
  })

  it('names a pending decision, then each finding with its fix hint', () => {
    expect(reminderOpenItems({ status: 'submitted' }, [unpaid])).toEqual([
      { text: 'The organiser has not accepted your entry yet.' },
      { text: 'Blocking: The entry fee is not paid yet. Pay it.', checkId: 'entry.paid' },
    ])
  })

  it('gives the hardware caution in full once, and points back to it after', () => {
    const items = reminderOpenItems({ status: 'accepted' }, [expired, soon])
    expect(items[0]!.text).toBe(`Blocking: The firmware expires 2031-06-15. Update it. Caution: ${HARDWARE_CAUTION}`)
    expect(items[1]!.text).toBe('Advisory: Another unit expires soon. Plan the update. Caution: as above.')
    expect(items.map(i => i.checkId)).toEqual(['firmware.valid-through-contest', 'firmware.expires-soon'])
  })
})
