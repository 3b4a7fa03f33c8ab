import { readFileSync } from 'node:fs'
import IGCParser from 'igc-parser'
import { describe, expect, it } from 'vitest'
import { declarationMatchesEntry, declarationRecent } from '#shared/engine/checks/declaration'
import type { EngineIgcFile } from '#shared/engine/types'
import { ctx, dossier, recorder } from '../builders'

// Source: FAI/IGC Technical Specification for IGC-approved GNSS Flight Recorders, 2nd edition,
// amendment 8 (2023), Appendix A, worked example A9.2. As printed it is not machine-valid (a
// stray character in a longitude, records out of order). The fixture is a minimally corrected
// copy, reassembled from the example's published values because the printed page was not at
// hand here to compare byte for byte:
//  - every C-record longitude has exactly DDDMMmmm + E/W (A3.5 layout), e.g. 00101899W;
//  - records in the order A2.5.7 requires: A, H, I, J, C, then F/B/K, L, G last;
//  - maker names in the FR type, GPS receiver and pressure sensor headers replaced by
//    neutral words, and the manufacturer code set to XXX (the code for test files).
// Pilot, glider type, glider ID, competition ID, class, date, flight number and declaration
// points are the example's own values, kept as published (the glider type is the one place a
// real type name appears in the project, because the specification's example uses it).
const SPEC_EXAMPLE = readFileSync(new URL('../../../../fixtures/igc/spec-a9-2-corrected.igc', import.meta.url), 'utf8')

function headerOf(text: string, unitId: string): EngineIgcFile {
  const igc = IGCParser.parse(text, { lenient: true })
  return {
    unitId,
    flightDate: igc.date,
    pilot: igc.pilot,
    copilot: igc.copilot,
    gliderType: igc.gliderType,
    gliderId: igc.registration,
    competitionId: igc.callsign,
    competitionClass: igc.competitionClass,
    hasGRecord: Boolean(igc.security),
    uploadedAt: '2027-06-01T10:00:00Z',
  }
}

describe('the IGC specification’s worked example (Appendix A, A9.2, minimally corrected)', () => {
  const igc = IGCParser.parse(SPEC_EXAMPLE)

  it('parses to the published header values (H records of A3.3)', () => {
    expect(igc.date).toBe('2019-08-16')
    expect(igc.numFlight).toBe(2)
    expect(igc.pilot).toBe('Bloggs Bill D')
    expect(igc.gliderType).toBe('Arcus M')
    expect(igc.registration).toBe('G-GLID')
    expect(igc.callsign).toBe('111')
    expect(igc.competitionClass).toBe('20m Motor Glider')
  })

  it('decodes the declaration point 5111359N00101899W to 51.18932, −1.03165 (C-record layout, A3.5)', () => {
    const takeOff = igc.task!.points[0]!
    expect(takeOff.latitude).toBeCloseTo(51.18932, 5)
    expect(takeOff.longitude).toBeCloseTo(-1.03165, 5)
  })

  it('matches an entry made with the same values, class spelled as the entry’s class', () => {
    const file = headerOf(SPEC_EXAMPLE, 'fr-1')
    const d = dossier({ igcFiles: [file] }, { registration: 'G-GLID', compId: '111', className: '20m Motor Glider', classCode: 'motor-20m', pilotName: 'Bill Bloggs', gliderType: 'Arcus M' })
    expect(declarationMatchesEntry.run(ctx(d))).toEqual([])
  })

  it('flags the same file with its G record removed (required records, A2.5.7) — see igc.test.ts', () => {
    const stripped = SPEC_EXAMPLE.split('\n').filter(l => !l.startsWith('G')).join('\n')
    expect(headerOf(stripped, 'fr-1').hasGRecord).toBe(false)
    expect(headerOf(SPEC_EXAMPLE, 'fr-1').hasGRecord).toBe(true)
  })
})

function file(over: Partial<EngineIgcFile> = {}): EngineIgcFile {
  return {
    id: 'igc-1',
    unitId: 'fr-1',
    flightDate: '2027-05-20',
    pilot: 'HOLMQUIST Linnea',
    copilot: null,
    gliderType: 'Tarn-15',
    gliderId: 'km abc',
    competitionId: 'a1',
    competitionClass: 'Standard Class',
    hasGRecord: true,
    uploadedAt: '2027-05-21T08:00:00Z',
    ...over,
  }
}

describe('declaration.matches-entry (IGC GNSS FR specification Appendix A: HFPLT, HFCM2, HFGTY, HFGID, HFCID, HFCCL)', () => {
  const run = (f: EngineIgcFile, entry = {}) => declarationMatchesEntry.run(ctx(dossier({ igcFiles: [f] }, entry)))

  it('passes a declaration equal up to case, spaces, hyphens and word order', () => {
    expect(run(file())).toEqual([])
  })

  it('compares glider ID and competition ID after normalising ("D-1234" = "d1234")', () => {
    expect(run(file({ gliderId: 'd1234' }), { registration: 'D-1234' })).toEqual([])
  })

  it.each(['18m', '18 Metre', '18-Meter', '18 Meter', '18-Metre'])('accepts the class spelled %s for the 18 Metre class', (spelling) => {
    expect(run(file({ competitionClass: spelling }), { className: '18 Metre', classCode: '18m' })).toEqual([])
  })

  it('blocks a wrong glider ID, competition ID or class, each with both values', () => {
    const findings = run(file({ gliderId: 'KM-ABD', competitionId: 'A7', competitionClass: '15m' }))
    expect(findings.map(f => f.severity)).toEqual(['blocking', 'blocking', 'blocking'])
    expect(findings[0]!.reason).toContain('“KM-ABD”, the entry says “KM-ABC”')
    expect(findings[1]!.reason).toContain('“A7”')
    expect(findings[2]!.reason).toContain('“15m”, the entry says “Standard”')
  })

  it('only advises on a near miss in the pilot’s name or glider type', () => {
    const findings = run(file({ pilot: 'Holmqvist Linnea', gliderType: 'Tarn 18' }))
    expect(findings.map(f => [f.severity, f.reason.includes('pilot') ? 'pilot' : 'type'])).toEqual([['advisory', 'pilot'], ['advisory', 'type']])
  })

  it('accepts diacritics and a maker’s name in front of the type', () => {
    expect(run(file({ pilot: 'Linnéa Holmquist', gliderType: 'Moorworks Tarn 15' }))).toEqual([])
  })

  it('checks the latest file of each recorder only', () => {
    const old = file({ id: 'old', flightDate: '2027-04-01', gliderId: 'WRONG' })
    expect(declarationMatchesEntry.run(ctx(dossier({ igcFiles: [old, file()] })))).toEqual([])
  })
})

describe('declaration.recent (Gridmark rule)', () => {
  const run = (flightDate: string) => declarationRecent.run(ctx(dossier({ igcFiles: [file({ flightDate })] })))

  it('passes a file dated within 365 days before the first contest day (2027-07-12)', () => {
    expect(run('2026-07-12')).toEqual([])
  })

  it('advises on a file dated 366 days before', () => {
    const [f] = run('2026-07-11')
    expect(f).toMatchObject({ severity: 'advisory', unitId: 'fr-1' })
    expect(f!.reason).toContain('dated 2026-07-11')
  })

  it('has nothing to say about a recorder with no file', () => {
    expect(declarationRecent.run(ctx(dossier({ units: [recorder()] })))).toEqual([])
  })
})
