// One audited way to change a unit's fields, whoever changes it: the entrant's or the office's
// unit form (entries.ts) and the scrutineer's "the unit shows another version" on the grid
// (grid/grid-checks.ts). Two areas make this dossier change, so it lives beside
// dossier-changed. One audit row per changed field; an accepted entry is marked changed.
// The caller brings the board up to date (dossierChanged, or the grid check's own tile refresh).
import type { Knex } from 'knex'
import type { UnitRow } from '#shared/types/rows'
import { audit } from '#domain/audit/audit'
import { noteChangeAfterAcceptance } from './dossier-changed'

export const UNIT_FIELDS = {
  model: 'model',
  serial: 'serial',
  firmwareVersion: 'firmware_version',
  radioId: 'radio_id',
  firmwareExpiresOn: 'firmware_expires_on',
  firmwareUpdatedOn: 'firmware_updated_on',
  obstacleDbVersion: 'obstacle_db_version',
  obstacleDbExpiresOn: 'obstacle_db_expires_on',
  approvalLevel: 'approval_level',
  igcRecorderId: 'igc_recorder_id',
} as const satisfies Record<string, keyof UnitRow>
export type UnitField = keyof typeof UNIT_FIELDS
export type UnitColumn = (typeof UNIT_FIELDS)[UnitField]

export interface UnitChange {
  competitionId: string
  entryId: string
  /** The unit as stored, read in this transaction. */
  current: UnitRow
  /** The columns to set; a column left out keeps its value. */
  next: Partial<Record<UnitColumn, string | null>>
  actorUserId: string
  /** Said in each audit row beside the field, e.g. the grid check that found the change. */
  context?: Record<string, unknown>
}

/** Writes the columns that differ and audits each; returns the fields changed (none: nothing written). */
export async function writeUnitChange(trx: Knex.Transaction, change: UnitChange): Promise<UnitField[]> {
  const { current, next } = change
  const changed = (Object.entries(UNIT_FIELDS) as [UnitField, UnitColumn][])
    .filter(([, column]) => column in next && (current[column] ?? null) !== (next[column] ?? null))
  if (!changed.length) return []
  await trx('units').where({ id: current.id }).update({ ...next, updated_at: trx.fn.now() })
  await trx('entries').where({ id: change.entryId }).update({ updated_at: trx.fn.now() })
  for (const [field, column] of changed) {
    await audit(trx, {
      actorUserId: change.actorUserId, competitionId: change.competitionId, action: 'unit.updated', subjectType: 'unit', subjectId: current.id,
      details: { entryId: change.entryId, field, from: current[column] ?? null, to: next[column] ?? null, ...change.context },
    })
  }
  await noteChangeAfterAcceptance(trx, [change.entryId])
  return changed.map(([field]) => field)
}
