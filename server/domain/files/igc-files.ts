// IGC files of an entry: upload (parsed header stored beside the file), list with history,
// and the stored file for download. A newer file from the same recorder (or, without a
// recorder, the entry's recorder-less one) supersedes the current one and keeps it as history.
import type { Knex } from 'knex'
import type { IgcFileRow } from '#shared/types/rows'
import type { IgcFileListResponse, IgcFileView } from '#shared/types/files'
import { audit } from '#domain/audit/audit'
import { dossierChanged, noteChangeAfterAcceptance } from '#domain/board/dossier-changed'
import { useDb } from '#server/utils/db'
import { iso } from '#domain/read-model/values'
import { httpError } from '#server/utils/errors'
import { MESSAGES } from '#shared/constants/messages'
import { readFile } from 'node:fs/promises'
import { parseIgcInSlices, type IgcHeader, type IgcLineError, type IgcParseResult } from './igc-header'
import { newStorageKey, storeThenCommit, type ReceivedFile } from './storage'

type IgcSelect = IgcFileRow & { flight_date_text: string | null, uploaded_by_name: string }

function selectIgc(db: Knex) {
  return db('igc_files as f')
    .leftJoin('users as up', 'up.id', 'f.uploaded_by')
    .select('f.*', 'f.flight_date as flight_date_text', 'up.name as uploaded_by_name')
}

function toView(r: IgcSelect): IgcFileView {
  return {
    id: r.id,
    entryId: r.entry_id,
    unitId: r.unit_id,
    originalFilename: r.original_filename,
    sizeBytes: r.size_bytes,
    sha256: r.sha256,
    flightDate: r.flight_date_text,
    pilot: r.pilot,
    copilot: r.copilot,
    gliderType: r.glider_type,
    gliderId: r.glider_id,
    competitionId: r.declared_comp_id,
    competitionClass: r.declared_class,
    recorderType: r.recorder_type,
    firmwareVersion: r.firmware_version,
    recorderId: r.recorder_id ?? null,
    extensions: r.extensions ?? [],
    hasGRecord: r.has_g_record,
    parseErrors: r.parse_errors ?? [],
    uploadedAt: iso(r.uploaded_at),
    uploadedByName: r.uploaded_by_name ?? '',
    superseded: r.superseded,
    replacedBy: r.replaced_by,
  }
}

/** IGC files are ASCII by the specification; accept UTF-8, fall back to Latin-1 byte for byte. */
export function decodeIgcText(data: Uint8Array): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(data)
  }
  catch {
    return new TextDecoder('latin1').decode(data)
  }
}

/**
 * Parses a received IGC file (at most the 5 MB limit, read whole) in slices, so the event
 * loop stays free for everyone else while it runs.
 */
export async function parseIgcUpload(path: string): Promise<IgcParseResult> {
  return parseIgcInSlices(decodeIgcText(await readFile(path)))
}

export async function listIgcFiles(entryId: string): Promise<IgcFileListResponse> {
  const rows = await selectIgc(useDb()).where('f.entry_id', entryId).orderBy('f.uploaded_at', 'desc').orderBy('f.id') as IgcSelect[]
  const views = rows.map(toView)
  return { current: views.filter(v => !v.superseded), history: views.filter(v => v.superseded) }
}

export async function findEntryIgcFile(entryId: string, igcFileId: string): Promise<IgcFileRow | undefined> {
  return useDb()<IgcFileRow>('igc_files').where({ id: igcFileId, entry_id: entryId }).first()
}

/** Whether the unit is a flight recorder of this entry (an IGC file may name only those). */
export async function isEntryRecorder(entryId: string, unitId: string): Promise<boolean> {
  return Boolean(await useDb()('units').where({ id: unitId, entry_id: entryId, kind: 'flight-recorder' }).first('id'))
}

