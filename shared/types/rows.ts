// Row types of the database tables, written by hand to match migrations/.
import type { Role } from '../constants/roles'

export interface UserRow {
  id: string
  email: string
  name: string
  password_hash: string
  is_admin: boolean
  created_at: Date
  updated_at: Date
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
