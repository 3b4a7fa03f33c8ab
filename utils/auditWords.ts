import type { AuditLogItem } from '#shared/types/api-board'
import { READINESS_LABELS, type Readiness } from '#shared/constants/readiness'
import { PAYMENT_METHOD_LABELS, type PaymentMethod } from '#shared/constants/payments'
import { formatMoney } from '#shared/utils/money'
import { DOCUMENT_KIND_LABELS, type DocumentKind } from '#shared/constants/entries'
import { FILE_DELETION_REASONS, type FileDeletionReason } from '#shared/constants/files'
import { keptFor } from '#shared/utils/document-retention'

// The audit log speaks in words: each action the server records gets a short name, and each row
// a one-line description from its details. An action not listed here shows as it is stored, so a
// new kind of row is never hidden.
export const AUDIT_ACTION_WORDS: Record<string, string> = {
  'grid-check.recorded': 'Grid check recorded',
  'findings.changed': 'Findings changed',
  'director.hold': 'Held',
  'director.release': 'Released',
  'director.waiver': 'Finding waived',
  'director.waiver-withdrawn': 'Waiver withdrawn',
  'day.opened': 'Day opened',
  'day.closed': 'Day closed',
  'day.reopened': 'Day opened again',
  'entry.created': 'Entry created',
  'entry.updated': 'Entry changed',
  'entry.occupant-mass-recorded': 'Weighed mass with parachute recorded',
  'entry.submitted': 'Entry submitted',
  'entry.withdrawn': 'Entry withdrawn',
  'entry.accepted': 'Entry accepted',
  'entry.rejected': 'Entry rejected',
  'unit.added': 'Unit added',
  'unit.updated': 'Unit changed',
  'unit.deleted': 'Unit deleted',
  'document.uploaded': 'Document uploaded',
  'document.replaced': 'Document replaced',
  'document.accepted': 'Document accepted',
  'document.rejected': 'Document rejected',
  'document.file-deleted': 'Document file deleted (retention)',
  'igc-file.uploaded': 'IGC file uploaded',
  'igc-file.replaced': 'IGC file replaced',
  'igc-file.recorder-named': 'IGC file tied to its recorder',
  'payment.checkout-started': 'Card payment started',
  'payment.paid': 'Entry fee paid',
  'payment.refunded': 'Entry fee refunded',
  'payment.recorded': 'Payment recorded',
  'payment.waived': 'Entry fee waived',
  'payment.waiver-withdrawn': 'Fee waiver withdrawn',
  'payment.status-changed': 'Payment state changed',
  'tag.issued': 'Tag issued',
  'tag.reissued': 'Tag reissued',
  'tag.revoked': 'Tag revoked',
  'class.created': 'Class added',
  'class.changed': 'Class changed',
  'class.deleted': 'Class removed',
  'competition.created': 'Competition created',
  'competition.setup-changed': 'Set-up changed',
  'firmware.added': 'Firmware release added',
  'firmware.changed': 'Firmware release changed',
  'firmware.deleted': 'Firmware release removed',
  'firmware.imported': 'Firmware catalogue imported',
  'invitation.create': 'Invitation sent',
  'invitation.accept': 'Invitation accepted',
  'invitation.revoke': 'Invitation withdrawn',
  'membership.joined': 'Joined the competition',
  'membership.remove': 'Role removed',
  'reminder.queue': 'Reminder queued',
  'user.signed-up': 'Signed up',
  'demo.seeded': 'Demo data loaded',
}

// The fields a change names, in the words of the forms. A personal field's change holds no
// values (`changed: true`): it reads "Phone changed".
export const AUDIT_FIELD_WORDS: Record<string, string> = {
  classId: 'Class',
  pilotName: 'Pilot’s name',
  pilotNationality: 'Nationality',
  pilotLicenceNumber: 'Licence number',
  pilotPhone: 'Phone',
  emergencyContact: 'Emergency contact',
  copilotName: 'Co-pilot’s name',
  crewNames: 'Crew',
  gliderType: 'Glider type',
  registration: 'Registration',
  compId: 'Competition ID',
  spanM: 'Span (m)',
  mtomKg: 'MTOM (kg)',
  emptyMassKg: 'Empty mass (kg)',
  cgForwardLimitM: 'Forward CG limit (m)',
  cgAftLimitM: 'Aft CG limit (m)',
  datumDescription: 'Datum',
  motorGlider: 'Motor glider',
  pilotArmM: 'Pilot’s arm (m)',
  copilotArmM: 'Co-pilot’s arm (m)',
  ballastArmM: 'Ballast arm (m)',
  pilotMassKg: 'Pilot’s mass (kg)',
  copilotMassKg: 'Co-pilot’s mass (kg)',
}

export function auditFieldWords(field: string): string {
  return AUDIT_FIELD_WORDS[field] ?? field
}

export function auditActionWords(action: string): string {
  return AUDIT_ACTION_WORDS[action] ?? action
}

const text = (v: unknown): string | undefined => (typeof v === 'string' && v.trim() ? v : typeof v === 'number' ? String(v) : undefined)
const readinessWord = (v: unknown) => (typeof v === 'string' && v in READINESS_LABELS ? READINESS_LABELS[v as Readiness] : text(v) ?? '')
const value = (v: unknown): string => (v === null || v === undefined || v === '' ? '—' : typeof v === 'object' ? JSON.stringify(v) : String(v))

interface Change { checkId?: string, severity?: string }
const changes = (v: unknown) => (Array.isArray(v) ? (v as Change[]).map(c => `${c.checkId ?? '?'}${c.severity ? ` (${c.severity})` : ''}`) : [])

