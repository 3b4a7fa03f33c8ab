// Vocabulary of entries, units and documents, shared by client, server and the check engine.
export const ENTRY_STATUSES = ['draft', 'submitted', 'accepted', 'rejected', 'withdrawn'] as const
export type EntryStatus = (typeof ENTRY_STATUSES)[number]

/** Kept on the entry by the payment module (paid = the fee due is covered). */
export const PAYMENT_STATUSES = ['unpaid', 'paid', 'refunded'] as const
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number]

export const UNIT_KINDS = ['collision-warning', 'flight-recorder'] as const
export type UnitKind = (typeof UNIT_KINDS)[number]

export const DOCUMENT_KINDS = ['airworthiness', 'insurance', 'licence', 'medical', 'other'] as const
export type DocumentKind = (typeof DOCUMENT_KINDS)[number]

export const DOCUMENT_KIND_LABELS: Record<DocumentKind, string> = {
  airworthiness: 'Airworthiness review',
  insurance: 'Insurance',
  licence: 'Pilot licence',
  medical: 'Medical',
  other: 'Other document',
}

/**
 * IGC approval levels of flight recorders. Source: FAI Sporting Code Section 3 Annex B, 4.1.1
 * (three approval levels, as the FAI's page of approved recorders cites it) — the level names
 * are `from memory` until checked against the current edition.
 */
export const APPROVAL_LEVELS = ['all-flights', 'badges-up-to-diamonds', 'badges-up-to-gold', 'not-approved'] as const
export type ApprovalLevel = (typeof APPROVAL_LEVELS)[number]

export const APPROVAL_LEVEL_LABELS: Record<ApprovalLevel, string> = {
  'all-flights': 'All flights, including records',
  'badges-up-to-diamonds': 'Badges up to diamonds',
  'badges-up-to-gold': 'Badges up to gold',
  'not-approved': 'Not IGC-approved',
}

/** A motor glider's means of propulsion (none for a pure glider). */
export const MOTOR_GLIDER_KINDS = ['none', 'self-launching', 'sustainer', 'electric'] as const
export type MotorGliderKindValue = (typeof MOTOR_GLIDER_KINDS)[number]
export const MOTOR_GLIDER_LABELS: Record<MotorGliderKindValue, string> = {
  'none': 'No engine (pure glider)',
  'self-launching': 'Self-launching engine',
  'sustainer': 'Sustainer engine',
  'electric': 'Electric motor',
}
