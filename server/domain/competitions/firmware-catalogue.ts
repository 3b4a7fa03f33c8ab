// The firmware catalogue of a competition: known releases of collision-warning unit firmware
// and the day each stops working. Organisers keep it (by hand or from a CSV file); staff read it.
import type { Knex } from 'knex'
import { parse } from 'csv-parse/sync'
import { z } from 'zod'
import { FIRMWARE_CSV_COLUMNS, firmwareCsvRowSchema, type FirmwareReleaseInput } from '#shared/schemas/firmware'
import { MESSAGES } from '#shared/constants/messages'
import type { FirmwareReleaseRow } from '#shared/types/rows'
import type { CsvLineError, FirmwareImportResult, FirmwareRelease } from '#shared/types/setup'
import { audit } from '#domain/audit/audit'
import { dossierChanged } from '#domain/board/dossier-changed'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import type { FirmwareSuggestion } from '#shared/types/api-entries'

const RELEASE_COLUMNS = ['id', 'competition_id', 'unit_family', 'version']

function toRelease(r: FirmwareReleaseRow): FirmwareRelease {
  return { id: r.id, unitFamily: r.unit_family, version: r.version, expiresOn: r.expires_on }
}

function releaseQuery(db: Knex) {
  return db('firmware_releases').select(...RELEASE_COLUMNS, 'expires_on')
}

export async function listFirmwareReleases(competitionId: string, db: Knex = useDb()): Promise<FirmwareRelease[]> {
  const rows: FirmwareReleaseRow[] = await releaseQuery(db)
    .where({ competition_id: competitionId })
    .orderByRaw('lower(unit_family), lower(version)')
  return rows.map(toRelease)
}

async function findRelease(db: Knex, competitionId: string, releaseId: string): Promise<FirmwareReleaseRow> {
  const row: FirmwareReleaseRow | undefined = await releaseQuery(db).where({ competition_id: competitionId, id: releaseId }).forUpdate().first()
  if (!row) throw httpError(404, MESSAGES.firmwareNotFound)
  return row
}

function taken(err: unknown) {
  return (err as { code?: string } | null)?.code === '23505'
}

export async function addFirmwareRelease(competitionId: string, input: FirmwareReleaseInput, actorUserId: string): Promise<FirmwareRelease> {
  try {
    return await useDb().transaction(async (trx) => {
      const [row] = await trx('firmware_releases')
        .insert({ competition_id: competitionId, unit_family: input.unitFamily, version: input.version, expires_on: input.expiresOn })
        .returning('id')
      const release = toRelease(await findRelease(trx, competitionId, row.id))
      await audit(trx, { actorUserId, competitionId, action: 'firmware.added', subjectType: 'firmware_release', subjectId: release.id, details: { from: null, to: release } })
      await dossierChanged(trx, competitionId, 'all', actorUserId)
      return release
    })
  }
  catch (err) {
    if (taken(err)) throw httpError(409, MESSAGES.firmwareTaken, { fieldErrors: { version: [MESSAGES.firmwareTaken] } })
    throw err
  }
}

export async function updateFirmwareRelease(competitionId: string, releaseId: string, patch: Partial<FirmwareReleaseInput>, actorUserId: string): Promise<FirmwareRelease> {
  try {
    return await useDb().transaction(async (trx) => {
      const before = toRelease(await findRelease(trx, competitionId, releaseId))
      const cols: Record<string, string> = {}
      if (patch.unitFamily !== undefined) cols.unit_family = patch.unitFamily
      if (patch.version !== undefined) cols.version = patch.version
      if (patch.expiresOn !== undefined) cols.expires_on = patch.expiresOn
      if (Object.keys(cols).length === 0) return before
      await trx('firmware_releases').where({ id: releaseId }).update(cols)
      const after = toRelease(await findRelease(trx, competitionId, releaseId))
      await audit(trx, { actorUserId, competitionId, action: 'firmware.changed', subjectType: 'firmware_release', subjectId: releaseId, details: { from: before, to: after } })
      await dossierChanged(trx, competitionId, 'all', actorUserId)
      return after
    })
  }
  catch (err) {
    if (taken(err)) throw httpError(409, MESSAGES.firmwareTaken, { fieldErrors: { version: [MESSAGES.firmwareTaken] } })
    throw err
  }
}

export async function deleteFirmwareRelease(competitionId: string, releaseId: string, actorUserId: string): Promise<void> {
  await useDb().transaction(async (trx) => {
    const before = toRelease(await findRelease(trx, competitionId, releaseId))
    await trx('firmware_releases').where({ id: releaseId }).delete()
    await audit(trx, { actorUserId, competitionId, action: 'firmware.deleted', subjectType: 'firmware_release', subjectId: releaseId, details: { from: before, to: null } })
    await dossierChanged(trx, competitionId, 'all', actorUserId)
  })
}

export interface ParsedCatalogueLine {
  line: number
  unitFamily: string
  version: string
  expiresOn: string
}

