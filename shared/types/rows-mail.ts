// Row types of the mail area's tables, written by hand to match migrations/.

export interface InvitationRow {
  id: string
  competition_id: string
  email: string
  role: 'organiser' | 'scrutineer' | 'director'
  token_hash: string
  expires_at: Date
  invited_by: string | null
  accepted_at: Date | null
  accepted_by: string | null
  revoked_at: Date | null
  revoked_by: string | null
  created_at: Date
}

export interface MailReminderRow {
  entry_id: string
  kind: string
  outbox_id: string | null
  created_at: Date
}
