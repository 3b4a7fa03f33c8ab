// What a pre-event reminder lists as still open on an entry, from what Gridmark holds today
// (entry, units, payment). Pure, so it is tested on its own; the check engine's findings
// replace and extend this list when they exist.
export interface ReminderEntry {
  status: string
  paymentStatus: string | null
}

export interface ReminderUnit {
  kind: string
  model: string
  serial: string
  radioId: string | null
  firmwareExpiresOn: string | null
  approvalLevel: string | null
}

export function reminderOpenItems(entry: ReminderEntry, units: ReminderUnit[], lastContestDay: string | null): string[] {
  const items: string[] = []
  if (entry.status === 'submitted') items.push('The organiser has not accepted your entry yet.')
  if (entry.paymentStatus === 'unpaid') items.push('The entry fee is not paid yet.')

  const warners = units.filter(u => u.kind === 'collision-warning')
  const recorders = units.filter(u => u.kind === 'flight-recorder')
  if (!warners.length) items.push('No collision-warning unit is registered on your entry.')
  if (!recorders.length) items.push('No flight recorder is registered on your entry.')

  for (const u of warners) {
    const name = `${u.model} (serial ${u.serial})`
    if (!u.radioId) items.push(`${name}: the radio ID is missing.`)
    if (!u.firmwareExpiresOn) {
      items.push(`${name}: the firmware expiry date is missing.`)
    }
    else if (lastContestDay && u.firmwareExpiresOn <= lastContestDay) {
      // The expiry date is the first day the unit no longer works (DESIGN.md).
      items.push(`${name}: the firmware expires on ${u.firmwareExpiresOn}, before the competition ends. Update it before you arrive — power the unit off before inserting or removing update media, and follow the manufacturer’s instructions.`)
    }
  }
  for (const u of recorders) {
    const name = `${u.model} (serial ${u.serial})`
    if (!u.approvalLevel) items.push(`${name}: the IGC approval level is missing.`)
    else if (u.approvalLevel === 'not-approved') items.push(`${name}: this flight recorder is not IGC-approved.`)
  }
  return items
}
