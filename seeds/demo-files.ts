// Demo documents: every entry past its draft has its documents, C4's insurance is rejected
// (a seeded problem) and a few wait in the scrutineers' queue. The files are tiny invented
// PDFs written to the uploads folder (the default storage), laid out as the app's fs driver
// keeps them (documents/<entry id>/<uuid>) and sealed as the app seals them (file-crypt.ts).
import { createHash, randomUUID } from 'node:crypto'
import { mkdirSync, writeFileSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { Knex } from 'knex'
import { seal, type FileKeyring } from '../server/domain/files/file-crypt'
import { DOCUMENT_KIND_LABELS, type DocumentKind } from '../shared/constants/entries'
import { takeOffMass } from '../shared/engine/weigh-in'
import { isPersonalDocument } from '../shared/utils/document-access'
import { DEMO_ENTRIES, DEMO_WEIGH_IN } from './demo-entries'

const uploadsDir = () => process.env.NUXT_UPLOADS_DIR ?? resolve(dirname(fileURLToPath(import.meta.url)), '../.data/uploads')

/** Writes a demo file sealed, as the app does: mode 0600 in folders 0700. Returns its key id. */
function writeSealed(area: 'documents' | 'igc', entryId: string, id: string, data: Buffer, files: FileKeyring): string {
  const file = join(uploadsDir(), area, entryId, id)
  mkdirSync(dirname(file), { recursive: true, mode: 0o700 })
  writeFileSync(file, seal(data, files), { mode: 0o600 })
  return files.current!.id
}

function demoPdf(title: string): Buffer {
  const text = title.replace(/[()\\]/g, '')
  const stream = `BT /F1 16 Tf 30 110 Td (${text}) Tj 0 -24 Td (Invented demo document) Tj ET`
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 420 200] /Contents 4 0 R /Resources << /Font << /F1 5 0 R >> >> >>',
    `<< /Length ${stream.length} >>\nstream\n${stream}\nendstream`,
    '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>',
  ]
  let out = '%PDF-1.4\n'
  const offsets: number[] = []
  objects.forEach((body, i) => {
    offsets.push(out.length)
    out += `${i + 1} 0 obj\n${body}\nendobj\n`
  })
  const xref = out.length
  out += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map(o => `${String(o).padStart(10, '0')} 00000 n \n`).join('')}`
  out += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`
  return Buffer.from(out, 'latin1')
}

type Review = { status: 'accepted' } | { status: 'rejected', reason: string } | { status: 'pending' }

type Plan = Partial<Record<DocumentKind, Review & { expiresOn: string }>>

/** Every entry past its draft has its four documents accepted, unless PLAN says otherwise. */
const IN_ORDER: Plan = {
  airworthiness: { status: 'accepted', expiresOn: '2028-03-31' },
  insurance: { status: 'accepted', expiresOn: '2027-12-31' },
  licence: { status: 'accepted', expiresOn: '2029-05-01' },
  medical: { status: 'accepted', expiresOn: '2028-01-15' },
}

const PLAN: Record<string, Plan> = {
  C4: {
    airworthiness: { status: 'accepted', expiresOn: '2028-02-28' },
    insurance: { status: 'rejected', reason: 'The certificate ends on 2027-06-30, before the last contest day.', expiresOn: '2027-06-30' },
    licence: { status: 'pending', expiresOn: '2030-04-01' },
  },
  D6: {
    airworthiness: { status: 'pending', expiresOn: '2028-04-30' },
    insurance: { status: 'pending', expiresOn: '2027-11-30' },
  },
}

