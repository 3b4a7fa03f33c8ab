// The one status every screen says (shared/utils/entry-verdict.ts), over every combination of
// findings the pilot must fix, documents in review, waivers (for the day and the competition),
// the director's hold and the day's grid check.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import type { DirectorAction, Finding } from '#shared/engine'
import { entryVerdict } from '#shared/utils/entry-verdict'

const DAY = '2027-07-13'
const firmware: Finding = { checkId: 'firmware.valid-through-contest', severity: 'blocking', unitId: 'cw', reason: 'The firmware expires during the contest.', fixHint: 'Update the firmware.' }
const review: Finding = { checkId: 'documents.required', severity: 'blocking', subject: 'document:insurance', awaiting: 'review', reason: 'The insurance document is waiting for a scrutineer’s review.', fixHint: 'Nothing for the pilot to do.' }
const soon: Finding = { checkId: 'firmware.expires-soon', severity: 'advisory', unitId: 'cw', reason: 'Expires soon after.', fixHint: 'Update soon.' }
const declaration: Finding = { checkId: 'declaration.matches-entry', severity: 'blocking', unitId: 'fr', reason: 'Another glider ID.', fixHint: 'Declare again.' }
const waiveToday: DirectorAction = { kind: 'waiver', day: DAY, checkId: 'declaration.matches-entry' }
const waiveAlways: DirectorAction = { kind: 'waiver', day: null, checkId: 'declaration.matches-entry' }
const hold: DirectorAction = { kind: 'hold', day: DAY, reason: 'Canopy lock' }
const passed = { day: DAY, outcome: 'pass' as const }
const failed = { day: DAY, outcome: 'fail' as const }

describe('entryVerdict', () => {
  it('puts the pilot first when a blocking finding is theirs, naming it', () => {
    const v = entryVerdict({ status: 'accepted', findings: [firmware, review, soon] })
    expect(v).toMatchObject({ actor: 'pilot', pilot: [firmware], inReview: [review], advisory: [soon] })
    expect(v.summary).toBe('1 finding for the pilot to put right: The firmware expires during the contest.')
  })

  it('waits on the office, not the pilot, when only documents in review block', () => {
    const v = entryVerdict({ status: 'accepted', findings: [review], day: DAY, gridCheck: passed })
    expect(v).toMatchObject({ actor: 'office', pilot: [], readiness: 'held' })
    expect(v.summary).toContain('Waiting for the office')
  })

  it('shows a day’s waiver as waived on that day only, and a competition waiver always', () => {
    expect(entryVerdict({ status: 'accepted', findings: [declaration], actions: [waiveToday], day: DAY, gridCheck: passed })).toMatchObject({ waived: [declaration], pilot: [], readiness: 'ready', actor: null })
    expect(entryVerdict({ status: 'accepted', findings: [declaration], actions: [waiveToday] })).toMatchObject({ waived: [], pilot: [declaration], actor: 'pilot' })
    expect(entryVerdict({ status: 'accepted', findings: [declaration], actions: [waiveAlways] })).toMatchObject({ waived: [declaration], pilot: [] })
  })

  it('lets the director’s hold decide, then a failed grid check, then an unchecked day', () => {
    expect(entryVerdict({ status: 'accepted', findings: [], actions: [hold], day: DAY, gridCheck: passed })).toMatchObject({ actor: 'director', held: true, readiness: 'held' })
    expect(entryVerdict({ status: 'accepted', findings: [], day: DAY, gridCheck: failed, failedItem: 'Antennas fitted' })).toMatchObject({ actor: 'scrutineer', gridFailed: true, readiness: 'held' })
    expect(entryVerdict({ status: 'accepted', findings: [], day: DAY, gridCheck: failed, failedItem: 'Antennas fitted' }).summary).toContain('(Antennas fitted)')
    expect(entryVerdict({ status: 'accepted', findings: [], day: DAY })).toMatchObject({ actor: 'scrutineer', readiness: 'unchecked' })
    expect(entryVerdict({ status: 'accepted', findings: [soon], day: DAY, gridCheck: passed })).toMatchObject({ actor: null, readiness: 'caution' })
  })

  it('over every combination: the groups split the findings, readiness agrees with the engine, and the actor is the first who must act', () => {
    const finding = fc.constantFrom(firmware, review, soon, declaration)
    const action = fc.constantFrom(waiveToday, waiveAlways, hold, { kind: 'release', day: DAY } as DirectorAction)
    const check = fc.constantFrom(null, passed, failed)
    fc.assert(fc.property(fc.uniqueArray(finding), fc.array(action, { maxLength: 3 }), check, (findings, actions, gridCheck) => {
      const v = entryVerdict({ status: 'accepted', findings, actions, day: DAY, gridCheck })
      // Every finding is in exactly one group.
      const grouped = [...v.pilot, ...v.inReview, ...v.waived, ...v.advisory]
      expect(grouped).toHaveLength(findings.length)
      expect(new Set(grouped)).toEqual(new Set(findings))
      if (v.held) expect(v.actor).toBe('director')
      else if (v.pilot.length) expect(v.actor).toBe('pilot')
      else if (gridCheck?.outcome === 'fail') expect(v.actor).toBe('scrutineer')
      else if (v.inReview.length) expect(v.actor).toBe('office')
      // Ready only when nothing is open and the day's check passed.
      if (v.readiness === 'ready') expect(v.pilot.length + v.inReview.length + v.advisory.length).toBe(0)
      if (v.inReview.length || v.pilot.length) expect(v.readiness === 'ready' || v.readiness === 'caution').toBe(false)
    }))
  })
})