export async function createIgcFile(input: {
  competitionId: string
  entryId: string
  unitId: string | null
  actorUserId: string
  filename: string
  file: ReceivedFile
  header: IgcHeader
  errors: IgcLineError[]
}): Promise<IgcFileView> {
  const key = newStorageKey('igc', input.entryId)
  const { sha256, size } = input.file
  const h = input.header
  const id = await storeThenCommit(key, input.file.path, fileKeyId => useDb().transaction(async (trx) => {
    const previous = await trx('igc_files')
      .where({ entry_id: input.entryId, superseded: false })
      .where(q => (input.unitId ? q.where('unit_id', input.unitId) : q.whereNull('unit_id')))
      .update({ superseded: true })
      .returning('id') as { id: string }[]
    const [row] = await trx('igc_files').insert({
      entry_id: input.entryId,
      competition_id: input.competitionId,
      unit_id: input.unitId,
      original_filename: input.filename,
      storage_key: key,
      file_key_id: fileKeyId,
      sha256,
      size_bytes: size,
      flight_date: h.flightDate,
      pilot: h.pilot,
      copilot: h.copilot,
      glider_type: h.gliderType,
      glider_id: h.gliderId,
      declared_comp_id: h.competitionId,
      declared_class: h.competitionClass,
      recorder_type: h.recorderType,
      firmware_version: h.firmwareVersion,
      recorder_id: h.recorderId,
      extensions: h.extensions,
      has_g_record: h.hasGRecord,
      parse_errors: JSON.stringify(input.errors.slice(0, 100)),
      uploaded_by: input.actorUserId,
    }).returning('id') as { id: string }[]
    if (previous.length) {
      await trx('igc_files').whereIn('id', previous.map(p => p.id)).update({ replaced_by: row!.id })
    }
    await audit(trx, {
      actorUserId: input.actorUserId,
      competitionId: input.competitionId,
      action: previous.length ? 'igc-file.replaced' : 'igc-file.uploaded',
      subjectType: 'igc_file',
      subjectId: row!.id,
      details: { entryId: input.entryId, unitId: input.unitId, sha256, sizeBytes: size, replaces: previous.map(p => p.id) },
    })
    await noteChangeAfterAcceptance(trx, [input.entryId])
    await dossierChanged(trx, input.competitionId, [input.entryId], input.actorUserId)
    return row!.id
  }))
  return toView(await selectIgc(useDb()).where('f.id', id).first() as IgcSelect)
}

/**
 * The entrant (or staff) says which flight recorder a current IGC file came from. The file
 * becomes that recorder's current one; a file that recorder had before is kept as history.
 */
export async function nameIgcRecorder(input: { competitionId: string, entryId: string, igcFileId: string, unitId: string, actorUserId: string }): Promise<IgcFileView> {
  await useDb().transaction(async (trx) => {
    const file = await trx('igc_files').where({ id: input.igcFileId, entry_id: input.entryId }).forUpdate().first('id', 'unit_id', 'superseded') as { id: string, unit_id: string | null, superseded: boolean } | undefined
    if (!file) throw httpError(404, MESSAGES.igcFileNotFound)
    if (file.superseded) throw httpError(409, MESSAGES.igcFileNotCurrent)
    if (file.unit_id === input.unitId) return
    const previous = await trx('igc_files')
      .where({ entry_id: input.entryId, unit_id: input.unitId, superseded: false })
      .update({ superseded: true, replaced_by: file.id })
      .returning('id') as { id: string }[]
    await trx('igc_files').where({ id: file.id }).update({ unit_id: input.unitId })
    await audit(trx, {
      actorUserId: input.actorUserId,
      competitionId: input.competitionId,
      action: 'igc-file.recorder-named',
      subjectType: 'igc_file',
      subjectId: file.id,
      details: { entryId: input.entryId, unitId: input.unitId, from: file.unit_id, replaces: previous.map(p => p.id) },
    })
    await noteChangeAfterAcceptance(trx, [input.entryId])
    await dossierChanged(trx, input.competitionId, [input.entryId], input.actorUserId)
  })
  return toView(await selectIgc(useDb()).where('f.id', input.igcFileId).first() as IgcSelect)
}