export async function seedDemoDocuments(trx: Knex, competitionId: string, files: FileKeyring): Promise<void> {
  const scrutineer = await trx('memberships').where({ competition_id: competitionId, role: 'scrutineer' }).orderBy('created_at').first('user_id')
  const entries = await trx('entries').where({ competition_id: competitionId }).whereNot('status', 'draft').orderBy('comp_id')
    .select('id', 'comp_id', 'entrant_user_id') as { id: string, comp_id: string, entrant_user_id: string }[]
  let minutes = 0
  for (const entry of entries) {
    for (const [kind, plan] of Object.entries(PLAN[entry.comp_id] ?? IN_ORDER) as [DocumentKind, Review & { expiresOn: string }][]) {
      const data = demoPdf(`${DOCUMENT_KIND_LABELS[kind]} - ${entry.comp_id}`)
      const id = randomUUID()
      const fileKeyId = writeSealed('documents', entry.id, id, data, files)
      minutes += 7
      const [inserted] = await trx('documents').insert({
        entry_id: entry.id,
        competition_id: competitionId,
        kind,
        original_filename: `${kind}-${entry.comp_id.toLowerCase()}.pdf`,
        media_type: 'application/pdf',
        size_bytes: data.length,
        sha256: createHash('sha256').update(data).digest('hex'),
        storage_key: `documents:${entry.id}:${id}`,
        file_key_id: fileKeyId,
        expires_on: plan.expiresOn,
        status: plan.status,
        review_reason: plan.status === 'rejected' ? plan.reason : null,
        reviewed_by: plan.status === 'pending' ? null : scrutineer?.user_id ?? null,
        reviewed_at: plan.status === 'pending' ? null : trx.raw(`now() - interval '2 days'`),
        uploaded_by: entry.entrant_user_id,
        uploaded_at: trx.raw(`now() - interval '20 days' + (? || ' minutes')::interval`, [String(minutes)]),
      }).returning('id') as { id: string }[]
      // The scrutineer opened each medical or licence file they reviewed: the pilot's record of
      // openings is not empty in the demo (addresses from the documentation range, RFC 5737).
      if (plan.status !== 'pending' && scrutineer && isPersonalDocument(kind)) {
        await trx('document_views').insert({
          document_id: inserted!.id,
          entry_id: entry.id,
          competition_id: competitionId,
          document_kind: kind,
          viewer_user_id: scrutineer.user_id,
          viewer_role: 'scrutineer',
          client_address: '192.0.2.41',
          viewed_at: trx.raw(`now() - interval '2 days' - interval '3 minutes'`),
        })
      }
    }
  }
}

/**
 * Demo IGC files, one from every flight recorder of every entry past its draft (S2's second
 * recorder has none: a seeded problem), laid out as the app stores them (igc/<entry id>/<uuid>).
 * G5's declaration names another glider ID and competition ID than its entry — the seeded
 * declaration mismatch; the others match. The A record carries the recorder's IGC identity (the
 * invented manufacturer code XKM); the I record declares fix accuracy and satellites, and for
 * L8, a self-launching motor glider, engine noise (ENL). E2, a sustainer, records none.
 */
const IGC_PLAN: Record<string, { gliderId?: string, compId?: string, flightDate?: string }> = {
  G5: { gliderId: 'KM-ZZQ', compId: 'G6', flightDate: '2027-05-29' },
}
const ENGINE_RECORDED = new Set(['L8'])

function demoIgc(input: { pilot: string, copilot: string | null, gliderType: string, gliderId: string, compId: string, className: string, flightDate: string, recorder: string, recorderId: string, firmware: string, enl: boolean }): string {
  const [y, m, d] = input.flightDate.split('-')
  // B records carry the extensions the I record declares: FXA (bytes 36–38), SIU (39–40), ENL (41–43).
  const ext = input.enl ? ['03512005', '03512006', '03512004'] : ['03512', '03512', '03512']
  const lines = [
    `A${input.recorderId}FLIGHT:1`,
    `HFDTEDATE:${d}${m}${y!.slice(2)},01`,
    `HFPLTPILOTINCHARGE:${input.pilot}`,
    `HFCM2CREW2:${input.copilot ?? 'NIL'}`,
    `HFGTYGLIDERTYPE:${input.gliderType}`,
    `HFGIDGLIDERID:${input.gliderId}`,
    'HFDTM100GPSDATUM:WGS-1984',
    `HFRFWFIRMWAREVERSION:${input.firmware}`,
    `HFFTYFRTYPE:${input.recorder}`,
    `HFCIDCOMPETITIONID:${input.compId}`,
    `HFCCLCOMPETITIONCLASS:${input.className}`,
    input.enl ? 'I033638FXA3940SIU4143ENL' : 'I023638FXA3940SIU',
    `B1201005130000N00745000EA0050000600${ext[0]}`,
    `B1201105130020N00745030EA0050500605${ext[1]}`,
    `B1201205130040N00745060EA0051000610${ext[2]}`,
    // An invented security record: present, but no real signature (it cannot be validated here).
    'G3F2A91C07B44D1E8A5F60C2B9137E4D',
  ]
  return `${lines.join('\r\n')}\r\n`
}

