// The account page's answers.
import type { PublicUser } from './api'

export interface AccountNameResponse {
  user: PublicUser
}

export interface AccountPasswordResponse {
  /** How many other sessions (devices) were signed out. */
  signedOut: number
}

export interface AccountDeleteResponse {
  ok: true
  /** Entries of competitions not yet over that were withdrawn. */
  withdrawn: number
  /** Entries of past competitions kept under "Deleted account". */
  kept: number
}

/**
 * "Take my data out": rows as stored (snake_case columns), grouped by what they belong to.
 * Never the password hash, where files are stored, nor other people's data.
 */
export interface AccountExport {
  format: 'gridmark-account-export'
  version: 1
  exportedAt: string
  account: { id: string, email: string, name: string, is_admin: boolean, created_at: string, updated_at: string }
  memberships: { competition_id: string, competition_name: string, role: string, created_at: string }[]
  entries: (Record<string, unknown> & {
    id: string
    competition_id: string
    competition_name: string
    class_name: string
    units: Record<string, unknown>[]
    documents: Record<string, unknown>[]
    igcFiles: Record<string, unknown>[]
    payments: (Record<string, unknown> & { refunds: Record<string, unknown>[] })[]
    findings: Record<string, unknown>[]
    /** Who opened the entry's medical and licence files: name, role, kind, when. */
    documentOpenings: { entry_id: string, document_id: string | null, document_kind: string, viewer_name: string, viewer_role: string, viewed_at: string }[]
  })[]
  /** The medical and licence files this person opened as staff, with their address then. */
  documentsOpened: { competition_id: string, entry_id: string, document_id: string | null, document_kind: string, viewer_role: string, client_address: string, viewed_at: string }[]
  messagesWritten: { id: string, competition_id: string, entry_id: string, from_office: boolean, body: string, created_at: string }[]
  sessions: { created_at: string, last_seen_at: string, revoked_at: string | null, user_agent: string | null, ip_address: string | null }[]
  auditLog: { id: string, at: string, actor_user_id: string | null, competition_id: string | null, action: string, subject_type: string, subject_id: string | null, details: Record<string, unknown> }[]
  /** At most this many audit rows are included, newest first. */
  auditLogLimit: number
}
