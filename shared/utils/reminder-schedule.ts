// The pre-event reminder schedule: the days before the first contest day on which entrants are
// reminded (the organiser's set-up, stored as competitions.settings.reminderDays), and which
// reminder is due on a given day. Pure, so the reminder job and the unit tests read the same.
import { daysBetween } from '../engine/dates'
import type { IsoDate } from '../engine/types'

/** The schedule of a competition that has not set one: 30, 14 and 3 days before. */
export const DEFAULT_REMINDER_DAYS: readonly number[] = [30, 14, 3]
export const MAX_REMINDER_DAYS = 6
export const MAX_REMINDER_DAYS_BEFORE = 365

/** Two families of reminders: to entries with open findings, and to drafts ("finish your entry"). */
export type ReminderFamily = 'pre-event' | 'draft'

/** The mail_reminders kind of one reminder: its family and day count, e.g. `pre-event-30`. */
export function reminderKind(family: ReminderFamily, daysBefore: number): string {
  return `${family}-${daysBefore}`
}

/** The day count of a kind of the family (`pre-event-14` → 14), or null for another family's. */
export function reminderKindDays(family: ReminderFamily, kind: string): number | null {
  const m = new RegExp(`^${family}-(\\d{1,3})$`).exec(kind)
  return m ? Number(m[1]) : null
}

function validDays(v: unknown): v is number[] {
  return Array.isArray(v) && v.length <= MAX_REMINDER_DAYS && new Set(v).size === v.length
    && v.every(n => Number.isInteger(n) && n >= 1 && n <= MAX_REMINDER_DAYS_BEFORE)
}

/**
 * The schedule a competition stored, largest first (an empty list: no reminders); the default
 * when it never set one or what is stored cannot be read.
 */
export function reminderScheduleOf(settings: unknown): number[] {
  const stored = (settings && typeof settings === 'object') ? (settings as { reminderDays?: unknown }).reminderDays : undefined
  const days = validDays(stored) ? stored : DEFAULT_REMINDER_DAYS
  return [...days].sort((a, b) => b - a)
}

/**
 * The reminder of the schedule due on `today` (the competition's own calendar day): the latest
 * one whose day has come, while the competition has not started; null when none is.
 *
 * Only the latest: if the job did not run on a reminder's day (the server was down), the next
 * run sends the latest reminder due, never a burst of every one it missed. And never an earlier
 * reminder after a later one (`sentDays`: the day counts this entry already got in the family),
 * e.g. when the organiser adds a longer lead time to the schedule late.
 */
export function dueReminder(schedule: readonly number[], firstContestDay: IsoDate, today: IsoDate, sentDays: readonly number[] = []): number | null {
  const left = daysBetween(today, firstContestDay)
  if (left <= 0) return null
  const due = schedule.filter(n => n >= left)
  if (!due.length) return null
  const latest = Math.min(...due)
  return sentDays.some(s => s <= latest) ? null : latest
}

/** The schedule in words, for the set-up and the rulebook: "30, 14 and 3 days before". */
export function reminderScheduleText(schedule: readonly number[]): string {
  if (!schedule.length) return 'No reminders'
  const sorted = [...schedule].sort((a, b) => b - a)
  const list = sorted.length === 1 ? String(sorted[0]) : `${sorted.slice(0, -1).join(', ')} and ${sorted.at(-1)}`
  return `${list} ${sorted.length === 1 && sorted[0] === 1 ? 'day' : 'days'} before the first contest day`
}
