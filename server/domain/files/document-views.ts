// Opening a document's file, and the log of who opened pilots' medical and licence files. The
// need-to-know decision is taken before (requireDocumentFile, shared/utils/document-access.ts);
// here an opening it marks as logged is written to document_views before the bytes are
// handed back, so a view that cannot be recorded is never served. The pilot reads their
// entry's log, the office the competition's.
import type { Knex } from 'knex'
import { MESSAGES } from '#shared/constants/messages'
import type { DocumentViewsQuery } from '#shared/schemas/document-views'
import type { DocumentRow, DocumentViewRow } from '#shared/types/rows'
import type {
  CompetitionDocumentViewsResponse,
  EntryDocumentViewItem,
  EntryDocumentViewsResponse,
} from '#shared/types/document-views'
import type { DocumentViewerRole } from '#shared/utils/document-access'
import { isPersonalDocument } from '#shared/utils/document-access'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { iso } from '#domain/read-model/values'
import { readFile } from './storage'

/**
 * The stored bytes of a document for one reader. With `loggedAs` (a medical or licence file),
 * the opening is recorded first: if the row cannot be written the error goes up and nothing is
 * sent. A file that cannot be read is not an opening: 404, nothing recorded.
 */
export async function openDocumentFile(input: {
  document: DocumentRow
  viewerUserId: string
  loggedAs: DocumentViewerRole | null
  clientAddress: string
}): Promise<Buffer> {
  const { document } = input
  // Deleted on the retention schedule: the row stays, the file is gone.
  if (!document.storage_key) throw httpError(410, MESSAGES.documentFileDeleted)
  const data = await readFile(document.storage_key)
  if (!data) throw httpError(404, MESSAGES.fileUnavailable)
  if (input.loggedAs) {
    // Never a personal file without its row: the decision and the kind must agree.
    if (!isPersonalDocument(document.kind)) throw new Error(`only medical and licence openings are logged, not ${document.kind}`)
    await useDb().transaction(trx => trx('document_views').insert({
      document_id: document.id,
      entry_id: document.entry_id,
      competition_id: document.competition_id,
      document_kind: document.kind,
      viewer_user_id: input.viewerUserId,
      viewer_role: input.loggedAs,
      client_address: input.clientAddress,
    }))
  }
  return data
}

type ViewSelect = DocumentViewRow & { viewer_name: string }

function selectViews(db: Knex) {
  return db('document_views as v')
    .join('users as u', 'u.id', 'v.viewer_user_id')
    .select('v.*', 'u.name as viewer_name')
    .orderBy([{ column: 'v.viewed_at', order: 'desc' }, { column: 'v.id', order: 'desc' }])
}

function toItem(r: ViewSelect): Omit<EntryDocumentViewItem, 'byEntrant'> {
  return {
    id: String(r.id),
    documentId: r.document_id,
    documentKind: r.document_kind,
    viewerName: r.viewer_name,
    viewerRole: r.viewer_role,
    viewedAt: iso(r.viewed_at),
  }
}

async function countViews(where: Partial<Pick<DocumentViewRow, 'entry_id' | 'competition_id'>>): Promise<number> {
  const [row] = await useDb()('document_views').where(where).count<{ count: string }[]>('id as count')
  return Number(row!.count)
}

/** Who opened an entry's medical and licence files, newest first, at most `limit`. */
export async function entryDocumentViews(entry: { id: string, entrant_user_id: string }, limit: number): Promise<EntryDocumentViewsResponse> {
  const [rows, total] = await Promise.all([
    selectViews(useDb()).where('v.entry_id', entry.id).limit(limit) as Promise<ViewSelect[]>,
    countViews({ entry_id: entry.id }),
  ])
  return {
    views: rows.map(r => ({ ...toItem(r), byEntrant: r.viewer_user_id === entry.entrant_user_id })),
    total,
    limit,
  }
}

/** The competition's log for the office: every entry, with the viewer's address; pages, newest first. */
export async function competitionDocumentViews(competitionId: string, query: DocumentViewsQuery): Promise<CompetitionDocumentViewsResponse> {
  const [rows, total] = await Promise.all([
    selectViews(useDb())
      .join('entries as e', 'e.id', 'v.entry_id')
      .select('e.comp_id', 'e.pilot_name')
      .where('v.competition_id', competitionId)
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize) as Promise<(ViewSelect & { comp_id: string, pilot_name: string })[]>,
    countViews({ competition_id: competitionId }),
  ])
  return {
    rows: rows.map(r => ({
      ...toItem(r),
      entry: { id: r.entry_id, compId: r.comp_id, pilotName: r.pilot_name },
      clientAddress: r.client_address,
    })),
    total,
    page: query.page,
    pageSize: query.pageSize,
  }
}
