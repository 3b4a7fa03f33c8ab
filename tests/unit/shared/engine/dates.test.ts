import { describe, expect, it } from 'vitest'
import { addDays, addYears, dateInZone, daysBetween, isIsoDate } from '#shared/engine/dates'

describe('calendar dates as YYYY-MM-DD strings', () => {
  it('adds days across month and year ends and leap days', () => {
    expect(addDays('2027-07-18', 1)).toBe('2027-07-19')
    expect(addDays('2027-12-31', 1)).toBe('2028-01-01')
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29')
    expect(addDays('2027-07-12', -365)).toBe('2026-07-12')
  })

  it('goes back a year, 29 February falling back to 28', () => {
    expect(addYears('2027-07-12', -1)).toBe('2026-07-12')
    expect(addYears('2028-02-29', -1)).toBe('2027-02-28')
  })

  it('counts days between dates, and tells real dates', () => {
    expect(daysBetween('2027-07-18', '2027-08-05')).toBe(18)
    expect(isIsoDate('2027-02-29')).toBe(false)
    expect(isIsoDate('2028-02-29')).toBe(true)
  })

  it('gives the contest day of an instant in the competition’s time zone, not the machine’s', () => {
    // 22:30 UTC on 11 July is already 12 July in Berlin (UTC+2 in summer).
    expect(dateInZone(Date.parse('2027-07-11T22:30:00Z'), 'Europe/Berlin')).toBe('2027-07-12')
    expect(dateInZone(Date.parse('2027-07-11T22:30:00Z'), 'America/Denver')).toBe('2027-07-11')
  })
})