/**
 * Reads a catalogue CSV file (header line naming unit_family, version, expires_on; any order,
 * extra columns ignored) and checks every data line. Refuses the whole file, listing each bad
 * line by its number in the file, so an import is all or nothing.
 */
export function parseFirmwareCsv(text: string): ParsedCatalogueLine[] {
  let records: { record: Record<string, string>, info: { lines: number } }[]
  try {
    records = parse(text.replace(/^\uFEFF/, ''), {
      columns: (header: string[]) => header.map(h => h.trim().toLowerCase()),
      skip_empty_lines: true,
      trim: true,
      relax_column_count: true,
      info: true,
    }) as typeof records
  }
  catch (err) {
    const message = err instanceof Error ? err.message : String(err)
    throw httpError(400, MESSAGES.csvUnreadable(message.replace(/^Invalid Record Length: /, '')))
  }
  if (records.length === 0) throw httpError(400, MESSAGES.csvEmpty)
  const header = Object.keys(records[0]!.record)
  if (!FIRMWARE_CSV_COLUMNS.every(c => header.includes(c))) throw httpError(400, MESSAGES.csvColumns)

  const lines: ParsedCatalogueLine[] = []
  const errors: CsvLineError[] = []
  const seen = new Map<string, number>()
  for (const { record, info } of records) {
    const line = info.lines
    const result = firmwareCsvRowSchema.safeParse(record)
    if (!result.success) {
      const fields = z.flattenError(result.error).fieldErrors as Record<string, string[] | undefined>
      errors.push({ line, messages: FIRMWARE_CSV_COLUMNS.flatMap(c => (fields[c] ?? []).map(m => `${c}: ${m}`)) })
      continue
    }
    const key = `${result.data.unit_family.toLowerCase()}\u0000${result.data.version.toLowerCase()}`
    const earlier = seen.get(key)
    if (earlier !== undefined) {
      errors.push({ line, messages: [`version: the same unit family and version is already on line ${earlier}.`] })
      continue
    }
    seen.set(key, line)
    lines.push({ line, unitFamily: result.data.unit_family, version: result.data.version, expiresOn: result.data.expires_on })
  }
  if (errors.length) throw httpError(400, MESSAGES.csvBadRows(errors.length), { lineErrors: errors, fieldErrors: {}, formErrors: [] })
  return lines
}

/** Adds new releases and updates the expiry of known ones (same family and version, any case), in one transaction. */
export async function importFirmwareCsv(competitionId: string, text: string, actorUserId: string): Promise<FirmwareImportResult> {
  const lines = parseFirmwareCsv(text)
  return useDb().transaction(async (trx) => {
    // What the catalogue said before, so the audit records each change as from → to.
    const known = new Map((await listFirmwareReleases(competitionId, trx))
      .map(r => [`${r.unitFamily.toLowerCase()}\u0000${r.version.toLowerCase()}`, r]))
    const rows: { inserted: boolean }[] = await trx.raw(
      `INSERT INTO firmware_releases (competition_id, unit_family, version, expires_on)
       SELECT ?, v.unit_family, v.version, v.expires_on::date
       FROM jsonb_to_recordset(?::jsonb) AS v(unit_family text, version text, expires_on text)
       ON CONFLICT (competition_id, lower(unit_family), lower(version))
       DO UPDATE SET expires_on = EXCLUDED.expires_on
       RETURNING (xmax = 0) AS inserted`,
      [competitionId, JSON.stringify(lines.map(l => ({ unit_family: l.unitFamily, version: l.version, expires_on: l.expiresOn })))],
    ).then((r: { rows: { inserted: boolean }[] }) => r.rows)
    const added = rows.filter(r => r.inserted).length
    const result = { added, updated: rows.length - added, total: rows.length }
    const changes = lines.map((l) => {
      const before = known.get(`${l.unitFamily.toLowerCase()}\u0000${l.version.toLowerCase()}`)
      return { unitFamily: l.unitFamily, version: l.version, from: before ? before.expiresOn : null, to: l.expiresOn }
    })
    await audit(trx, { actorUserId, competitionId, action: 'firmware.imported', subjectType: 'competition', subjectId: competitionId, details: { ...result, changes } })
    await dossierChanged(trx, competitionId, 'all', actorUserId)
    return result
  })
}

/**
 * The catalogue's expiry date for a unit family (or a model whose name contains the family)
 * and version; the longest matching family wins. Null expiresOn when the catalogue has none.
 */
export async function suggestFirmware(competitionId: string, family: string, version: string, db: Knex = useDb()): Promise<FirmwareSuggestion> {
  const row = await db('firmware_releases')
    .where({ competition_id: competitionId })
    .whereRaw('lower(version) = lower(?)', [version])
    .whereRaw(`(lower(unit_family) = lower(?) OR position(lower(unit_family) in lower(?)) > 0)`, [family, family])
    .orderByRaw('length(unit_family) desc')
    .first('unit_family', 'version', 'expires_on')
  return row
    ? { expiresOn: row.expires_on, unitFamily: row.unit_family, version: row.version }
    : { expiresOn: null, unitFamily: null, version: null }
}
