// What a pre-event reminder lists as open on an entry.
import { describe, expect, it } from 'vitest'
import { reminderOpenItems, type ReminderUnit } from '../../../shared/utils/reminder-items'

const warner: ReminderUnit = { kind: 'collision-warning', model: 'CW', serial: 'S1', radioId: 'ABC123', firmwareExpiresOn: '2031-12-01', approvalLevel: null }
const recorder: ReminderUnit = { kind: 'flight-recorder', model: 'FR', serial: 'S2', radioId: null, firmwareExpiresOn: null, approvalLevel: 'all-flights' }

describe('reminderOpenItems', () => {
  it('lists nothing for a complete, accepted, paid entry', () => {
    expect(reminderOpenItems({ status: 'accepted', paymentStatus: 'paid' }, [warner, recorder], '2031-06-20')).toEqual([])
  })

  it('names missing units, unpaid fee and a pending decision', () => {
    expect(reminderOpenItems({ status: 'submitted', paymentStatus: 'unpaid' }, [], '2031-06-20')).toEqual([
      'The organiser has not accepted your entry yet.',
      'The entry fee is not paid yet.',
      'No collision-warning unit is registered on your entry.',
      'No flight recorder is registered on your entry.',
    ])
  })

  it('flags firmware that expires on or before the last contest day, with the hardware caution', () => {
    // The expiry date is the first day the unit no longer works (DESIGN.md, common practice).
    const onLastDay = reminderOpenItems({ status: 'accepted', paymentStatus: 'paid' }, [{ ...warner, firmwareExpiresOn: '2031-06-20' }, recorder], '2031-06-20')
    expect(onLastDay).toHaveLength(1)
    expect(onLastDay[0]).toContain('expires on 2031-06-20')
    expect(onLastDay[0]).toContain('power the unit off before inserting or removing update media')
    expect(reminderOpenItems({ status: 'accepted', paymentStatus: 'paid' }, [{ ...warner, firmwareExpiresOn: '2031-06-21' }, recorder], '2031-06-20')).toEqual([])
  })

  it('names missing radio ID, expiry date and approval level', () => {
    const items = reminderOpenItems({ status: 'accepted', paymentStatus: null },
      [{ ...warner, radioId: null, firmwareExpiresOn: null }, { ...recorder, approvalLevel: null }, { ...recorder, serial: 'S3', approvalLevel: 'not-approved' }], null)
    expect(items).toEqual([
      'CW (serial S1): the radio ID is missing.',
      'CW (serial S1): the firmware expiry date is missing.',
      'FR (serial S2): the IGC approval level is missing.',
      'FR (serial S3): this flight recorder is not IGC-approved.',
    ])
  })
})
