// Times on the board are the competition's local times (its time zone), whatever the clock of
// the screen showing them: the wall screen, the director's laptop and the log agree.

/** "14:02" in the competition's time zone. */
export function timeIn(iso: string | Date, timeZone: string, seconds = false): string {
  const at = typeof iso === 'string' ? new Date(iso) : iso
  if (Number.isNaN(at.getTime())) return ''
  try {
    return at.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', ...(seconds ? { second: '2-digit' } : {}), hour12: false, timeZone })
  }
  catch {
    // An unknown zone name (it is typed by the organiser): the screen's own clock, rather than nothing.
    return at.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', ...(seconds ? { second: '2-digit' } : {}), hour12: false })
  }
}

/** A contest day (YYYY-MM-DD, a calendar date) as "Tuesday 13 July 2027". */
export function contestDayLong(day: string): string {
  const d = new Date(`${day.slice(0, 10)}T12:00:00Z`)
  if (Number.isNaN(d.getTime())) return day
  return d.toLocaleDateString('en-GB', { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })
}
