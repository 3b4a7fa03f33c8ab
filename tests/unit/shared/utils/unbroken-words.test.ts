// Dates and registrations in a reason stay whole on the wall: split into runs, hyphenated
// words marked to be kept on one line, the text itself unchanged.
import { describe, expect, it } from 'vitest'
import { unbrokenRuns } from '../../../../shared/utils/unbroken-words'

describe('unbrokenRuns', () => {
  it('marks ISO dates and hyphenated registrations, and keeps every character', () => {
    const reason = 'The firmware of the collision-warning unit of D-1234 expires 2027-07-09, the last contest day is 2027-07-17.'
    const runs = unbrokenRuns(reason)
    expect(runs.map(r => r.text).join('')).toBe(reason)
    expect(runs.filter(r => r.keep).map(r => r.text)).toEqual(['collision-warning', 'D-1234', '2027-07-09', '2027-07-17'])
    expect(runs[0]).toEqual({ text: 'The firmware of the ', keep: false })
    expect(runs.at(-1)).toEqual({ text: '.', keep: false })
  })

  it('leaves text without hyphenated words as one run, and an empty text as none', () => {
    expect(unbrokenRuns('Held: see the director.')).toEqual([{ text: 'Held: see the director.', keep: false }])
    expect(unbrokenRuns('')).toEqual([])
    // A dash between words with spaces around it is not a hyphenated word.
    expect(unbrokenRuns('Held - wing pins').every(r => !r.keep)).toBe(true)
  })
})
