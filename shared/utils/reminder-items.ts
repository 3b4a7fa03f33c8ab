// What a pre-event reminder lists as still open on an entry: whether the organiser has
// accepted it, then the check engine's findings (blocking first), each with its fix hint and,
// where the fix touches hardware, its caution; a finding's line names its check, so the e-mail
// links it to its rule. Pure, so it is tested on its own.
import type { Finding } from '../engine/types'

export interface ReminderEntry {
  status: string
}

export interface ReminderItem {
  text: string
  /** The check of a finding's line. */
  checkId?: string
}

export function reminderOpenItems(entry: ReminderEntry, findings: readonly Finding[]): ReminderItem[] {
  const items: ReminderItem[] = []
  if (entry.status === 'submitted') items.push({ text: 'The organiser has not accepted your entry yet.' })
  const cautions = new Set<string>()
  for (const f of findings) {
    const label = f.severity === 'blocking' ? 'Blocking' : 'Advisory'
    let text = `${label}: ${f.reason} ${f.fixHint}`
    if (f.caution) {
      // The same caution in full once; later findings point back to it.
      text += cautions.has(f.caution) ? ' Caution: as above.' : ` Caution: ${f.caution}`
      cautions.add(f.caution)
    }
    items.push({ text, checkId: f.checkId })
  }
  return items
}