export async function seedDemoIgcFiles(trx: Knex, competitionId: string, files: FileKeyring): Promise<void> {
  const rows = await trx('entries as e')
    .join('classes as c', 'c.id', 'e.class_id')
    .where('e.competition_id', competitionId).whereNot('e.status', 'draft').orderBy('e.comp_id')
    .select('e.id', 'e.comp_id', 'e.pilot_name', 'e.copilot_name', 'e.glider_type', 'e.registration', 'e.entrant_user_id', 'c.name as class_name') as
    { id: string, comp_id: string, pilot_name: string, copilot_name: string | null, glider_type: string, registration: string, entrant_user_id: string, class_name: string }[]
  const withoutFile = new Set(DEMO_ENTRIES.flatMap(e => e.units.filter(u => u.noIgcFile).map(u => u.serial)))
  for (const entry of rows) {
    const recorders = await trx('units').where({ entry_id: entry.id, kind: 'flight-recorder' }).orderBy('created_at')
      .select('id', 'model', 'serial', 'firmware_version', 'igc_recorder_id') as { id: string, model: string, serial: string, firmware_version: string | null, igc_recorder_id: string | null }[]
    for (const recorder of recorders) {
      if (withoutFile.has(recorder.serial)) continue
      const plan = IGC_PLAN[entry.comp_id] ?? {}
      const header = {
        pilot: entry.pilot_name,
        copilot: entry.copilot_name,
        gliderType: entry.glider_type,
        gliderId: plan.gliderId ?? entry.registration,
        compId: plan.compId ?? entry.comp_id,
        className: entry.class_name,
        flightDate: plan.flightDate ?? '2027-05-14',
        recorder: recorder.model,
        recorderId: recorder.igc_recorder_id ?? 'XKMDEM',
        firmware: recorder.firmware_version ?? '1.0',
        enl: ENGINE_RECORDED.has(entry.comp_id),
      }
      const data = Buffer.from(demoIgc(header), 'latin1')
      const id = randomUUID()
      const fileKeyId = writeSealed('igc', entry.id, id, data, files)
      await trx('igc_files').insert({
        entry_id: entry.id,
        competition_id: competitionId,
        unit_id: recorder.id,
        original_filename: `${entry.comp_id.toLowerCase()}-${recorder.serial.toLowerCase()}-${header.flightDate}.igc`,
        storage_key: `igc:${entry.id}:${id}`,
        file_key_id: fileKeyId,
        sha256: createHash('sha256').update(data).digest('hex'),
        size_bytes: data.length,
        flight_date: header.flightDate,
        pilot: header.pilot,
        copilot: header.copilot,
        glider_type: header.gliderType,
        glider_id: header.gliderId,
        declared_comp_id: header.compId,
        declared_class: header.className,
        recorder_type: header.recorder,
        firmware_version: header.firmware,
        recorder_id: header.recorderId,
        extensions: header.enl ? ['FXA', 'SIU', 'ENL'] : ['FXA', 'SIU'],
        has_g_record: true,
        parse_errors: JSON.stringify([]),
        uploaded_by: entry.entrant_user_id,
      })
    }
  }
}

/**
 * P6's weigh-in at the weighing day, by the demo scrutineer: the glider alone
 * on the scales; with the pilot's recorded mass the take-off mass is over the Standard class's
 * limit (a seeded problem). Stored as the app stores a weigh-in: readings, take-off mass and CG.
 */
export async function seedDemoWeighIn(trx: Knex, competitionId: string, scrutineerId: string): Promise<void> {
  const entry = await trx('entries').where({ competition_id: competitionId, comp_id: DEMO_WEIGH_IN.compId }).first('id', 'pilot_mass_kg', 'copilot_mass_kg')
  if (!entry) return
  const readings = DEMO_WEIGH_IN.readings.map(r => ({ ...r }))
  const t = takeOffMass({ readings, units: 'kg-m' }, { pilotMassKg: num(entry.pilot_mass_kg), copilotMassKg: num(entry.copilot_mass_kg) })
  await trx('weigh_ins').insert({
    competition_id: competitionId,
    entry_id: entry.id,
    weighed_on: DEMO_WEIGH_IN.weighedOn,
    units: 'kg-m',
    readings: JSON.stringify(readings),
    mass_kg: Math.round(t.massKg * 100) / 100,
    cg_arm_m: t.cgArmM === null ? null : Math.round(t.cgArmM * 10_000) / 10_000,
    declared_ballast_kg: 0,
    weighed_by: scrutineerId,
  })
}

function num(v: string | number | null | undefined): number | null {
  return v === null || v === undefined ? null : Number(v)
}
