// Reading the header of an IGC file. The valid fixture is invented and hand-written after the
// IGC GNSS FR specification Appendix A (A record first; H records HFDTE, HFPLT, HFCM2, HFGTY,
// HFGID, HFCID, HFCCL, HFFTY, HFRFW; B fixes; G security record — A3.2 in the 2008 edition).
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { parseIgc, type IgcHeader } from '#domain/files/igc-header'
import { evaluate } from '#shared/engine/evaluate'
import type { EngineIgcFile } from '#shared/engine/types'
import { collisionWarning, competition, dossier, fieldOf, recorder } from '../../../shared/engine/builders'

const fixture = (name: string) => readFileSync(new URL(`../../../../fixtures/igc/${name}`, import.meta.url), 'latin1')

describe('parseIgc', () => {
  it('reads the declaration of a valid file (IGC FR specification Appendix A, H records)', () => {
    const result = parseIgc(fixture('valid-declaration.igc'))
    expect(result).toEqual({
      ok: true,
      errors: [],
      header: {
        flightDate: '2026-11-20',
        pilot: 'Marit Dovecote',
        copilot: 'Rowan Ashdown',
        gliderType: 'Kestrel Trainer 15',
        gliderId: 'D-KMOR',
        competitionId: 'KM1',
        competitionClass: 'Standard',
        recorderType: 'Test Recorder Works,TR-1',
        firmwareVersion: '2.4.1',
        recorderId: expect.stringMatching(/^[A-Z0-9]{6}$/),
        extensions: expect.any(Array),
        hasGRecord: true,
      },
    })
  })

  it('says a file without an A record is not IGC, at line 1', () => {
    const result = parseIgc(fixture('garbage.txt'))
    expect(result).toMatchObject({ ok: false, error: { line: 1, message: 'Missing A record' } })
  })

  it('points a missing date at the first record that needed it', () => {
    const result = parseIgc('AXGMK7Q\r\n\r\nB1201005130000N00745000EA0050000600\r\n')
    expect(result).toMatchObject({ ok: false, error: { line: 3, message: 'Missing HFDTE record before first B record' } })
  })

  it('collects broken lines with their numbers and still reads the rest (lenient mode)', () => {
    const text = fixture('valid-declaration.igc').replace('B1201205130040N00745060EA0051000610', 'Bxx')
    const result = parseIgc(text)
    expect(result.ok).toBe(true)
    expect(result.errors).toEqual([{ line: 15, message: 'Invalid B record' }])
  })

  it('notes a missing G record', () => {
    const text = fixture('valid-declaration.igc').split('\n').filter(l => !l.startsWith('G')).join('\n')
    const result = parseIgc(text)
    expect(result.ok && result.header.hasGRecord).toBe(false)
  })

  it('refuses binary data even when it starts like an A record', () => {
    expect(parseIgc('AXGMK7Q\u0000\u0001\u0002').ok).toBe(false)
  })
})

