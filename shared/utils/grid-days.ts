// Which days a grid check may be recorded for (and a contest day opened): from GRID_DAYS_BACK
// days before today to GRID_DAYS_AHEAD after, today being the competition's own calendar date.
import { addDays, dateInZone } from '../engine/dates'
import type { IsoDate } from '../engine/types'
import { GRID_CHECK_CLOCK_SLACK_MINUTES, GRID_CHECK_DAY_SLACK_MINUTES, GRID_DAYS_AHEAD, GRID_DAYS_BACK } from '../constants/grid'

/** The competition's calendar date now. */
export function todayIn(timeZone: string, now: Date = new Date()): IsoDate {
  return dateInZone(now, timeZone)
}

/** Whether `day` lies in the grid window around `today`. */
export function gridDayAllowed(day: IsoDate, today: IsoDate): boolean {
  return day >= addDays(today, -GRID_DAYS_BACK) && day <= addDays(today, GRID_DAYS_AHEAD)
}

/**
 * Why the time of a grid check cannot be believed, or null: later than `now` (plus the clock's
 * slack), or not on `day` in the competition's zone (give or take the day's slack).
 */
export function gridCheckTimeProblem(checkedAt: string | Date, day: IsoDate, timeZone: string, now: Date = new Date()): 'future' | 'outside-day' | null {
  const at = new Date(checkedAt).getTime()
  if (at > now.getTime() + GRID_CHECK_CLOCK_SLACK_MINUTES * 60_000) return 'future'
  const slack = GRID_CHECK_DAY_SLACK_MINUTES * 60_000
  // The calendar date is monotonic in time: the day lies between the dates at either end of the slack.
  const onDay = dateInZone(at - slack, timeZone) <= day && day <= dateInZone(at + slack, timeZone)
  return onDay ? null : 'outside-day'
}
