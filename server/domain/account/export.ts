// "Take my data out": everything Gridmark holds about one person, as one JSON document read in
// one repeatable-read transaction (a consistent picture). Rows keep their stored column names;
// what is not theirs to read stays out: the password hash, where files are stored, other
// people's data (an entry's messages are theirs only when they wrote them).
import type { Finding } from '#shared/engine'
import type { AccountExport } from '#shared/types/api-account'
import { useDb } from '#server/utils/db'
import { findingsByEntry } from '#domain/findings/findings'

/** At most this many audit rows, newest first: a busy organiser's years stay a sane download. */
export const EXPORT_AUDIT_LIMIT = 20000

const DOCUMENT_COLUMNS = ['id', 'entry_id', 'competition_id', 'kind', 'original_filename', 'media_type', 'size_bytes', 'sha256',
  'expires_on', 'status', 'review_reason', 'reviewed_at', 'uploaded_at', 'superseded', 'file_deleted_at', 'file_deleted_reason',
  'file_kept_days'] as const
const IGC_COLUMNS = ['id', 'entry_id', 'competition_id', 'unit_id', 'original_filename', 'sha256', 'size_bytes', 'flight_date',
  'pilot', 'copilot', 'glider_type', 'glider_id', 'declared_comp_id', 'declared_class', 'recorder_type', 'firmware_version',
  'recorder_id', 'extensions', 'has_g_record', 'uploaded_at', 'superseded'] as const

function byEntry<T extends { entry_id: string }>(rows: T[]): Map<string, T[]> {
  const out = new Map<string, T[]>()
  for (const r of rows) out.set(r.entry_id, [...(out.get(r.entry_id) ?? []), r])
  return out
}

/** The person's data as one document (see AccountExport). */
export async function exportAccount(userId: string, now = new Date()): Promise<AccountExport> {
  return useDb().transaction(async (trx) => {
    const user = await trx('users').where({ id: userId }).first('id', 'email', 'name', 'is_admin', 'created_at', 'updated_at')
    const memberships = await trx('memberships as m').join('competitions as c', 'c.id', 'm.competition_id')
      .where('m.user_id', userId).orderBy(['c.name', 'm.role'])
      .select('m.competition_id', 'c.name as competition_name', 'm.role', 'm.created_at')
    const entries = await trx('entries as e')
      .join('competitions as c', 'c.id', 'e.competition_id')
      .join('classes as k', 'k.id', 'e.class_id')
      .where('e.entrant_user_id', userId).orderBy('e.created_at')
      .select('e.*', 'c.name as competition_name', 'k.name as class_name')
    const entryIds = entries.map(e => e.id as string)

    const [units, documents, igcFiles, payments, refunds, messages, sessions, auditRows, openings, opened] = await Promise.all([
      trx('units').whereIn('entry_id', entryIds).orderBy('created_at'),
      trx('documents').whereIn('entry_id', entryIds).orderBy('uploaded_at').select(...DOCUMENT_COLUMNS),
      trx('igc_files').whereIn('entry_id', entryIds).orderBy('uploaded_at').select(...IGC_COLUMNS),
      trx('payments').whereIn('entry_id', entryIds).orderBy('created_at')
        .select('id', 'entry_id', 'method', 'amount_minor', 'currency', 'status', 'refunded_minor', 'paid_at', 'paid_on', 'reference', 'reason', 'created_at'),
      trx('payment_refunds').whereIn('entry_id', entryIds).orderBy('created_at')
        .select('id', 'entry_id', 'payment_id', 'amount_minor', 'reason', 'status', 'created_at', 'completed_at'),
      trx('entry_messages').where({ author_id: userId }).orderBy('created_at')
        .select('id', 'competition_id', 'entry_id', 'from_office', 'body', 'created_at'),
      trx('user_sessions').where({ user_id: userId }).orderBy('created_at')
        .select('created_at', 'last_seen_at', 'revoked_at', 'user_agent', 'ip_address'),
      trx('audit_log')
        .where(q => q.where('actor_user_id', userId)
          .orWhere(s => s.where({ subject_type: 'user', subject_id: userId }))
          .orWhere(s => s.where('subject_type', 'entry').whereIn('subject_id', entryIds)))
        .orderBy('id', 'desc').limit(EXPORT_AUDIT_LIMIT)
        .select('id', 'at', 'actor_user_id', 'competition_id', 'action', 'subject_type', 'subject_id', 'details'),
      // Who opened this person's medical and licence files (not from where: that is the viewer's).
      trx('document_views as v').join('users as u', 'u.id', 'v.viewer_user_id').whereIn('v.entry_id', entryIds).orderBy('v.viewed_at')
        .select('v.entry_id', 'v.document_id', 'v.document_kind', 'u.name as viewer_name', 'v.viewer_role', 'v.viewed_at'),
      // The files this person opened as staff, with their own address.
      trx('document_views').where({ viewer_user_id: userId }).orderBy('viewed_at')
        .select('competition_id', 'entry_id', 'document_id', 'document_kind', 'viewer_role', 'client_address', 'viewed_at'),
    ])

    const competitions = [...new Set(entries.map(e => e.competition_id as string))]
    const findings = new Map<string, Finding[]>()
    for (const competitionId of competitions) {
      const mine = entries.filter(e => e.competition_id === competitionId).map(e => e.id as string)
      for (const [id, list] of await findingsByEntry(competitionId, mine, trx)) findings.set(id, list)
    }

    const unitsOf = byEntry(units), documentsOf = byEntry(documents), igcOf = byEntry(igcFiles)
    const paymentsOf = byEntry(payments), refundsOf = byEntry(refunds), openingsOf = byEntry(openings)
    return {
      format: 'gridmark-account-export',
      version: 1,
      exportedAt: now.toISOString(),
      account: user,
      memberships,
      entries: entries.map(e => ({
        ...e,
        units: unitsOf.get(e.id) ?? [],
        documents: documentsOf.get(e.id) ?? [],
        igcFiles: igcOf.get(e.id) ?? [],
        payments: (paymentsOf.get(e.id) ?? []).map(p => ({ ...p, refunds: (refundsOf.get(e.id) ?? []).filter(r => r.payment_id === p.id) })),
        findings: findings.get(e.id) ?? [],
        documentOpenings: openingsOf.get(e.id) ?? [],
      })),
      documentsOpened: opened,
      messagesWritten: messages,
      sessions,
      auditLog: auditRows,
      auditLogLimit: EXPORT_AUDIT_LIMIT,
    } as AccountExport
  }, { isolationLevel: 'repeatable read', readOnly: true })
}
