/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Helpers of the entries tests: a competition with its staff, entry bodies, units.
import { ApiClient, signedUpClient } from './api'
import { createClass, createCompetition, testDb } from './db'

export interface EntriesWorld {
  competitionId: string
  classId: string
  otherClassId: string
  organiser: Awaited<ReturnType<typeof signedUpClient>>
  scrutineer: Awaited<ReturnType<typeof signedUpClient>>
  entrant: Awaited<ReturnType<typeof signedUpClient>>
  otherEntrant: Awaited<ReturnType<typeof signedUpClient>>
  outsider: Awaited<ReturnType<typeof signedUpClient>>
  anonymous: ApiClient
}

/** A competition open for registration with an organiser, a scrutineer and two entrants-to-be. */
export async function entriesWorld(baseUrl: string, name = 'Entries Cup'): Promise<EntriesWorld> {
  const [organiser, scrutineer, entrant, otherEntrant, outsider] = await Promise.all([
    signedUpClient(baseUrl, 'Olga Organiser'),
    signedUpClient(baseUrl, 'Sam Scrutineer'),
    signedUpClient(baseUrl, 'Erin Entrant'),
    signedUpClient(baseUrl, 'Otto Other'),
    signedUpClient(baseUrl, 'Nora Nonmember'),
  ])
  const competitionId = await createCompetition(name, [
    { userId: organiser.user.id, role: 'organiser' },
    { userId: scrutineer.user.id, role: 'scrutineer' },
  ])
  const classId = await createClass(competitionId, 'Standard')
  const otherClassId = await createClass(competitionId, 'Club')
  return { competitionId, classId, otherClassId, organiser, scrutineer, entrant, otherEntrant, outsider, anonymous: new ApiClient(baseUrl) }
}

export function entryBody(classId: string, overrides: Record<string, unknown> = {}) {
  return {
    classId,
    pilotName: 'Erin Entrant',
    pilotNationality: 'gb',
    pilotLicenceNumber: 'GBR.FCL.1234',
    pilotPhone: '+44 7700 900123',
    emergencyContact: 'Pat Entrant, +44 7700 900456',
    copilotName: 'Cleo Copilot',
    crewNames: ['Ray Retrieve'],
    gliderType: 'Kestrel Test 15',
    registration: 'G-KTST',
    compId: 'kt',
    spanM: 15,
    mtomKg: 525,
    emptyMassKg: 255,
    datumDescription: 'Wing leading edge at the root',
    privacyNoticeAccepted: true,
    ...overrides,
  }
}

export const collisionWarningUnit = (overrides: Record<string, unknown> = {}) => ({
  kind: 'collision-warning',
  model: 'Example CW-2',
  serial: 'CW-0001',
  radioId: '3d2f1a',
  firmwareVersion: '7.20',
  firmwareExpiresOn: '2027-10-31',
  firmwareUpdatedOn: '2026-11-01',
  ...overrides,
})

export const flightRecorderUnit = (overrides: Record<string, unknown> = {}) => ({
  kind: 'flight-recorder',
  model: 'Example Logger 3',
  serial: 'FR-0001',
  firmwareVersion: '2.1',
  approvalLevel: 'all-flights',
  ...overrides,
})

export async function createEntryVia(client: ApiClient, competitionId: string, body: Record<string, unknown>): Promise<string> {
  const res = await client.post(`/api/competitions/${competitionId}/entries`, body)
  if (res.status !== 201) throw new Error(`entry not created: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body.id as string
}

/** An entry that has everything submit needs. */
export async function completeEntry(client: ApiClient, competitionId: string, body: Record<string, unknown>, radioId: string): Promise<string> {
  const id = await createEntryVia(client, competitionId, body)
  const base = `/api/competitions/${competitionId}/entries/${id}/units`
  const cw = await client.post(base, collisionWarningUnit({ radioId }))
  if (cw.status !== 201) throw new Error(`unit not added: ${cw.status} ${JSON.stringify(cw.body)}`)
  const fr = await client.post(base, flightRecorderUnit())
  if (fr.status !== 201) throw new Error(`recorder not added: ${fr.status} ${JSON.stringify(fr.body)}`)
  return id
}

export async function auditRows(subjectId: string, action?: string): Promise<any[]> {
  const q = testDb()('audit_log').where({ subject_id: subjectId }).orderBy('id')
  if (action) q.where({ action })
  return q
}

export async function mailRows(entryId: string): Promise<any[]> {
  return testDb()('mail_outbox').where({ entry_id: entryId }).orderBy('id')
}

export function randomRadioId(): string {
  return Math.floor(0x100000 + Math.random() * 0xEFFFFE).toString(16).toUpperCase()
}

/**
 * A current IGC file from each of the entry's flight recorders, declaring exactly what the entry
 * says and dated ten days before the first contest day (as an upload would store its header):
 * the recorder checks then find nothing. Returns the files' ids.
 */
export async function cleanIgcFiles(entryId: string): Promise<string[]> {
  const db = testDb()
  const entry = await db('entries as e').join('classes as k', 'k.id', 'e.class_id').join('competitions as c', 'c.id', 'e.competition_id')
    .where('e.id', entryId).first('e.*', 'k.name as class_name', db.raw(`coalesce(c.first_contest_day, current_date) - 10 as flight_date`))
  const recorders = await db('units').where({ entry_id: entryId, kind: 'flight-recorder' }).select('id', 'firmware_version')
  const ids: string[] = []
  for (const r of recorders) {
    const [row] = await db('igc_files').insert({
      entry_id: entryId, competition_id: entry.competition_id, unit_id: r.id,
      original_filename: 'declaration.igc', storage_key: `test:${entryId}:${r.id}`, sha256: '0'.repeat(64), size_bytes: 1,
      flight_date: entry.flight_date, pilot: entry.pilot_name, copilot: entry.copilot_name, glider_type: entry.glider_type,
      glider_id: entry.registration, declared_comp_id: entry.comp_id, declared_class: entry.class_name,
      firmware_version: r.firmware_version, has_g_record: true, parse_errors: '[]', uploaded_by: entry.entrant_user_id,
    }).returning('id')
    ids.push(row.id)
  }
  return ids
}
