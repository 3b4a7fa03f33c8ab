// The checks a scrutineering team adds to the first catalogue, each with the source of its rule
// or value beside it.
import { describe, expect, it } from 'vitest'
import { HARDWARE_CAUTION } from '#shared/engine/caution'
import { ballastClassRule } from '#shared/engine/checks/ballast'
import { collisionWarningPresent } from '#shared/engine/checks/collision-warning'
import { ENGINE_RECORDING_CODES, motorGliderEngineRecording } from '#shared/engine/checks/motor-glider'
import { firmwareKey, recorderIdentity, recorderIdMatches, recorderIgcFile } from '#shared/engine/checks/recorders'
import { spanClassLimit } from '#shared/engine/checks/span'
import { massClassLimit } from '#shared/engine/checks/mass'
import { cgWithinLimits } from '#shared/engine/checks/cg'
import { takeOffMass } from '#shared/engine/weigh-in'
import type { WeighInRecord } from '#shared/engine/types'
import { collisionWarning, competition, ctx, dossier, igcFile, recorder } from '../builders'

describe('span.class-limit (FAI Sporting Code Section 3 ch. 7.7: Standard “must not exceed 15,000 mm”, 18 Metre 18,000 mm)', () => {
  it('passes 15.00 m in the Standard class and blocks 15.01 m, with both values', () => {
    expect(spanClassLimit.run(ctx(dossier({}, { spanM: 15 })))).toEqual([])
    const [f] = spanClassLimit.run(ctx(dossier({}, { spanM: 15.01 })))
    expect(f).toMatchObject({ checkId: 'span.class-limit', severity: 'blocking' })
    expect(f!.reason).toContain('span of 15.01 m; the Standard class allows at most 15.00 m')
  })

  it('blocks an 18 m glider entered in the Standard class, and passes it in the 18 Metre class', () => {
    expect(spanClassLimit.run(ctx(dossier({}, { spanM: 18 })))).toHaveLength(1)
    expect(spanClassLimit.run(ctx(dossier({}, { spanM: 18, classCode: '18m', className: '18 Metre' })))).toEqual([])
  })

  it('has no limit in the Open class (“No special rules”) or where the competition sets none', () => {
    expect(spanClassLimit.run(ctx(dossier({}, { spanM: 26.5, classCode: 'open', className: 'Open' }), competition({}, { classLimits: {} })))).toEqual([])
    expect(spanClassLimit.run(ctx(dossier({}, { spanM: 16, classCode: 'club', className: 'Club' })))).toEqual([])
  })

  it('falls back to the FAI default (13.5 Metre: 13,500 mm, a secondary source)', () => {
    const comp = competition({}, { classLimits: {} })
    expect(spanClassLimit.run(ctx(dossier({}, { spanM: 13.8, classCode: '13.5m', className: '13.5 Metre' }), comp))).toHaveLength(1)
  })
})

describe('ballast.class-rule (FAI Sporting Code Section 3 Annex A: the Club class flies without water ballast)', () => {
  const club = { classCode: 'club', className: 'Club', mtomKg: null }
  const check = (result: string) => ({ day: '2027-07-12', outcome: 'fail' as const, answers: [{ itemId: 'water-ballast-empty', result }] })

  it('blocks when the grid check finds water ballast aboard, with the caution', () => {
    const [f] = ballastClassRule.run(ctx(dossier({ gridCheck: check('fail') }, club)))
    expect(f).toMatchObject({ severity: 'blocking', caution: HARDWARE_CAUTION })
    expect(f!.reason).toContain('found water ballast aboard; the Club class flies without water ballast')
  })

  it('passes tanks found empty, or the item not checked', () => {
    expect(ballastClassRule.run(ctx(dossier({ gridCheck: check('pass') }, club)))).toEqual([])
    expect(ballastClassRule.run(ctx(dossier({ gridCheck: check('not-checked') }, club)))).toEqual([])
  })

  it('blocks a weigh-in that declares water ballast in such a class', () => {
    const w: WeighInRecord = { weighedOn: '2027-07-12', units: 'kg-m', readings: [{ point: 'main-wheel', weight: 300, arm: 0.2 }], declaredBallastKg: 40 }
    expect(ballastClassRule.run(ctx(dossier({ weighIns: [w] }, club)))[0]!.reason).toContain('declares 40.0 kg of water ballast')
  })

  it('says nothing in a class that carries water ballast', () => {
    expect(ballastClassRule.run(ctx(dossier({ gridCheck: check('fail') })))).toEqual([])
  })
})

