import { describe, expect, it } from 'vitest'
import { DEFAULT_RULES } from '../../../../shared/schemas/competition'
import { entryProgress, type ProgressInput } from '../../../../shared/utils/entry-progress'

const complete: ProgressInput['entry'] = {
  status: 'draft',
  pilotName: 'Erin Entrant',
  pilotNationality: 'GB',
  pilotLicenceNumber: 'GBR.FCL.1',
  pilotPhone: '+44 1',
  emergencyContact: 'Pat',
  gliderType: 'Kestrel Test 15',
  registration: 'G-KTST',
  compId: 'KT',
  spanM: 15,
  mtomKg: 525,
  emptyMassKg: 255,
}
const cw = { id: 'u1', kind: 'collision-warning', model: 'CW-2', serial: 'C1' }
const fr = { id: 'u2', kind: 'flight-recorder', model: 'Logger', serial: 'F1', approvalLevel: 'all-flights' }
const allDocs = DEFAULT_RULES.requiredDocumentKinds.map(kind => ({ kind, status: 'accepted' }))

function progress(over: Partial<ProgressInput> = {}) {
  return entryProgress({
    entry: complete,
    units: [cw, fr],
    rules: DEFAULT_RULES,
    documents: allDocs,
    igcFiles: [{ unitId: 'u2' }],
    paymentStatus: 'paid',
    ...over,
  })
}

describe('entryProgress', () => {
  it('has nothing missing for a complete, paid draft and says to submit it', () => {
    expect(progress()).toEqual({ missing: [], submittable: true, nextStep: 'Submit the entry so the organiser can review it.', open: { pilot: 0, inReview: 0, actor: null } })
  })

  it('lists empty required fields and missing units as blocking, in form order', () => {
    const p = progress({ entry: { ...complete, pilotPhone: '  ', spanM: null }, units: [] })
    expect(p.submittable).toBe(false)
    expect(p.missing.filter(m => m.blocksSubmit).map(m => m.text)).toEqual([
      'Enter the pilot’s phone number.',
      'Enter the glider’s span.',
      'Add the collision-warning unit.',
      'Add a flight recorder.',
    ])
    expect(p.nextStep).toBe('Complete the entry, then submit it. Next: Enter the pilot’s phone number.')
  })

  it('counts recorders against the competition’s requirement', () => {
    const p = progress({ rules: { ...DEFAULT_RULES, recordersRequired: 2 } })
    expect(p.missing.map(m => m.text)).toEqual(['Add one more flight recorder: this competition requires 2.'])
    const none = progress({ units: [cw], igcFiles: [], rules: { ...DEFAULT_RULES, recordersRequired: 2 } })
    expect(none.missing.map(m => m.text)).toEqual(['Add 2 flight recorders: this competition requires 2.'])
  })

  it('asks for documents, a new upload of a rejected one, each recorder’s IGC file and the fee — none of them blocking submit', () => {
    const p = progress({
      documents: [{ kind: 'airworthiness', status: 'rejected' }, { kind: 'insurance', status: 'pending' }, { kind: 'licence', status: 'accepted' }],
      igcFiles: [],
      paymentStatus: 'unpaid',
    })
    expect(p.submittable).toBe(true)
    expect(p.missing.map(m => [m.text, m.blocksSubmit])).toEqual([
      ['Your airworthiness review was rejected: upload a new one.', false],
      ['Upload the medical.', false],
      ['Upload a recent IGC file from recorder Logger (F1).', false],
      ['Pay the entry fee.', false],
    ])
  })

  it('flags a recorder whose approval level the competition does not accept', () => {
    const p = progress({ units: [cw, { ...fr, approvalLevel: 'not-approved' }] })
    expect(p.missing.map(m => m.text)).toEqual(['Recorder Logger (F1) has an approval level this competition does not accept: fit an approved recorder.'])
  })

  it('words the next step for each status', () => {
    expect(progress({ entry: { ...complete, status: 'submitted' }, paymentStatus: 'unpaid' }).nextStep)
      .toBe('Wait for the organiser to accept the entry. Meanwhile: Pay the entry fee.')
    expect(progress({ entry: { ...complete, status: 'submitted' } }).nextStep).toBe('Wait for the organiser to accept the entry.')
    expect(progress({ entry: { ...complete, status: 'rejected', decisionReason: 'Wrong class.' } }).nextStep)
      .toBe('The organiser rejected the entry with the reason “Wrong class.”. Put it right, then submit it again.')
    expect(progress({ entry: { ...complete, status: 'accepted' } }).nextStep).toBe('The entry is accepted and nothing blocks. Bring the glider to scrutineering.')
    // A blocking finding is the pilot's next step, never "complete"; a document in review is not theirs.
    const k7 = { checkId: 'firmware.valid-through-contest', severity: 'blocking' as const, reason: 'The firmware expires 2027-07-15.', fixHint: 'Update the firmware, then enter the new version and expiry date.' }
    const inReview = { checkId: 'documents.required', severity: 'blocking' as const, awaiting: 'review' as const, reason: 'The insurance document is waiting for a scrutineer’s review.', fixHint: 'Nothing for the pilot to do.' }
    expect(progress({ entry: { ...complete, status: 'accepted' }, findings: [k7] }).nextStep).toBe('The entry is accepted, but 1 finding keeps the glider from flying. Put right first: Update the firmware, then enter the new version and expiry date.')
    // G5's case: the director waived the finding for the open day; the next step agrees with "Ready".
    const waiver = { kind: 'waiver' as const, day: '2027-07-13', checkId: 'firmware.valid-through-contest' }
    expect(progress({ entry: { ...complete, status: 'accepted' }, findings: [k7], day: '2027-07-13', actions: [waiver] }).nextStep)
      .toBe('The entry is accepted and nothing blocks today: the contest director waived 1 finding (see Findings). Put it right before the waiver ends: Update the firmware, then enter the new version and expiry date.')
    expect(progress({ entry: { ...complete, status: 'accepted' }, findings: [inReview] })).toMatchObject({
      nextStep: 'The entry is accepted. One document waits for a scrutineer’s review; nothing for you to do there.',
      open: { pilot: 0, inReview: 1, actor: 'office' },
    })
    expect(progress({ entry: { ...complete, status: 'accepted' }, paymentStatus: 'unpaid' }).nextStep).toBe('The entry is accepted. Before the event: Pay the entry fee.')
    const withdrawn = progress({ entry: { ...complete, status: 'withdrawn' }, paymentStatus: 'unpaid' })
    expect(withdrawn).toMatchObject({ missing: [], nextStep: 'This entry is withdrawn. Nothing more to do.' })
  })
})
