/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Helpers of the grid-check tests: a competition with every staff role, accepted entries with
// a clean dossier, check bodies, today in the competition's time zone.
import { randomBytes, randomUUID } from 'node:crypto'
import { signedUpClient } from './api'
import { testDb } from './db'
import { cleanIgcFiles, completeEntry, entriesWorld, entryBody, randomRadioId, type EntriesWorld } from './entries'

export interface GridWorld extends EntriesWorld {
  director: Awaited<ReturnType<typeof signedUpClient>>
  scrutineer2: Awaited<ReturnType<typeof signedUpClient>>
  admin: Awaited<ReturnType<typeof signedUpClient>>
  base: string
}

/**
 * A competition whose rules require no documents (so an accepted, paid entry with a good
 * collision-warning unit and recorder has no blocking finding), with an organiser, two
 * scrutineers, a director, entrants, an outsider and a site admin holding no role.
 */
export async function gridWorld(baseUrl: string, name: string): Promise<GridWorld> {
  const w = await entriesWorld(baseUrl, name)
  const [director, scrutineer2, admin] = await Promise.all([
    signedUpClient(baseUrl, 'Dana Director'),
    signedUpClient(baseUrl, 'Tom Second Scrutineer'),
    signedUpClient(baseUrl, 'Ada Admin'),
  ])
  await testDb()('users').where({ id: admin.user.id }).update({ is_admin: true })
  await testDb()('memberships').insert([
    { user_id: director.user.id, competition_id: w.competitionId, role: 'director' },
    { user_id: scrutineer2.user.id, competition_id: w.competitionId, role: 'scrutineer' },
  ])
  await testDb()('competitions').where({ id: w.competitionId }).update({ settings: { requiredDocumentKinds: [] } })
  return { ...w, director, scrutineer2, admin, base: `/api/competitions/${w.competitionId}` }
}

let serial = 0
/** An entry with its units; accepted and paid unless told otherwise. */
export async function gridEntry(w: GridWorld, opts: { status?: string, compId?: string } = {}): Promise<string> {
  serial++
  const compId = opts.compId ?? `${String.fromCharCode(65 + (serial % 26))}${serial % 100}`
  const registration = `G-${randomBytes(2).toString('hex').toUpperCase()}`
  const id = await completeEntry(w.entrant.client, w.competitionId, entryBody(w.classId, { compId, registration }), randomRadioId())
  // A firmware that stays valid well past the contest, updated this year: no firmware finding.
  await testDb()('units').where({ entry_id: id, kind: 'collision-warning' }).update({ firmware_expires_on: '2029-01-31', firmware_updated_on: '2027-01-10' })
  await testDb()('entries').where({ id }).update({ status: opts.status ?? 'accepted', payment_status: 'paid' })
  // The recorder's declaration, as an uploaded IGC file gives it: no recorder finding.
  await cleanIgcFiles(id)
  return id
}

export function todayIn(timeZone = 'Europe/Berlin', at: Date = new Date()): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(at)
}

export function shiftDay(day: string, n: number): string {
  const d = new Date(`${day}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + n)
  return d.toISOString().slice(0, 10)
}

/**
 * A grid check body for today that passes every default checklist item answered. For an
 * earlier day it is checked at that day's midday, as the server believes only a time on the
 * check's day (and none in the future).
 */
export function checkBody(entryId: string, over: Record<string, unknown> = {}) {
  const day = typeof over.day === 'string' ? over.day : todayIn()
  return {
    idempotencyKey: randomUUID(),
    entryId,
    day,
    checkedAt: day < todayIn() ? `${day}T11:00:00.000Z` : new Date().toISOString(),
    answers: [
      { itemId: 'cwu-operating', result: 'pass' },
      { itemId: 'cwu-firmware', result: 'pass' },
      { itemId: 'antennas', result: 'pass', note: 'Both fitted' },
    ],
    notes: 'Dry wings',
    foundBy: 'scan',
    ...over,
  }
}

export async function gridCheckRows(where: Record<string, unknown>): Promise<any[]> {
  return testDb()('grid_checks').where(where)
}