describe('recorder.igc-file (IGC GNSS FR specification: the declaration is written to the IGC file; common practice)', () => {
  it('blocks a declared recorder without a current IGC file', () => {
    const [f] = recorderIgcFile.run(ctx(dossier({ igcFiles: [] })))
    expect(f).toMatchObject({ severity: 'blocking', unitId: 'fr-1', caution: HARDWARE_CAUTION })
    expect(f!.reason).toContain('No IGC file from the Plover FR-2 (serial FR7300) is uploaded')
  })

  it('asks which recorder a file uploaded without one came from, and points the blocked recorder at it', () => {
    const loose = igcFile({ id: 'loose', unitId: null, filename: 'flight.igc' })
    const findings = recorderIgcFile.run(ctx(dossier({ igcFiles: [loose] })))
    expect(findings.map(f => f.severity)).toEqual(['blocking', 'advisory'])
    expect(findings[0]!.reason).toContain('The file “flight.igc” (no recorder named) is on the entry without a recorder named')
    expect(findings[1]).toMatchObject({ subject: 'igc:loose' })
  })

  it('passes every recorder with its file', () => {
    expect(recorderIgcFile.run(ctx(dossier()))).toEqual([])
  })
})

describe('recorder.identity (IGC GNSS FR specification Appendix A: A record “AXXXABC”, A3.1; HFRFW, A3.3.1 — 2008 edition numbering)', () => {
  it('matches a declared six-character ID written with a dash, or the serial id alone', () => {
    expect(recorderIdMatches('XPL-FR7', 'XPLFR7')).toBe(true)
    expect(recorderIdMatches('fr7', 'XPLFR7')).toBe(true)
    expect(recorderIdMatches('XPLFR8', 'XPLFR7')).toBe(false)
    expect(recorderIdentity.run(ctx(dossier()))).toEqual([])
  })

  it('advises on a file from another recorder, with both identities', () => {
    const [f] = recorderIdentity.run(ctx(dossier({ igcFiles: [igcFile({ recorderId: 'XPLZZ9' })] })))
    expect(f).toMatchObject({ severity: 'advisory', unitId: 'fr-1' })
    expect(f!.reason).toContain('comes from recorder XPL-ZZ9, but the Plover FR-2 is declared with IGC recorder ID XPL-FR7')
  })

  it('asks for the IGC recorder ID where none is entered', () => {
    const [f] = recorderIdentity.run(ctx(dossier({ units: [collisionWarning(), recorder({ igcRecorderId: null })] })))
    expect(f!.fixHint).toContain('XPL-FR7')
  })

  it('advises on a firmware version other than the declared one, ignoring case and a leading “v”', () => {
    expect(firmwareKey('V 2.08')).toBe(firmwareKey('2.08'))
    const [f] = recorderIdentity.run(ctx(dossier({ igcFiles: [igcFile({ firmwareVersion: '2.10' })] })))
    expect(f!.reason).toContain('written by firmware 2.10; the Plover FR-2 is declared with firmware 2.08')
  })
})

describe('collision-warning.present (competition rules, on by default; common practice)', () => {
  it('blocks an entry without a collision-warning unit while the rule is on', () => {
    const [f] = collisionWarningPresent.run(ctx(dossier({ units: [recorder()] })))
    expect(f).toMatchObject({ severity: 'blocking', caution: HARDWARE_CAUTION })
  })

  it('says nothing when the competition turns the rule off, or a unit is declared', () => {
    expect(collisionWarningPresent.run(ctx(dossier({ units: [recorder()] }), competition({ collisionWarningRequired: false })))).toEqual([])
    expect(collisionWarningPresent.run(ctx(dossier()))).toEqual([])
  })
})

