// Calendar arithmetic on YYYY-MM-DD strings. Contest days are dates in the competition's
// time zone; adding days to a date is the same in every zone, so it is done in UTC and never
// through local time.
import type { IsoDate } from './types'

const ISO = /^(\d{4})-(\d{2})-(\d{2})$/

export function isIsoDate(s: unknown): s is IsoDate {
  if (typeof s !== 'string') return false
  const m = ISO.exec(s)
  if (!m) return false
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])))
  return d.toISOString().slice(0, 10) === s
}

// The checks ask for the same few dates (last contest day + margin, …) for every entry.
const memo = new Map<string, IsoDate>()

/** The date n days after (or before, n < 0) the given date. */
export function addDays(date: IsoDate, n: number): IsoDate {
  const key = `${date}|${n}`
  const hit = memo.get(key)
  if (hit) return hit
  const m = ISO.exec(date)
  if (!m) throw new RangeError(`not a date: ${date}`)
  const out = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]) + n)).toISOString().slice(0, 10)
  if (memo.size > 10_000) memo.clear()
  memo.set(key, out)
  return out
}

/** The same calendar date n years earlier or later (29 February falls back to 28). */
export function addYears(date: IsoDate, n: number): IsoDate {
  const m = ISO.exec(date)
  if (!m) throw new RangeError(`not a date: ${date}`)
  const y = Number(m[1]) + n
  const month = Number(m[2])
  const day = Math.min(Number(m[3]), daysInMonth(y, month))
  return `${String(y).padStart(4, '0')}-${m[2]}-${String(day).padStart(2, '0')}`
}

/** Whole days from a to b (positive when b is later). */
export function daysBetween(a: IsoDate, b: IsoDate): number {
  return Math.round((Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / 86_400_000)
}

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate()
}

const zoneFormats = new Map<string, Intl.DateTimeFormat>()

/** The calendar date an instant falls on in a time zone: which contest day "now" is. */
export function dateInZone(instant: Date | number, timeZone: string): IsoDate {
  let f = zoneFormats.get(timeZone)
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' })
    zoneFormats.set(timeZone, f)
  }
  const parts = Object.fromEntries(f.formatToParts(instant).map(p => [p.type, p.value]))
  return `${parts.year}-${parts.month}-${parts.day}`
}
