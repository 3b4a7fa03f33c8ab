import { existsSync, readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { CATALOGUE } from '#shared/engine/catalogue'
import { buildField } from '#shared/engine/field'
import { evaluate, evaluateAll } from '#shared/engine/evaluate'
import { competitionRulesSchema } from '#shared/schemas/competition'
import type { Dossier, EngineUnit } from '#shared/engine/types'
import { DEMO_COMPETITION } from '../../../../seeds/demo-data'
import { DEMO_ENTRIES, DEMO_FIRMWARE, DEMO_WEIGH_IN, SEEDED_PROBLEMS } from '../../../../seeds/demo-entries'
import { competition, dossier, fieldOf, igcFile } from './builders'

// The product design sits beside the repository (../shared/DESIGN.md) where it is checked out.
const DESIGN = new URL('../../../../../shared/DESIGN.md', import.meta.url)

describe('the catalogue', () => {
  // The design's table runs ahead of the code (it lists checks still to be built, at its end):
  // every check built is in it, in its order.
  it.skipIf(!existsSync(DESIGN))('holds only checks of DESIGN.md, section "Checks", in its order', () => {
    const design = readFileSync(DESIGN, 'utf8')
    const ids = [...design.matchAll(/^\| `([a-z.-]+)` \|/gm)].map(m => m[1])
    expect(ids.slice(0, CATALOGUE.length)).toEqual(CATALOGUE.map(c => c.id))
  })

  it('gives each check an id, severity, source and rule text, and no id twice', () => {
    for (const c of CATALOGUE) {
      expect(c.source.length, c.id).toBeGreaterThan(5)
      expect(c.rule.length, c.id).toBeGreaterThan(10)
      expect(['blocking', 'advisory', 'blocking / advisory']).toContain(c.severity)
    }
    expect(new Set(CATALOGUE.map(c => c.id)).size).toBe(CATALOGUE.length)
  })
})

describe('evaluate', () => {
  it('finds nothing on a dossier in order', () => {
    const d = dossier()
    expect(evaluate(d, competition(), fieldOf(d))).toEqual([])
  })

  it('evaluates a whole competition against one field (evaluateAll)', () => {
    const a = dossier({}, { id: 'a', compId: 'K7' })
    const b = dossier({}, { id: 'b', compId: 'K7' })
    const all = evaluateAll([a, b], competition())
    expect([...all.keys()]).toEqual(['a', 'b'])
    expect(all.get('a')!.map(f => f.checkId)).toContain('competition-id.unique')
  })

  it('lists findings in catalogue order, each with the severity its check declares', () => {
    const d = dossier({ payment: { status: 'unpaid' }, units: [] })
    const findings = evaluate(d, competition(), fieldOf(d))
    expect(findings.map(f => f.checkId)).toEqual(['recorder.present', 'entry.paid', 'collision-warning.present'])
    for (const f of findings) {
      const check = CATALOGUE.find(c => c.id === f.checkId)!
      if (check.severity !== 'blocking / advisory') expect(f.severity).toBe(check.severity)
      expect(f.reason.length).toBeGreaterThan(10)
      expect(f.fixHint.length).toBeGreaterThan(10)
    }
  })
})

// The demo field as the server will feed it: each seeded problem must show as its finding.
// Documents are not seeded yet, so every dossier gets the required documents accepted here.
describe('the seeded demo problems (seeds/demo-entries.ts)', () => {
  const comp = competition(competitionRulesSchema.parse(DEMO_COMPETITION.rules), {
    firstContestDay: DEMO_COMPETITION.firstContestDay,
    lastContestDay: DEMO_COMPETITION.lastContestDay,
    firmwareCatalogue: DEMO_FIRMWARE.map(r => ({ ...r })),
  })
  const classNames: Record<string, string> = Object.fromEntries(DEMO_COMPETITION.classes.map(c => [c.code, c.name]))
  const dossiers: Dossier[] = DEMO_ENTRIES.map((e, i) => {
    const units = e.units.map((u, j): EngineUnit => u.kind === 'collision-warning'
      ? { id: `${e.compId}-u${j}`, kind: 'collision-warning', model: u.model, serial: u.serial, radioId: u.radioId ?? null, firmwareVersion: u.firmwareVersion, firmwareExpiresOn: u.firmwareExpiresOn ?? null, firmwareUpdatedOn: u.firmwareUpdatedOn ?? null }
      : { id: `${e.compId}-u${j}`, kind: 'flight-recorder', model: u.model, serial: u.serial, firmwareVersion: u.firmwareVersion, approvalLevel: u.approvalLevel ?? null, igcRecorderId: u.igcRecorderId ?? null })
    // The IGC files as seeds/demo-files.ts writes them: one per recorder (not S2's second), G5's
    // with another glider ID and competition ID, L8's recording engine noise.
    const igcFiles = e.units.flatMap((u, j) => u.kind !== 'flight-recorder' || u.noIgcFile
      ? []
      : [igcFile({
          id: `${e.compId}-igc${j}`, unitId: `${e.compId}-u${j}`, recorderId: u.igcRecorderId, firmwareVersion: u.firmwareVersion,
          extensions: e.compId === 'L8' ? ['FXA', 'SIU', 'ENL'] : ['FXA', 'SIU'], flightDate: e.compId === 'G5' ? '2027-05-29' : '2027-05-14',
          pilot: e.pilotName, copilot: e.copilotName ?? null, gliderType: e.gliderType, gliderId: e.compId === 'G5' ? 'KM-ZZQ' : e.registration, competitionId: e.compId === 'G5' ? 'G6' : e.compId,
          competitionClass: classNames[e.classCode]!,
        })])
    const weighIns = e.compId === DEMO_WEIGH_IN.compId ? [{ id: 'w-p6', weighedOn: DEMO_WEIGH_IN.weighedOn, units: 'kg-m' as const, readings: DEMO_WEIGH_IN.readings.map(r => ({ ...r })) }] : []
    return dossier({ units, igcFiles, weighIns, payment: { status: e.paymentStatus } }, {
      id: `entry-${i}`, compId: e.compId, registration: e.registration, gliderType: e.gliderType, pilotName: e.pilotName,
      copilotName: e.copilotName ?? null, className: classNames[e.classCode]!, classCode: e.classCode, status: e.status, mtomKg: e.mtomKg,
      spanM: e.spanM, motorGlider: e.motorGlider, pilotMassKg: e.pilotMassKg ?? null, copilotMassKg: e.copilotMassKg ?? null,
    })
  })
  const field = buildField(dossiers)
  const findingsOf = (compId: string) => evaluate(dossiers.find(d => d.entry.compId === compId)!, comp, field)
  const ids = (compId: string) => findingsOf(compId).map(f => `${f.severity} ${f.checkId}`)

  it('K7: firmware expiring during the contest blocks', () => {
    expect(ids('K7')).toEqual(['blocking firmware.valid-through-contest'])
    expect(findingsOf('K7')[0]!.reason).toContain('expires 2027-07-15, the last contest day is 2027-07-18')
  })
  it('T3: firmware expiring soon after the contest advises', () => expect(ids('T3')).toEqual(['advisory firmware.expires-soon']))
  it('B2 and M5: the duplicate radio ID blocks both', () => {
    expect(ids('B2')).toEqual(['blocking radio-id.unique'])
    expect(ids('M5')).toEqual(['blocking radio-id.unique'])
  })
  it('F9: unpaid blocks', () => expect(ids('F9')).toEqual(['blocking entry.paid']))
  it('R4: no flight recorder blocks', () => expect(ids('R4')).toEqual(['blocking recorder.present']))
  it('H8: firmware not updated in a year advises', () => expect(ids('H8')).toEqual(['advisory firmware.yearly-update']))
  it('G5: the IGC file declares another glider ID and competition ID', () => {
    expect(ids('G5')).toEqual(['blocking declaration.matches-entry', 'blocking declaration.matches-entry'])
  })
  it('D6: an 18 m span in the Standard class blocks (15 m, FAI Sporting Code Section 3 ch. 7.7)', () => {
    expect(ids('D6')).toEqual(['blocking span.class-limit'])
    expect(findingsOf('D6')[0]!.reason).toContain('span of 18.00 m; the Standard class allows at most 15.00 m')
  })
  it('E2: a sustainer whose IGC file records no engine use blocks', () => expect(ids('E2')).toEqual(['blocking motor-glider.engine-recording']))
  it('S2: a recorder without an IGC file blocks', () => expect(ids('S2')).toEqual(['blocking recorder.igc-file']))
  it('N1: no collision-warning unit blocks', () => expect(ids('N1')).toEqual(['blocking collision-warning.present']))
  it('P6: the weigh-in with the pilot aboard is over the class limit and the flight manual’s MTOM', () => {
    expect(ids('P6')).toEqual(['blocking mass.class-limit', 'blocking mass.flight-manual'])
    expect(findingsOf('P6')[0]!.reason).toContain('543.0 kg (452.0 kg on the scales + pilot with parachute 91.0 kg)')
  })

  it('finds nothing else on the active entries', () => {
    const active = dossiers.filter(d => d.entry.status !== 'withdrawn' && d.entry.status !== 'rejected' && !(d.entry.compId in SEEDED_PROBLEMS))
    const unpaid = active.filter(d => d.payment.status !== 'paid').map(d => d.entry.compId)
    for (const d of active) {
      const expected = unpaid.includes(d.entry.compId) ? ['entry.paid'] : []
      expect(evaluate(d, comp, field).map(f => f.checkId), d.entry.compId).toEqual(expected)
    }
  })
})