describe('motor-glider.engine-recording (IGC GNSS FR specification Appendix A: I record A3.4, three-letter codes A7 — ENL, RPM; MOP from the 2010 edition; CUR from memory)', () => {
  const motor = { motorGlider: 'sustainer' as const }

  it('passes a motor glider whose file’s I record declares ENL, MOP, RPM or CUR', () => {
    for (const code of ENGINE_RECORDING_CODES) {
      expect(motorGliderEngineRecording.run(ctx(dossier({ igcFiles: [igcFile({ extensions: ['FXA', code] })] }, motor))), code).toEqual([])
    }
  })

  it('blocks one whose file records fix accuracy and satellites only, naming what it records', () => {
    const [f] = motorGliderEngineRecording.run(ctx(dossier({}, motor)))
    expect(f).toMatchObject({ severity: 'blocking', caution: HARDWARE_CAUTION })
    expect(f!.reason).toContain('sustainer motor glider, but no current IGC file shows that engine use is recorded: its I record lists FXA, SIU, none of ENL, MOP, RPM, CUR.')
  })

  it('blocks one with no IGC file at all, and says nothing of a pure glider', () => {
    expect(motorGliderEngineRecording.run(ctx(dossier({ igcFiles: [] }, { motorGlider: 'electric' })))[0]!.reason).toContain('no IGC file is uploaded')
    expect(motorGliderEngineRecording.run(ctx(dossier({ igcFiles: [] }, { motorGlider: 'none' })))).toEqual([])
  })
})

// The loaded CG by the weight-and-balance handbook's method (FAA-H-8083-1, Aircraft Weight and
// Balance Handbook, ch. 2 of the 8083-1A edition, 2007: moment = weight × arm, CG = total moment
// ÷ total weight, each item of the useful load at its own arm). The numbers are our own.
describe('take-off mass and CG with the people aboard (FAA-H-8083-1 method)', () => {
  const readings = [{ point: 'main-wheel' as const, weight: 300, arm: 0.1 }, { point: 'tail-wheel' as const, weight: 20, arm: 4.5 }]
  // Glider 320 kg at (300·0.1 + 20·4.5)/320 = 120/320 = 0.375 m.

  it('adds the pilot with parachute at the seat arm: 320 + 85 = 405 kg, CG (120 − 85·1.2)/405 = 0.0444 m', () => {
    const t = takeOffMass({ readings }, { pilotMassKg: 85, pilotArmM: -1.2 })
    expect(t.terms.map(x => [x.term, x.massKg])).toEqual([['glider', 320], ['pilot', 85]])
    expect(t.massKg).toBe(405)
    expect(t.cgArmM).toBeCloseTo((120 - 102) / 405, 6)
  })

  it('adds declared ballast and the co-pilot, each at its arm', () => {
    const t = takeOffMass({ readings, declaredBallastKg: 100 }, { pilotMassKg: 80, pilotArmM: -1.5, copilotMassKg: 70, copilotArmM: -0.6, ballastArmM: 0.3 })
    expect(t.massKg).toBe(570)
    expect(t.cgArmM).toBeCloseTo((120 + 30 - 120 - 42) / 570, 6)
  })

  it('computes no CG while a term with mass has no arm, and says which', () => {
    const t = takeOffMass({ readings }, { pilotMassKg: 85 })
    expect(t.cgArmM).toBeNull()
    expect(t.armsMissing).toEqual(['pilot'])
  })

  it('the CG check reads the take-off CG: the pilot ahead of the datum moves it forward of the limit', () => {
    const w: WeighInRecord = { weighedOn: '2027-07-12', units: 'kg-m', readings }
    const limits = { cgForwardLimitM: 0.1, cgAftLimitM: 0.4 }
    expect(cgWithinLimits.run(ctx(dossier({ weighIns: [w] }, limits)))).toEqual([]) // glider alone: 0.375 m
    expect(cgWithinLimits.run(ctx(dossier({ weighIns: [w] }, { ...limits, pilotMassKg: 85, pilotArmM: -1.2 })))[0]!.reason).toContain('take-off CG is 0.044 m')
  })

  it('flags a weigh-in without the pilot’s recorded mass (advisory): it counts the glider only', () => {
    const w: WeighInRecord = { weighedOn: '2027-07-12', units: 'kg-m', readings }
    const [f] = massClassLimit.run(ctx(dossier({ weighIns: [w] })))
    expect(f).toMatchObject({ severity: 'advisory' })
    expect(f!.reason).toContain('counts the glider only')
  })
})
