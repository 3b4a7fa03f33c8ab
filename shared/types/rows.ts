// Row types of the database tables, written by hand to match migrations/; each area's newer
// tables in rows-<area>.ts, re-exported here.
import type { Role } from '../constants/roles'
import type { PaymentStatus } from '../constants/entries'
export type * from './rows-mail'
export type * from './rows-payments'
export type * from './rows-files'
export type * from './rows-entries'
export type * from './rows-setup'
export type * from './rows-document-views'

export interface UserRow {
  id: string
  email: string
  name: string
  password_hash: string
  is_admin: boolean
  /** When the address was confirmed through a link sent to it; null until then. */
  email_verified_at: Date | null
  created_at: Date
  updated_at: Date
  /** Set when the person deleted their account: the row stays, anonymised. */
  deleted_at?: Date | null
}

export interface UserSessionRow {
  id: string
  user_id: string
  created_at: Date
  last_seen_at: Date
  revoked_at: Date | null
  user_agent: string | null
  ip_address: string | null
}

export interface CompetitionRow {
  id: string
  slug: string
  name: string
  airfield_name: string
  airfield_icao: string | null
  time_zone: string
  first_contest_day: string | null
  last_contest_day: string | null
  currency: string
  settings: Record<string, unknown>
  created_by: string | null
  created_at: Date
  updated_at: Date
}

export interface ClassRow {
  id: string
  competition_id: string
  name: string
  code: string
  /** numeric columns arrive from pg as strings */
  max_span_m: string | null
  max_mtom_kg: string | null
  water_ballast: boolean
  entry_fee_minor: number
  sort_order: number
  created_at: Date
}

export interface MembershipRow {
  id: string
  user_id: string
  competition_id: string
  role: Role
  granted_by: string | null
  created_at: Date
}

export interface AuditRow {
  id: string
  at: Date
  actor_user_id: string | null
  competition_id: string | null
  action: string
  subject_type: string
  subject_id: string | null
  details: Record<string, unknown>
}

export interface EntryRow {
  id: string
  competition_id: string
  class_id: string
  entrant_user_id: string
  status: 'draft' | 'submitted' | 'accepted' | 'rejected' | 'withdrawn'
  decision_reason: string | null
  pilot_name: string
  pilot_nationality: string | null
  pilot_licence_number: string | null
  pilot_phone: string | null
  emergency_contact: string | null
  copilot_name: string | null
  crew_names: string[]
  glider_type: string
  registration: string
  comp_id: string
  /** numeric columns arrive from pg as strings */
  span_m: string | null
  mtom_kg: string | null
  empty_mass_kg: string | null
  cg_forward_limit_m: string | null
  cg_aft_limit_m: string | null
  datum_description: string | null
  motor_glider: string
  changed_after_acceptance_at: Date | null
  pilot_mass_kg: string | null
  copilot_mass_kg: string | null
  pilot_arm_m: string | null
  copilot_arm_m: string | null
  ballast_arm_m: string | null
  submitted_at: Date | null
  decided_at: Date | null
  decided_by: string | null
  withdrawn_at: Date | null
  payment_status: PaymentStatus
  /** Money received, net of refunds (waivers not included). */
  paid_minor: number
  /** Waived by the office, net of waivers withdrawn. */
  waived_minor: number
  /** YYYY-MM-DD: the day of the entry's first payment or waiver. */
  first_paid_on: string | null
  /** When the pilot confirmed the competition's privacy notice, entering; null for older entries. */
  privacy_confirmed_at: Date | null
  /** Which notice they confirmed: its digest (shared/utils/privacy-notice.ts). */
  privacy_notice_version: string | null
  created_at: Date
  updated_at: Date
}

export interface UnitRow {
  id: string
  entry_id: string
  competition_id: string
  kind: 'collision-warning' | 'flight-recorder'
  model: string
  serial: string
  firmware_version: string | null
  radio_id: string | null
  /** date columns read as YYYY-MM-DD text (the type parser in knexfile.ts) */
  firmware_expires_on: string | null
  firmware_updated_on: string | null
  obstacle_db_version: string | null
  obstacle_db_expires_on: string | null
  approval_level: string | null
  igc_recorder_id: string | null
  created_at: Date
  updated_at: Date
}

export interface FirmwareReleaseRow {
  id: string
  competition_id: string
  unit_family: string
  version: string
  expires_on: string
  created_at: Date
}

export interface MailOutboxRow {
  id: string
  to_address: string
  subject: string
  text_body: string
  html_body: string | null
  template: string
  competition_id: string | null
  entry_id: string | null
  /** The body carries a one-time link: emptied once sent. */
  secret_body: boolean
  attempts: number
  next_attempt_at: Date
  sent_at: Date | null
  last_error: string | null
  created_at: Date
}
