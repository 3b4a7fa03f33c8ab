// Documents' stored files on the retention schedule; the rows stay (kind, validity dates,
// review outcome, sha256) with when and why the file went, and lose the name the file was
// uploaded under (it often carries the pilot's name):
// - medical and licence files of a competition, current and replaced, once its
//   medicalRetentionDays have passed after its last contest day: due from 00:00 in the
//   competition's time zone on day last + N + 1 (#shared/utils/document-retention);
// - a replaced copy of any kind 30 days (an instant, 30 × 24 h) after a newer copy in its line
//   of replacements was accepted (that copy's reviewed_at); a newer copy still pending or
//   rejected starts no clock, a later one that is accepted does.
// Where both rules apply in one run, the medical one is named, as it runs first.
// Each batch is marked in one transaction: its rows locked FOR UPDATE SKIP LOCKED (two runs at
// once take different rows and never count one twice; a row another run has marked no longer
// matches), storage_key cleared, one audit row per file (ids, kind, reason; no personal text).
// The file is removed only after that commits. A crash in between leaves a file no row points
// at, an orphan for the maintenance command, never a row pointing at a vanished file.
// A deleted file changes nothing the checks read (kind, validity and status stay), so the
// board is not refreshed.
import type { Knex } from 'knex'
import type { DocumentKind } from '#shared/constants/entries'
import type { FileDeletionReason } from '#shared/constants/files'
import type { RetentionRunResult } from '#shared/types/files'
import { MEDICAL_RETENTION_KINDS, SUPERSEDED_RETENTION_DAYS, medicalFilesDue, supersededAcceptedBy } from '#shared/utils/document-retention'
import { rulesOf } from '#shared/utils/rules'
import { audit } from '#domain/audit/audit'
import { useDb } from '#server/utils/db'
import { removeFile } from './storage'

/** Rows marked per transaction: short locks, and a crash loses little work. */
const BATCH = 200

interface DueFile {
  id: string
  competition_id: string
  entry_id: string
  kind: DocumentKind
  storage_key: string
}

/** Runs the job as of `at` (the admin route passes a chosen instant; the timer, the clock). */
export async function runRetention(at: Date = new Date()): Promise<RetentionRunResult> {
  const db = useDb()
  let medicalDeleted = 0
  const competitions: { id: string, time_zone: string, last_contest_day: string, settings: unknown }[] = await db('competitions as c')
    .whereNotNull('c.last_contest_day')
    .whereExists(q => q.from('documents as d').whereRaw('d.competition_id = c.id')
      .whereIn('d.kind', MEDICAL_RETENTION_KINDS).whereNull('d.file_deleted_at'))
    .orderBy('c.id')
    .select('c.id', 'c.time_zone', 'c.last_contest_day', 'c.settings')
  for (const c of competitions) {
    const days = rulesOf(c.settings).medicalRetentionDays
    if (!medicalFilesDue(at, c.last_contest_day, days, c.time_zone)) continue
    medicalDeleted += await deleteFiles('retention-medical', days, trx => trx('documents as d')
      .where('d.competition_id', c.id).whereIn('d.kind', MEDICAL_RETENTION_KINDS))
  }

  const acceptedBy = supersededAcceptedBy(at).toISOString()
  const supersededDeleted = await deleteFiles('retention-superseded', SUPERSEDED_RETENTION_DAYS, trx => trx('documents as d')
    .where('d.superseded', true)
    // Walks the line of replacements from d's own (replaced_by) to the current copy.
    .whereRaw(`exists (
      with recursive line as (
        select r.id, r.replaced_by, r.status, r.reviewed_at from documents r where r.id = d.replaced_by
        union all
        select r.id, r.replaced_by, r.status, r.reviewed_at from documents r join line on r.id = line.replaced_by
      )
      select 1 from line where line.status = 'accepted' and line.reviewed_at <= ?::timestamptz
    )`, [acceptedBy]))

  return { medicalDeleted, supersededDeleted }
}

/** Marks, audits and then removes every file `due` selects that is still there, in batches. */
async function deleteFiles(reason: FileDeletionReason, keptDays: number, due: (trx: Knex.Transaction) => Knex.QueryBuilder): Promise<number> {
  let deleted = 0
  for (;;) {
    const marked = await useDb().transaction(async (trx) => {
      const rows: DueFile[] = await due(trx)
        .whereNull('d.file_deleted_at')
        .orderBy('d.id')
        .limit(BATCH)
        .forUpdate()
        .skipLocked()
        .select('d.id', 'd.competition_id', 'd.entry_id', 'd.kind', 'd.storage_key')
      if (!rows.length) return rows
      await trx('documents').whereIn('id', rows.map(r => r.id)).update({
        storage_key: null,
        file_key_id: null,
        original_filename: '',
        file_deleted_at: trx.fn.now(),
        file_deleted_reason: reason,
        file_kept_days: keptDays,
      })
      // The record that someone opened the file stays (who, when); where from goes with the file.
      await trx('document_views').whereIn('document_id', rows.map(r => r.id)).update({ client_address: '' })
      await audit(trx, rows.map(r => ({
        actorUserId: null,
        competitionId: r.competition_id,
        action: 'document.file-deleted',
        subjectType: 'document',
        subjectId: r.id,
        details: { entryId: r.entry_id, kind: r.kind, reason, keptDays },
      })))
      return rows
    })
    for (const r of marked) {
      // Already marked: a file that cannot be removed now is an orphan the maintenance command finds.
      await removeFile(r.storage_key).catch(error =>
        console.error('[gridmark] retention: could not remove a deleted document’s file', r.id, (error as Error).message))
    }
    deleted += marked.length
    if (marked.length < BATCH) return deleted
  }
}
