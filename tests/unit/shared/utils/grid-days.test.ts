// The days a grid check may be recorded for, around the competition's own today.
import { describe, expect, it } from 'vitest'
import { gridCheckTimeProblem, gridDayAllowed, todayIn } from '../../../../shared/utils/grid-days'

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

// common practice: a phone's clock is believed within the contest day, give or take two hours,
// and up to five minutes ahead of the server's (GRID_CHECK_*_SLACK_MINUTES).
describe('the time of a grid check', () => {
  const zone = 'Europe/Berlin' // UTC+2 in May
  const now = new Date('2027-05-03T13:00:00Z') // 15:00 on 3 May in Berlin

  it('takes a time earlier on the day, or a check made offline in the morning and sent now', () => {
    expect(gridCheckTimeProblem('2027-05-03T12:59:00Z', '2027-05-03', zone, now)).toBeNull()
    expect(gridCheckTimeProblem('2027-05-03T08:00:00+02:00', '2027-05-03', zone, now)).toBeNull()
  })

  it('takes a phone up to five minutes ahead of the server, not more', () => {
    expect(gridCheckTimeProblem('2027-05-03T13:05:00Z', '2027-05-03', zone, now)).toBeNull()
    expect(gridCheckTimeProblem('2027-05-03T13:05:01Z', '2027-05-03', zone, now)).toBe('future')
    expect(gridCheckTimeProblem('2027-05-03T13:10:00Z', '2027-05-03', zone, now)).toBe('future')
    expect(gridCheckTimeProblem('9999-05-03T13:00:00Z', '2027-05-03', zone, now)).toBe('future')
  })

  it('takes the day in the competition’s zone give or take two hours, not a time on another day', () => {
    // 3 May starts at 22:00 UTC on 2 May in Berlin.
    expect(gridCheckTimeProblem('2027-05-02T20:00:00Z', '2027-05-03', zone, now)).toBeNull()
    expect(gridCheckTimeProblem('2027-05-02T19:59:00Z', '2027-05-03', zone, now)).toBe('outside-day')
    expect(gridCheckTimeProblem('2027-05-01T12:00:00Z', '2027-05-03', zone, now)).toBe('outside-day')
    // A check of yesterday made yesterday, sent today; one of yesterday made today is refused.
    expect(gridCheckTimeProblem('2027-05-02T10:00:00Z', '2027-05-02', zone, now)).toBeNull()
    expect(gridCheckTimeProblem('2027-05-03T12:00:00Z', '2027-05-02', zone, now)).toBe('outside-day')
  })

  it('takes tomorrow’s day from a phone just before midnight, not in the afternoon before', () => {
    const lateEvening = new Date('2027-05-03T21:30:00Z') // 23:30 in Berlin
    expect(gridCheckTimeProblem(lateEvening, '2027-05-04', zone, lateEvening)).toBeNull()
    expect(gridCheckTimeProblem(now, '2027-05-04', zone, now)).toBe('outside-day')
  })
})
