// Contest days are calendar dates in the competition's own time zone ("2027-07-12"), so they are
// formatted as UTC dates: no shift by the viewer's clock, and the server and browser agree.
const dayMonthYear = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })
const dayMonth = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', timeZone: 'UTC' })
const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', timeZone: 'UTC' })

function parse(date: string): Date | null {
  const d = new Date(`${date.slice(0, 10)}T00:00:00Z`)
  return Number.isNaN(d.getTime()) ? null : d
}

export function formatContestDates(first: string | null, last: string | null): string {
  const a = first ? parse(first) : null
  const b = last ? parse(last) : null
  if (!a && !b) return 'Dates not set yet'
  if (!a || !b) return dayMonthYear.format((a ?? b)!)
  if (a.getTime() === b.getTime()) return dayMonthYear.format(a)
  const sameYear = a.getUTCFullYear() === b.getUTCFullYear()
  const sameMonth = sameYear && a.getUTCMonth() === b.getUTCMonth()
  if (sameMonth) return `${day.format(a)}–${dayMonthYear.format(b)}`
  if (sameYear) return `${dayMonth.format(a)} – ${dayMonthYear.format(b)}`
  return `${dayMonthYear.format(a)} – ${dayMonthYear.format(b)}`
}
