// Which pre-event reminder is due on a day: the organiser's schedule of days before the first
// contest day, the latest reminder only after days the job did not run, never one twice or an
// earlier one after a later one. Gridmark rules (no published source).
import { describe, expect, it } from 'vitest'
import {
  DEFAULT_REMINDER_DAYS, dueReminder, reminderKind, reminderKindDays, reminderScheduleOf, reminderScheduleText,
} from '#shared/utils/reminder-schedule'

const FIRST = '2031-06-10'
const SCHEDULE = [30, 14, 3]

describe('dueReminder', () => {
  it('is nothing before the first reminder’s day', () => {
    expect(dueReminder(SCHEDULE, FIRST, '2031-05-10')).toBeNull() // 31 days before
  })

  it('is each reminder on its day', () => {
    expect(dueReminder(SCHEDULE, FIRST, '2031-05-11')).toBe(30)
    expect(dueReminder(SCHEDULE, FIRST, '2031-05-27')).toBe(14)
    expect(dueReminder(SCHEDULE, FIRST, '2031-06-07')).toBe(3)
  })

  it('stays due until the next reminder’s day, so a late run still sends it', () => {
    expect(dueReminder(SCHEDULE, FIRST, '2031-05-20')).toBe(30) // 21 days before
    expect(dueReminder(SCHEDULE, FIRST, '2031-06-09')).toBe(3) // the eve of the first contest day
  })

  it('is only the latest due after days without a run: no burst of missed reminders', () => {
    // The job last ran 31 days before and next runs 10 days before: 30 and 14 were both missed.
    expect(dueReminder(SCHEDULE, FIRST, '2031-05-31')).toBe(14)
  })

  it('is nothing once the entry has that reminder, or a later one', () => {
    expect(dueReminder(SCHEDULE, FIRST, '2031-05-11', [30])).toBeNull()
    expect(dueReminder(SCHEDULE, FIRST, '2031-05-27', [30])).toBe(14)
    expect(dueReminder(SCHEDULE, FIRST, '2031-05-27', [30, 14])).toBeNull()
    // A longer lead time added to the schedule late is not sent after a shorter one.
    expect(dueReminder([21, 14, 3], FIRST, '2031-05-25', [14])).toBeNull()
    expect(dueReminder([30, 10], FIRST, '2031-05-28', [14])).toBeNull()
  })

  it('is nothing from the first contest day on, or with no schedule', () => {
    expect(dueReminder(SCHEDULE, FIRST, FIRST)).toBeNull()
    expect(dueReminder(SCHEDULE, FIRST, '2031-06-12')).toBeNull()
    expect(dueReminder([], FIRST, '2031-06-07')).toBeNull()
  })

  it('counts calendar days across a month end and a leap day', () => {
    expect(dueReminder([30], '2032-03-01', '2032-01-31')).toBe(30) // 2032 is a leap year: 30 days
    expect(dueReminder([30], '2032-03-01', '2032-01-30')).toBeNull() // 31 days
  })
})

describe('the schedule a competition stored', () => {
  it('defaults to 30, 14 and 3 days before', () => {
    expect(DEFAULT_REMINDER_DAYS).toEqual([30, 14, 3])
    expect(reminderScheduleOf({})).toEqual([30, 14, 3])
    expect(reminderScheduleOf(null)).toEqual([30, 14, 3])
  })

  it('reads a stored list, largest first; an empty list is no reminders', () => {
    expect(reminderScheduleOf({ reminderDays: [7, 21] })).toEqual([21, 7])
    expect(reminderScheduleOf({ reminderDays: [] })).toEqual([])
  })

  it('falls back to the default for what cannot be a schedule', () => {
    for (const bad of [[0], [366], [2.5], [3, 3], 'soon', [1, 2, 3, 4, 5, 6, 7]]) {
      expect(reminderScheduleOf({ reminderDays: bad })).toEqual([30, 14, 3])
    }
  })

  it('says itself in words', () => {
    expect(reminderScheduleText([30, 14, 3])).toBe('30, 14 and 3 days before the first contest day')
    expect(reminderScheduleText([1])).toBe('1 day before the first contest day')
    expect(reminderScheduleText([])).toBe('No reminders')
  })
})

describe('reminder kinds', () => {
  it('carry their family and day count', () => {
    expect(reminderKind('pre-event', 30)).toBe('pre-event-30')
    expect(reminderKind('draft', 3)).toBe('draft-3')
    expect(reminderKindDays('pre-event', 'pre-event-14')).toBe(14)
    expect(reminderKindDays('pre-event', 'draft-14')).toBeNull()
    expect(reminderKindDays('draft', 'draft-3')).toBe(3)
  })
})
