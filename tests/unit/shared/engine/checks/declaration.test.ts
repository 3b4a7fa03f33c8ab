import { describe, expect, it } from 'vitest'
import { declarationMatchesEntry, declarationRecent } from '#shared/engine/checks/declaration'
import type { EngineIgcFile } from '#shared/engine/types'
import { ctx, dossier, recorder } from '../builders'

// The specification's worked example (Appendix A, A9.2) is read through Gridmark's own parser,
// and its declaration checked against an entry, in tests/unit/server/domain/files/igc-header.test.ts.

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

  it('blocks a wrong glider ID or competition ID, and advises on a class spelled otherwise, each with both values', () => {
    const findings = run(file({ gliderId: 'KM-ABD', competitionId: 'A7', competitionClass: '15m' }))
    expect(findings.map(f => f.severity)).toEqual(['blocking', 'blocking', 'advisory'])
    expect(findings[0]!.reason).toContain('“KM-ABD”, the entry says “KM-ABC”')
    expect(findings[1]!.reason).toContain('“A7”')
    expect(findings[2]!.reason).toContain('“15m”, the entry says “Standard”')
    // Correcting a declaration is work on the recorder: the caution goes with it.
    expect(findings.every(f => f.caution)).toBe(true)
  })

  it('reads a co-pilot “NIL” in any case as no co-pilot (common practice), and advises on a co-pilot the entry does not have', () => {
    expect(run(file({ copilot: 'Nil' }))).toEqual([])
    expect(run(file({ copilot: 'nil' }), { copilotName: 'Rowan Ashdown' })[0]!.reason).toContain('names no co-pilot')
    const [f] = run(file({ copilot: 'Rowan Ashdown' }))
    expect(f).toMatchObject({ severity: 'advisory' })
    expect(f!.reason).toContain('“Rowan Ashdown”; the entry has none')
  })

  it('checks the latest file uploaded without a recorder against the entry too', () => {
    const loose = file({ id: 'loose', unitId: null, filename: 'flight.igc', competitionId: 'Z9' })
    const [f] = run(loose)
    expect(f).toMatchObject({ severity: 'blocking', subject: 'igc:loose' })
    expect(f!.reason).toContain('The IGC file “flight.igc” (no recorder named) declares the competition ID “Z9”')
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
