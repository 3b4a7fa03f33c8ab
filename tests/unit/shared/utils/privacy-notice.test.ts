// The privacy notice's wording as filled from a competition: retention, contact, organisers,
// and the digest an entry records (Gridmark rule: the digest changes whenever the text does).
import { describe, expect, it } from 'vitest'
import {
  competitionNoticeSections, privacyContactOf, privacyNoticeFacts, privacyNoticeVersion, siteNoticeSections,
} from '#shared/utils/privacy-notice'

const competition = { name: 'Curlew Open', airfieldName: 'Curlew Down', firstContestDay: '2027-08-02', lastContestDay: '2027-08-08', settings: {} }
const text = (facts: ReturnType<typeof privacyNoticeFacts>) =>
  competitionNoticeSections(facts).flatMap(s => [...s.paragraphs, ...s.items.map(i => `${i.term}: ${i.text}`)]).join('\n')

describe('privacyNoticeFacts', () => {
  it('takes the retention rule (default 30 days) and counts the deletion day from the last contest day', () => {
    expect(privacyNoticeFacts(competition, ['Rhea Office'])).toMatchObject({ medicalRetentionDays: 30, medicalDeletedAfter: '2027-09-07', supersededRetentionDays: 30, contactEmail: null })
    // Across a month's end and a year's end.
    expect(privacyNoticeFacts({ ...competition, lastContestDay: '2027-12-20', settings: { medicalRetentionDays: 14 } }, []).medicalDeletedAfter).toBe('2028-01-03')
    expect(privacyNoticeFacts({ ...competition, lastContestDay: null }, []).medicalDeletedAfter).toBeNull()
  })

  it('sorts the organisers the same wherever it runs, and reads the contact only when it is an address', () => {
    expect(privacyNoticeFacts(competition, ['Zoe Zed', 'Ada Alder']).organisers).toEqual(['Ada Alder', 'Zoe Zed'])
    expect(privacyContactOf({ privacyContactEmail: 'office@curlew.example' })).toBe('office@curlew.example')
    for (const settings of [null, {}, { privacyContactEmail: null }, { privacyContactEmail: 42 }, { privacyContactEmail: 'nobody' }]) {
      expect(privacyContactOf(settings)).toBeNull()
    }
  })
})

describe('competitionNoticeSections', () => {
  it('names the organisers, the contact and the retention it was given', () => {
    const words = text(privacyNoticeFacts({ ...competition, settings: { privacyContactEmail: 'office@curlew.example', medicalRetentionDays: 10 } }, ['Rhea Office', 'Ned Desk']))
    expect(words).toContain('Curlew Open at Curlew Down, flown from 2 August 2027 to 8 August 2027, is run by its organisers: Ned Desk and Rhea Office.')
    expect(words).toContain('Questions about your data in this competition: office@curlew.example.')
    expect(words).toContain('Kept 10 days after the last contest day, that is until 18 August 2027; then the files are deleted.')
    expect(words).toContain('deleted 30 days after its replacement is accepted')
  })

  it('falls back to the organisers without a contact, to the office without organisers, and says when the last day is not set', () => {
    expect(text(privacyNoticeFacts(competition, ['Rhea Office']))).toContain('ask the organisers (Rhea Office) through the competition office')
    const bare = text(privacyNoticeFacts({ ...competition, firstContestDay: null, lastContestDay: null }, []))
    expect(bare).toContain('is run by its organisers: the competition office.')
    expect(bare).toContain('30 days after the last contest day (the organisers have not set that day yet)')
  })
})

describe('privacyNoticeVersion', () => {
  it('is a SHA-256 digest that stays the same for the same notice and changes with any fact', async () => {
    const facts = privacyNoticeFacts(competition, ['Rhea Office'])
    const version = await privacyNoticeVersion(competitionNoticeSections(facts))
    expect(version).toMatch(/^[0-9a-f]{64}$/)
    expect(await privacyNoticeVersion(competitionNoticeSections(privacyNoticeFacts(competition, ['Rhea Office'])))).toBe(version)
    const others = [
      privacyNoticeFacts({ ...competition, settings: { medicalRetentionDays: 31 } }, ['Rhea Office']),
      privacyNoticeFacts({ ...competition, settings: { privacyContactEmail: 'office@curlew.example' } }, ['Rhea Office']),
      privacyNoticeFacts(competition, ['Rhea Office', 'Ned Desk']),
      privacyNoticeFacts({ ...competition, lastContestDay: '2027-08-09' }, ['Rhea Office']),
    ]
    for (const f of others) expect(await privacyNoticeVersion(competitionNoticeSections(f))).not.toBe(version)
  })

  it('words the site’s own notice with the rights from the account page', () => {
    const words = siteNoticeSections().flatMap(s => s.items.map(i => i.text)).join('\n')
    expect(words).toContain('Your account page (/account) downloads everything the site keeps about you as one file.')
  })
})