/** One line about what a row did, from its details: the reason, the day, the outcome… */
export function auditDescription(item: Pick<AuditLogItem, 'action' | 'details'>): string {
  const d = item.details ?? {}
  const day = text(d.day)
  const reason = text(d.reason)
  switch (item.action) {
    case 'director.hold':
    case 'director.release':
      return [day, reason].filter(Boolean).join(': ')
    case 'director.waiver':
    case 'director.waiver-withdrawn': {
      const scope = d.scope === 'competition' ? 'for the whole competition' : `for ${day ?? 'the day'}`
      return `${text(d.checkId) ?? 'A finding'} ${scope}${reason ? `: ${reason}` : ''}`
    }
    case 'grid-check.recorded': {
      const parts = [`${d.outcome === 'fail' ? 'Failed' : 'Passed'}`, readinessWord(d.readiness)]
      if (typeof d.massKg === 'number') parts.push(`weighed ${d.massKg} kg`)
      const blocking = Array.isArray(d.blocking) ? (d.blocking as string[]) : []
      if (blocking.length) parts.push(`blocking: ${blocking.join(', ')}`)
      return `${day ? `${day}: ` : ''}${parts.filter(Boolean).join(', ')}`
    }
    case 'findings.changed': {
      const added = changes(d.added)
      const removed = changes(d.removed)
      const parts: string[] = []
      if (added.length) parts.push(`new ${added.join(', ')}`)
      if (removed.length) parts.push(`cleared ${removed.join(', ')}`)
      const r = d.readiness as { from?: unknown, to?: unknown } | undefined
      if (r && r.from !== r.to) parts.push(`${readinessWord(r.from) || 'not on the board'} → ${readinessWord(r.to)}`)
      return `${day ? `${day}: ` : ''}${parts.join('; ')}`
    }
    case 'entry.withdrawn': {
      const by = d.by === 'office' ? ' by the office for the pilot' : d.by === 'entrant' ? ' by the entrant' : ''
      const given = reason ? ` · reason: ${reason}` : d.reasonGiven === true ? ' · with a reason, sent to the office' : ''
      return `${value(d.from)} → withdrawn${by}${given}`
    }
    case 'day.opened':
    case 'day.reopened':
      return `${day ?? ''}${text(d.kind) ? ` (${d.kind} day)` : ''}${typeof d.entries === 'number' ? `, ${d.entries} on the board` : ''}`
    case 'payment.paid':
    case 'payment.recorded':
    case 'payment.waived':
    case 'payment.refunded':
    case 'payment.waiver-withdrawn': {
      const minor = typeof d.amountMinor === 'number' ? d.amountMinor : typeof d.refundedMinor === 'number' ? d.refundedMinor : null
      const amount = minor === null ? '' : formatMoney(minor, text(d.currency) ?? 'EUR')
      const method = typeof d.method === 'string' && d.method in PAYMENT_METHOD_LABELS ? PAYMENT_METHOD_LABELS[d.method as PaymentMethod] : ''
      return [[amount, method.toLowerCase()].filter(Boolean).join(', '), text(d.paidOn), reason].filter(Boolean).join(': ')
    }
    case 'payment.status-changed': {
      const owed = typeof d.owedMinor === 'number' && d.owedMinor > 0 ? ` (${formatMoney(d.owedMinor, text(d.currency) ?? 'EUR')} owed)` : ''
      return `${value(d.from)} → ${value(d.to)}${owed}`
    }
    case 'document.file-deleted': {
      const kind = typeof d.kind === 'string' && d.kind in DOCUMENT_KIND_LABELS ? DOCUMENT_KIND_LABELS[d.kind as DocumentKind] : value(d.kind)
      const kept = FILE_DELETION_REASONS.includes(d.reason as FileDeletionReason) && typeof d.keptDays === 'number'
        ? `, kept ${keptFor(d.reason as FileDeletionReason, d.keptDays)}`
        : ''
      return `${kind}${kept}`
    }
    case 'day.closed': {
      const counts = d.readiness && typeof d.readiness === 'object' ? Object.entries(d.readiness as Record<string, number>) : []
      const tally = counts.map(([state, n]) => `${n} ${readinessWord(state).toLowerCase()}`).join(', ')
      return `${day ?? ''}${tally ? `: ${tally}` : ''}`
    }
  }
  // Anything else: the few details a person reads, in a fixed order.
  const parts: string[] = []
  if (item.action.startsWith('unit.') && text(d.model)) {
    parts.push(`${text(d.model)}${text(d.serial) ? `, serial ${d.serial}` : ''}`)
    return parts.join('')
  }
  const field = text(d.field)
  if (field && d.changed === true) parts.push(`${auditFieldWords(field)} changed`)
  else if (field) parts.push(`${auditFieldWords(field)}: ${value(d.from)} → ${value(d.to)}`)
  else if (d.from !== undefined && d.to !== undefined) parts.push(`${value(d.from)} → ${value(d.to)}`)
  for (const key of ['day', 'kind', 'role', 'compId', 'registration', 'shortCode', 'version', 'reason'] as const) {
    const v = text(d[key])
    if (!v) continue
    if (key === 'reason') parts.push(`reason: ${v}`)
    // Short codes are read out and typed in two halves, as on the tag.
    else if (key === 'shortCode') parts.push(`short code ${v.length === 8 ? `${v.slice(0, 4)}-${v.slice(4)}` : v}`)
    else parts.push(v)
  }
  return parts.join(' · ')
}
