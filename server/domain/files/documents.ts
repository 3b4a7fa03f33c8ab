// Documents of an entry: upload (file first, then rows; see storage.ts), the list with
// history, the scrutineers' review queue and their decision. Routes call these; the entry
// or competition access is decided before, by requireEntryAccess / requireRole.
import type { Knex } from 'knex'
import { fileTypeFromBuffer } from 'file-type'
import type { DocumentKind } from '#shared/constants/entries'
import { DOCUMENT_KIND_LABELS } from '#shared/constants/entries'
import { DOCUMENT_MEDIA_TYPES, type DocumentMediaType } from '#shared/constants/files'
import { MESSAGES } from '#shared/constants/messages'
import type { DocumentRow } from '#shared/types/rows'
import type { DocumentListResponse, DocumentQueueResponse, DocumentView, QueueDocumentView } from '#shared/types/files'
import type { ReviewBody } from '#shared/schemas/files'
import { decideDocumentFile, type DocumentReader } from '#shared/utils/document-access'
import { fileDeletedNote } from '#shared/utils/document-retention'
import { audit } from '#domain/audit/audit'
import { dossierChanged, noteChangeAfterAcceptance } from '#domain/board/dossier-changed'
import { enqueueMail } from '#domain/mail/outbox'
import { siteUrl } from '#server/utils/site-url'
import { documentRejectedMail } from '#domain/mail/templates'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { iso } from '#domain/read-model/values'
import { newStorageKey, storeThenCommit, type ReceivedFile } from './storage'

type DocumentSelect = DocumentRow & {
  expires_on_text: string
  uploaded_by_name: string
  reviewed_by_name: string | null
  /** The day the file was deleted, in the competition's time zone. */
  file_deleted_on: string | null
}

function selectDocuments(db: Knex) {
  return db('documents as d')
    .join('competitions as c', 'c.id', 'd.competition_id')
    .leftJoin('users as up', 'up.id', 'd.uploaded_by')
    .leftJoin('users as rv', 'rv.id', 'd.reviewed_by')
    .select('d.*', 'd.expires_on as expires_on_text', 'up.name as uploaded_by_name', 'rv.name as reviewed_by_name',
      db.raw('(d.file_deleted_at at time zone c.time_zone)::date as file_deleted_on'))
}

function fileDeletedOf(r: DocumentSelect): DocumentView['fileDeleted'] {
  if (!r.file_deleted_reason || !r.file_deleted_on) return null
  const keptDays = r.file_kept_days ?? 0
  return { on: r.file_deleted_on, reason: r.file_deleted_reason, keptDays, note: fileDeletedNote(r.file_deleted_reason, r.file_deleted_on, keptDays) }
}

function toView(r: DocumentSelect): DocumentView {
  return {
    id: r.id,
    entryId: r.entry_id,
    kind: r.kind,
    originalFilename: r.original_filename,
    mediaType: r.media_type,
    sizeBytes: r.size_bytes,
    sha256: r.sha256,
    expiresOn: r.expires_on_text,
    status: r.status,
    reviewReason: r.review_reason,
    reviewedAt: iso(r.reviewed_at),
    reviewedByName: r.reviewed_by_name,
    uploadedAt: iso(r.uploaded_at),
    uploadedByName: r.uploaded_by_name ?? '',
    superseded: r.superseded,
    replacedBy: r.replaced_by,
    fileDeleted: fileDeletedOf(r),
  }
}

/** The media type from the file's first bytes (a few KB suffice), or null when it is none we accept. */
export async function detectDocumentType(head: Uint8Array): Promise<DocumentMediaType | null> {
  const found = await fileTypeFromBuffer(head)
  return found && (DOCUMENT_MEDIA_TYPES as readonly string[]).includes(found.mime) ? found.mime as DocumentMediaType : null
}

/**
 * A file's name often carries the pilot's name: it is told only to a reader who may open the
 * file (need to know); the others read the kind, validity and review outcome.
 */
function forReader<T extends DocumentView>(view: T, reader: DocumentReader): T {
  return decideDocumentFile(view.kind, reader).allowed ? view : { ...view, originalFilename: '' }
}

export async function listDocuments(entryId: string, reader: DocumentReader): Promise<DocumentListResponse> {
  const rows = await selectDocuments(useDb()).where('d.entry_id', entryId).orderBy('d.uploaded_at', 'desc').orderBy('d.id') as DocumentSelect[]
  const views = rows.map(r => forReader(toView(r), reader))
  const order = Object.keys(DOCUMENT_KIND_LABELS)
  return {
    current: views.filter(v => !v.superseded).sort((a, b) => order.indexOf(a.kind) - order.indexOf(b.kind)),
    history: views.filter(v => v.superseded),
  }
}

export async function findEntryDocument(entryId: string, documentId: string): Promise<DocumentRow | undefined> {
  return useDb()<DocumentRow>('documents').where({ id: documentId, entry_id: entryId }).first()
}

