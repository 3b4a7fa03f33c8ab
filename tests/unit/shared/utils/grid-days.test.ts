// The days a grid check may be recorded for, around the competition's own today.
import { describe, expect, it } from 'vitest'
import { gridDayAllowed, todayIn } from '../../../../shared/utils/grid-days'

describe('the day window and the competition’s today', () => {
  it('takes today, tomorrow and up to 14 days back', () => {
    expect(gridDayAllowed('2027-05-03', '2027-05-03')).toBe(true)
    expect(gridDayAllowed('2027-05-04', '2027-05-03')).toBe(true)
    expect(gridDayAllowed('2027-05-05', '2027-05-03')).toBe(false)
    expect(gridDayAllowed('2027-04-19', '2027-05-03')).toBe(true)
    expect(gridDayAllowed('2027-04-18', '2027-05-03')).toBe(false)
  })

  it('reads today in the competition’s time zone, not the server’s', () => {
    const at = new Date('2027-05-03T23:30:00Z')
    expect(todayIn('Europe/Berlin', at)).toBe('2027-05-04')
    expect(todayIn('America/Denver', at)).toBe('2027-05-03')
  })
})
