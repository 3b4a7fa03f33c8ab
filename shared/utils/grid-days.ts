// Which days a grid check may be recorded for (and a contest day opened): from GRID_DAYS_BACK
// days before today to GRID_DAYS_AHEAD after, today being the competition's own calendar date.
import { addDays, dateInZone } from '../engine/dates'
import type { IsoDate } from '../engine/types'
import { GRID_DAYS_AHEAD, GRID_DAYS_BACK } from '../constants/grid'

/** The competition's calendar date now. */
export function todayIn(timeZone: string, now: Date = new Date()): IsoDate {
  return dateInZone(now, timeZone)
}

/** Whether `day` lies in the grid window around `today`. */
export function gridDayAllowed(day: IsoDate, today: IsoDate): boolean {
  return day >= addDays(today, -GRID_DAYS_BACK) && day <= addDays(today, GRID_DAYS_AHEAD)
}