export async function createDocument(input: {
  competitionId: string
  entryId: string
  actorUserId: string
  kind: DocumentKind
  expiresOn: string
  filename: string
  mediaType: DocumentMediaType
  file: ReceivedFile
}): Promise<DocumentView> {
  const key = newStorageKey('documents', input.entryId)
  const { sha256, size } = input.file
  const id = await storeThenCommit(key, input.file.path, fileKeyId => useDb().transaction(async (trx) => {
    // Supersede the current one of this kind first: one current document per kind (index).
    const previous = await trx('documents')
      .where({ entry_id: input.entryId, kind: input.kind, superseded: false })
      .update({ superseded: true })
      .returning('id') as { id: string }[]
    const [row] = await trx('documents').insert({
      entry_id: input.entryId,
      competition_id: input.competitionId,
      kind: input.kind,
      original_filename: input.filename,
      media_type: input.mediaType,
      size_bytes: size,
      sha256,
      storage_key: key,
      file_key_id: fileKeyId,
      expires_on: input.expiresOn,
      uploaded_by: input.actorUserId,
    }).returning('id') as { id: string }[]
    if (previous.length) {
      await trx('documents').whereIn('id', previous.map(p => p.id)).update({ replaced_by: row!.id })
    }
    await audit(trx, {
      actorUserId: input.actorUserId,
      competitionId: input.competitionId,
      action: previous.length ? 'document.replaced' : 'document.uploaded',
      subjectType: 'document',
      subjectId: row!.id,
      details: { entryId: input.entryId, kind: input.kind, sha256, sizeBytes: size, mediaType: input.mediaType, replaces: previous.map(p => p.id) },
    })
    await noteChangeAfterAcceptance(trx, [input.entryId])
    await dossierChanged(trx, input.competitionId, [input.entryId], input.actorUserId)
    return row!.id
  }))
  const created = await selectDocuments(useDb()).where('d.id', id).first() as DocumentSelect
  return toView(created)
}

export async function documentQueue(competitionId: string, reader: DocumentReader): Promise<DocumentQueueResponse> {
  const rows = await selectDocuments(useDb())
    .join('entries as e', 'e.id', 'd.entry_id')
    .select('e.comp_id', 'e.pilot_name', 'e.glider_type', 'e.registration')
    .where({ 'd.competition_id': competitionId, 'd.status': 'pending', 'd.superseded': false })
    .orderBy('d.uploaded_at', 'asc')
    .orderBy('d.id') as (DocumentSelect & { comp_id: string, pilot_name: string, glider_type: string, registration: string })[]
  return {
    documents: rows.map((r): QueueDocumentView => ({
      ...forReader(toView(r), reader),
      compId: r.comp_id,
      pilotName: r.pilot_name,
      gliderType: r.glider_type,
      registration: r.registration,
    })),
  }
}

/** Accepts or rejects a current, pending document; a rejection e-mails the entrant. */
export async function reviewDocument(input: {
  competitionId: string
  competitionName: string
  documentId: string
  actorUserId: string
  /** The reviewer as need to know sees them: nobody reviews a file they may not open. */
  reader: DocumentReader
  body: ReviewBody
}): Promise<DocumentView> {
  await useDb().transaction(async (trx) => {
    const doc = await trx<DocumentRow>('documents')
      .where({ id: input.documentId, competition_id: input.competitionId })
      .forUpdate()
      .first()
    if (!doc) throw httpError(404, MESSAGES.queueDocumentNotFound)
    if (!decideDocumentFile(doc.kind, input.reader).allowed) throw httpError(403, MESSAGES.personalDocumentReviewNeedToKnow)
    if (doc.status !== 'pending' || doc.superseded) throw httpError(409, MESSAGES.alreadyReviewed)
    const accepted = input.body.decision === 'accept'
    const reason = input.body.decision === 'reject' ? input.body.reason : null
    await trx('documents').where({ id: doc.id }).update({
      status: accepted ? 'accepted' : 'rejected',
      review_reason: reason,
      reviewed_by: input.actorUserId,
      reviewed_at: trx.fn.now(),
    })
    await audit(trx, {
      actorUserId: input.actorUserId,
      competitionId: input.competitionId,
      action: accepted ? 'document.accepted' : 'document.rejected',
      subjectType: 'document',
      subjectId: doc.id,
      details: { entryId: doc.entry_id, kind: doc.kind, ...(reason ? { reason } : {}) },
    })
    if (!accepted) {
      const entrant = await trx('entries as e').join('users as u', 'u.id', 'e.entrant_user_id')
        .where('e.id', doc.entry_id).first('u.email', 'u.name', 'e.comp_id', 'e.pilot_name') as { email: string, name: string, comp_id: string }
      const label = DOCUMENT_KIND_LABELS[doc.kind]
      const mail = documentRejectedMail({
        entrantName: entrant.name,
        compId: entrant.comp_id,
        competitionName: input.competitionName,
        kindLabel: label,
        filename: doc.original_filename,
        reason: reason ?? '',
        entryUrl: `${siteUrl()}/competitions/${input.competitionId}/entries/${doc.entry_id}`,
      })
      await enqueueMail(trx, {
        to: entrant.email,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
        template: 'document-rejected',
        competitionId: input.competitionId,
        entryId: doc.entry_id,
      })
    }
    await dossierChanged(trx, input.competitionId, [doc.entry_id], input.actorUserId)
  })
  const row = await selectDocuments(useDb()).where('d.id', input.documentId).first() as DocumentSelect
  return toView(row)
}
