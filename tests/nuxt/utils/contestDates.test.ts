import { describe, expect, it } from 'vitest'
import { formatContestDates } from '~/utils/contestDates'

describe('formatContestDates', () => {
  it('shortens a range within one month', () => {
    expect(formatContestDates('2027-07-10', '2027-07-17')).toBe('10–17 July 2027')
  })

  it('names both months across a month end', () => {
    expect(formatContestDates('2027-07-28', '2027-08-04')).toBe('28 July – 4 August 2027')
  })

  it('names both years across a year end', () => {
    expect(formatContestDates('2027-12-30', '2028-01-03')).toBe('30 December 2027 – 3 January 2028')
  })

  it('does not shift a calendar date by the viewer’s time zone', () => {
    expect(formatContestDates('2027-01-01', '2027-01-01')).toBe('1 January 2027')
  })

  it('says so when the dates are not set', () => {
    expect(formatContestDates(null, null)).toBe('Dates not set yet')
  })
})
