// When a competition's medical and licence files fall due (N whole days kept after the last
// contest day, due from 00:00 in the competition's time zone on day last + N + 1), when a
// replaced copy does (30 × 24 h after a newer copy was accepted), and the words the lists and
// the timeline use. Gridmark rules (no published source); the time zone offsets are the IANA
// database's (Europe/Berlin: UTC+2 in summer, UTC+1 in winter; Pacific/Auckland: UTC+13 in summer).
import { describe, expect, it } from 'vitest'
import {
  fileDeletedNote, fileDeletedSentence, keptFor, medicalFilesDue, medicalFilesDueOn, supersededAcceptedBy,
} from '#shared/utils/document-retention'

describe('medicalFilesDueOn', () => {
  it('is the day after the N days kept', () => {
    expect(medicalFilesDueOn('2027-07-18', 30)).toBe('2027-08-18')
    expect(medicalFilesDueOn('2027-12-20', 30)).toBe('2028-01-20')
    expect(medicalFilesDueOn('2028-02-28', 1)).toBe('2028-03-01') // leap year: 29 February is the one day kept
  })
})

describe('medicalFilesDue', () => {
  const last = '2027-07-18'

  it('is not due the day before, nor in the last second before local midnight', () => {
    expect(medicalFilesDue(new Date('2027-08-17T12:00:00Z'), last, 30, 'Europe/Berlin')).toBe(false)
    // 2027-08-17 23:59:59 in Berlin (UTC+2).
    expect(medicalFilesDue(new Date('2027-08-17T21:59:59Z'), last, 30, 'Europe/Berlin')).toBe(false)
  })

  it('is due from 00:00 in the competition’s time zone on day last + N + 1, and after', () => {
    expect(medicalFilesDue(new Date('2027-08-17T22:00:00Z'), last, 30, 'Europe/Berlin')).toBe(true)
    expect(medicalFilesDue(new Date('2027-09-30T10:00:00Z'), last, 30, 'Europe/Berlin')).toBe(true)
  })

  it('follows the competition’s zone, not UTC', () => {
    // Auckland in August is UTC+12: 2027-08-18 00:00 there is 2027-08-17 12:00 UTC.
    expect(medicalFilesDue(new Date('2027-08-17T11:59:59Z'), last, 30, 'Pacific/Auckland')).toBe(false)
    expect(medicalFilesDue(new Date('2027-08-17T12:00:00Z'), last, 30, 'Pacific/Auckland')).toBe(true)
    // The same instant in UTC is still 2027-08-17.
    expect(medicalFilesDue(new Date('2027-08-17T12:00:00Z'), last, 30, 'UTC')).toBe(false)
  })

  it('honours the organiser’s number of days', () => {
    // Kept 10 days, 2027-07-19 to 2027-07-28; due from 2027-07-29 00:00 in Berlin.
    expect(medicalFilesDue(new Date('2027-07-28T21:59:59Z'), last, 10, 'Europe/Berlin')).toBe(false)
    expect(medicalFilesDue(new Date('2027-07-28T22:00:00Z'), last, 10, 'Europe/Berlin')).toBe(true)
  })
})

describe('supersededAcceptedBy', () => {
  it('is exactly 30 × 24 hours before the run', () => {
    expect(supersededAcceptedBy(new Date('2027-04-01T10:00:00.000Z')).toISOString()).toBe('2027-03-02T10:00:00.000Z')
  })
})

describe('words', () => {
  it('say how long the file was kept, and why', () => {
    expect(keptFor('retention-medical', 30)).toBe('30 days after the competition')
    expect(keptFor('retention-medical', 1)).toBe('1 day after the competition')
    expect(keptFor('retention-superseded', 30)).toBe('30 days after a newer copy was accepted')
  })

  it('give the lists a note and the timeline a sentence', () => {
    expect(fileDeletedNote('retention-medical', '2027-08-18', 30)).toBe('Deleted on 2027-08-18 (kept 30 days after the competition)')
    expect(fileDeletedSentence('medical', 'retention-medical', 30))
      .toBe('Medical file deleted, kept 30 days after the competition; its kind, validity and review outcome stay on record')
    expect(fileDeletedSentence('insurance', 'retention-superseded', 30))
      .toBe('Earlier insurance file deleted, kept 30 days after a newer copy was accepted; its kind, validity and review outcome stay on record')
  })
})
