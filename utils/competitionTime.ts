// Times on the board, the director's desk, the contest days and the audit log are read on the
// airfield, so they are shown in the competition's time zone whatever the viewer's device says
// (the wall screen, the director's laptop and the log agree); server and browser format alike
// (explicit locale and zone), so the page hydrates without a change.

// One formatter per set of options, made once: toLocaleTimeString and its kin build a new one
// on every call, which a board of forty tiles paid for on every render.
const formatters = new Map<string, Intl.DateTimeFormat>()

/** The en-GB formatter for `options` (throws as Intl does for an unknown time zone). */
function formatter(options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = JSON.stringify(options)
  let f = formatters.get(key)
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', options)
    formatters.set(key, f)
  }
  return f
}

/** "2 Dec, 14:05" — an instant in the competition's time zone. */
export function atInZone(iso: string, timeZone: string): string {
  return formatter({ day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZone }).format(new Date(iso))
}

/** "14:05" on the phone's own clock (its zone): when this phone synced, or made a check. */
export function clockOnPhone(iso: string): string {
  return formatter({ hour: '2-digit', minute: '2-digit' }).format(new Date(iso))
}

/** "14:05" — the clock time only, for an instant on the day being shown. */
export function clockInZone(iso: string, timeZone: string): string {
  return timeIn(iso, timeZone)
}

/** "14:02" (or "14:02:09") in the competition's time zone; the screen's own zone if the name is unknown. */
export function timeIn(iso: string | Date, timeZone: string, seconds = false): string {
  const at = typeof iso === 'string' ? new Date(iso) : iso
  if (Number.isNaN(at.getTime())) return ''
  const format: Intl.DateTimeFormatOptions = { hour: '2-digit', minute: '2-digit', ...(seconds ? { second: '2-digit' } : {}), hourCycle: 'h23' }
  try {
    return formatter({ ...format, timeZone }).format(at)
  }
  catch {
    // The zone is typed by the organiser: rather the screen's clock than nothing.
    return formatter(format).format(at)
  }
}

/** "Wednesday 2 December 2026" — a contest day (a calendar date, so read as UTC: no shift). */
export function dayInWords(day: string): string {
  const d = new Date(`${day.slice(0, 10)}T12:00:00Z`)
  if (Number.isNaN(d.getTime())) return day
  return formatter({ weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }).format(d)
}

/** "Wed 2 Dec" — a contest day, short. */
export function dayShort(day: string): string {
  const d = new Date(`${day.slice(0, 10)}T12:00:00Z`)
  if (Number.isNaN(d.getTime())) return day
  return formatter({ weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' }).format(d)
}
