import { describe, expect, it } from 'vitest'
import { HARDWARE_CAUTION } from '#shared/engine/caution'
import { recorderPresent } from '#shared/engine/checks/recorders'
import { collisionWarning, competition, ctx, dossier, recorder } from '../builders'

describe('recorder.present (FAI Sporting Code Section 3 Annex B 4.1.1: the three IGC approval levels; the FAI page of approved recorders cites it)', () => {
  it('passes one recorder of an accepted level', () => {
    expect(recorderPresent.run(ctx(dossier()))).toEqual([])
  })

  it('blocks an entry with no flight recorder, with the caution (fitting a unit is hardware work)', () => {
    const [f] = recorderPresent.run(ctx(dossier({ units: [collisionWarning()] })))
    expect(f).toMatchObject({ severity: 'blocking', caution: HARDWARE_CAUTION })
    expect(f!.reason).toContain('No flight recorder is declared')
  })

  it('blocks a recorder of a level the competition does not accept, naming it', () => {
    const [f] = recorderPresent.run(ctx(dossier({ units: [recorder({ approvalLevel: 'badges-up-to-gold' })] })))
    expect(f!.reason).toContain('badges up to gold')
  })

  it('blocks one recorder where the competition requires two', () => {
    const comp = competition({ recordersRequired: 2 })
    expect(recorderPresent.run(ctx(dossier(), comp))[0]!.reason).toContain('requires 2')
    expect(recorderPresent.run(ctx(dossier({ units: [recorder(), recorder({ id: 'fr-2', serial: 'FR9100' })] }), comp))).toEqual([])
  })
})