// Source: FAI/IGC Technical Specification for IGC-approved GNSS Flight Recorders, 2nd edition,
// amendment 8 (2023), Appendix A, worked example A9.2 (paragraph number `from memory`: the 2023
// text is stored only as a binary file here). As printed it is not machine-valid (a stray
// character in a longitude, records out of order). The fixture is a minimally corrected copy,
// reassembled from the example's published values:
//  - every C-record longitude has exactly DDDMMmmm + E/W (the C-record layout), e.g. 00101899W;
//  - records in the order A, H, I, J, C, then F/B/K, L, G last (the order of the mandatory
//    records, A2.5.7 in the 2008 edition);
//  - maker names in the FR type, GPS receiver and pressure sensor headers replaced by neutral
//    words, and the manufacturer code set to XXX (the code for recorders without an approved
//    code, A2.5.6 in the 2008 edition).
// Pilot, glider type, glider ID, competition ID, class, date, flight number and declaration
// points are the example's own values, kept as published (the glider type is the one place a
// real type name appears in the project, because the specification's example uses it).
describe('the IGC specification’s worked example (Appendix A, A9.2) through Gridmark’s parser', () => {
  const SPEC_EXAMPLE = fixture('spec-a9-2-corrected.igc')
  const parsed = parseIgc(SPEC_EXAMPLE)
  if (!parsed.ok) throw new Error('the example must parse')
  const h = parsed.header

  it('reads the published header values (H records, A3.3 in the 2008 edition)', () => {
    expect(h).toMatchObject({
      flightDate: '2019-08-16',
      pilot: 'Bloggs Bill D',
      gliderType: 'Arcus M',
      gliderId: 'G-GLID',
      competitionId: '111',
      competitionClass: '20m Motor Glider',
      firmwareVersion: '6.4',
      hasGRecord: true,
    })
  })

  it('reads “HFCM2CREW2:Nil” as no co-pilot (NIL in any case: common practice; the spec says “if any”)', () => {
    expect(h.copilot).toBeNull()
  })

  it('reads the A record “AXXXABC…” as manufacturer code XXX and serial id ABC (A3.1, 2008 edition)', () => {
    expect(h.recorderId).toBe('XXXABC')
  })

  it('reads the I record “I033638FXA3940SIU4143ENL” as three extensions FXA, SIU, ENL (A3.4, 2008 edition)', () => {
    expect(h.extensions).toEqual(['FXA', 'SIU', 'ENL'])
  })

  const asEngineFile = (header: IgcHeader): EngineIgcFile => ({
    id: 'igc-1', unitId: 'fr-1', filename: 'spec.igc', uploadedAt: '2027-06-01T10:00:00Z',
    flightDate: header.flightDate, pilot: header.pilot, copilot: header.copilot, gliderType: header.gliderType, gliderId: header.gliderId,
    competitionId: header.competitionId, competitionClass: header.competitionClass, hasGRecord: header.hasGRecord,
    recorderId: header.recorderId, firmwareVersion: header.firmwareVersion, extensions: header.extensions,
  })
  const entry = { registration: 'G-GLID', compId: '111', className: '20m Motor Glider', classCode: 'motor-20m', pilotName: 'Bill Bloggs', gliderType: 'Arcus M', motorGlider: 'self-launching' as const }
  // The example flew in 2019: a recency window of ten years keeps declaration.recent quiet.
  const OLD_FILES_ACCEPTED = competition({ igcRecencyDays: 3650 })
  const recorderOfExample = recorder({ igcRecorderId: 'XXX-ABC', firmwareVersion: '6.4' })

  it('matches an entry made with the same values: declaration, recorder identity and engine recording (ENL)', () => {
    const d = dossier({ igcFiles: [asEngineFile(h)], units: [collisionWarning(), recorderOfExample] }, entry)
    expect(evaluate(d, OLD_FILES_ACCEPTED, fieldOf(d))).toEqual([])
  })

  it('with its I record removed, a motor glider’s file no longer shows engine recording', () => {
    const stripped = parseIgc(SPEC_EXAMPLE.split('\n').filter(l => !l.startsWith('I')).join('\n'))
    if (!stripped.ok) throw new Error('still parses')
    const d = dossier({ igcFiles: [asEngineFile(stripped.header)], units: [collisionWarning(), recorderOfExample] }, entry)
    expect(evaluate(d, OLD_FILES_ACCEPTED, fieldOf(d)).map(f => `${f.severity} ${f.checkId}`)).toEqual(['blocking motor-glider.engine-recording'])
  })

  it('with its G record removed, the file has no security record (the G record, A3.2 in the 2008 edition)', () => {
    const stripped = parseIgc(SPEC_EXAMPLE.split('\n').filter(l => !l.startsWith('G')).join('\n'))
    expect(stripped.ok && stripped.header.hasGRecord).toBe(false)
  })
})

describe('older header forms through Gridmark’s parser', () => {
  const base = (date: string, pilot: string) => [
    'AXXXABCFLIGHT:1', date, pilot, 'HFGIDGLIDERID:G-GLID', 'HFCIDCOMPETITIONID:111',
    'B1602405407121N00249342WA002800042100000',
  ].join('\r\n')

  it('reads the date written “HFDTEDDMMYY” without its DATE: label (the form of A3.3.1 in the 2008 edition)', () => {
    const r = parseIgc(base('HFDTE160819', 'HFPLTPILOTINCHARGE:Bloggs Bill D'))
    expect(r.ok && r.header.flightDate).toBe('2019-08-16')
  })

  it('reads the pilot written “HFPLTPILOT:” (an older recorders’ form; the 2008 edition writes PILOTINCHARGE:)', () => {
    const r = parseIgc(base('HFDTEDATE:160819,01', 'HFPLTPILOT:Bloggs Bill D'))
    expect(r.ok && r.header.pilot).toBe('Bloggs Bill D')
  })
})
