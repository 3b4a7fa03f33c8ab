// The privacy notices, worded once: a competition's (filled from its set-up, organisers and
// rules) and the site's own. Pure, so the server answers the text that the page shows and the
// digest an entry records is taken over exactly that text.
import { addDays } from '../engine/dates'
import type { IsoDate } from '../engine/types'
import type { PrivacyNoticeFacts, PrivacyNoticeItem, PrivacyNoticeSection } from '../types/api-privacy'
import { rulesOf } from './rules'
import { SUPERSEDED_RETENTION_DAYS } from './document-retention'

/** The date of the current wording; change it with the wording. */
export const PRIVACY_NOTICE_REVISION = '2026-12-04'

const longDate = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })
const inWords = (day: string) => longDate.format(new Date(`${day}T00:00:00Z`))
const days = (n: number) => `${n} day${n === 1 ? '' : 's'}`

/** "A", "A and B", "A, B and C". */
function listed(names: readonly string[]): string {
  if (names.length <= 1) return names[0] ?? ''
  return `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`
}

/** The day the licence and medical files are due to go, from the last contest day and the rule. */
export function medicalDeletedAfter(lastContestDay: string | null, retentionDays: number): string | null {
  return lastContestDay ? addDays(lastContestDay as IsoDate, retentionDays) : null
}

/** What a competition row (its settings as stored) and its organisers' names fill the notice with. */
export function privacyNoticeFacts(
  c: { name: string, airfieldName: string, firstContestDay: string | null, lastContestDay: string | null, settings: unknown },
  organisers: readonly string[],
): PrivacyNoticeFacts {
  const { medicalRetentionDays } = rulesOf(c.settings)
  return {
    competitionName: c.name,
    airfieldName: c.airfieldName,
    firstContestDay: c.firstContestDay,
    lastContestDay: c.lastContestDay,
    // Code-unit order, the same wherever it is computed (the digest depends on it).
    organisers: [...organisers].sort(),
    contactEmail: privacyContactOf(c.settings),
    medicalRetentionDays,
    medicalDeletedAfter: medicalDeletedAfter(c.lastContestDay, medicalRetentionDays),
    supersededRetentionDays: SUPERSEDED_RETENTION_DAYS,
  }
}

/** Both notices say where the person downloads what the site keeps about them. */
const SEE_AND_TAKE_AWAY: PrivacyNoticeItem = { term: 'See and take away', text: 'your account page (/account) downloads everything the site keeps about you as one file.' }

const section = (id: string, title: string, paragraphs: string[], items: PrivacyNoticeItem[] = []): PrivacyNoticeSection =>
  ({ id, title, paragraphs, items: items.map(i => ({ term: i.term, text: i.text.charAt(0).toUpperCase() + i.text.slice(1) })) })

/** What a pilot reads before entering this competition, and confirms when entering. */
export function competitionNoticeSections(f: PrivacyNoticeFacts): PrivacyNoticeSection[] {
  const organisers = f.organisers.length ? listed(f.organisers) : 'the competition office'
  const askWho = f.contactEmail ? `write to ${f.contactEmail}` : `ask the organisers (${organisers}) through the competition office`
  const dates = f.firstContestDay && f.lastContestDay
    ? `, flown from ${inWords(f.firstContestDay)} to ${inWords(f.lastContestDay)}`
    : ''
  const medicalUntil = f.medicalDeletedAfter
    ? `${days(f.medicalRetentionDays)} after the last contest day, that is until ${inWords(f.medicalDeletedAfter)}; then the files are deleted.`
    : `${days(f.medicalRetentionDays)} after the last contest day (the organisers have not set that day yet); then the files are deleted.`

  return [
    section('controller', 'Who is responsible', [
      `${f.competitionName} at ${f.airfieldName}${dates}, is run by its organisers: ${organisers}. They decide what is done with the data of its entries and answer for it (in data protection terms, they are the controller). Gridmark is the tool they keep the records in.`,
      f.contactEmail
        ? `Questions about your data in this competition: ${f.contactEmail}.`
        : `This competition has not named a privacy contact: ask the organisers, ${organisers}, through the competition office.`,
    ]),
    section('collected', 'What is kept about you', [
      'Only what scrutineering, safety and the entry fee need:',
    ], [
      { term: 'Your account', text: 'your name and e-mail address; your password only as a one-way hash.' },
      { term: 'Your entry', text: 'the pilot’s name, nationality, licence number, phone and emergency contact; the co-pilot’s and crew’s names; your messages with the office.' },
      { term: 'The glider and its units', text: 'type, registration, competition ID, span and masses; collision-warning units and flight recorders with their serial numbers, radio IDs and firmware.' },
      { term: 'Documents', text: 'airworthiness review, insurance, your pilot licence and your medical certificate. A medical certificate is health data, a special category of personal data, and is handled with the extra care described below.' },
      { term: 'IGC files', text: 'the files from your flight recorders, with the header they declare (pilot, glider, recorder).' },
      { term: 'Payments', text: 'amounts, their state, references and refunds. Card details go to the payment provider and never reach this site.' },
      { term: 'Grid checks', text: 'on each contest day the scrutineer’s checklist, weigh-ins with the masses, notes and outcome; the director’s holds, releases and waivers.' },
      { term: 'Who opened your files', text: 'each time someone opens your licence or medical file: who, when and from which network address (the address goes when the file is deleted).' },
    ]),
    section('why', 'Why', [
      'To take and review your entry; to check before and during the contest that the glider, its units, the pilot’s licence and medical meet the competition’s rules; to reach you and your emergency contact on contest days; to collect the entry fee; and to keep a record of the office’s and the officials’ decisions that can be checked afterwards.',
      'You give these data to enter; the organisers use them for the competition you entered and for nothing else. Nothing is sold or used for advertising.',
    ]),
    section('who-sees', 'Who sees it', [], [
      { term: 'You', text: 'everything in your own entry, including who opened your licence and medical files.' },
      { term: 'Scrutineers and organisers of this competition', text: 'your entry and its documents; they open your licence and medical files to review them.' },
      { term: 'The contest director', text: 'your entry and, of your licence and medical certificate, only their kind, validity dates and review outcome, never the files.' },
      { term: 'Site administrators', text: 'without a role in this competition, the same as the director: never your licence or medical files.' },
      { term: 'Other pilots', text: 'nothing of your entry.' },
      { term: 'The payment provider', text: 'the amount and a reference when you pay by card.' },
    ]),
    section('how-long', 'How long it is kept', [], [
      { term: 'Licence and medical files', text: `kept ${medicalUntil} What stays is their kind, validity dates, review outcome, a checksum and the fact that they were deleted.` },
      { term: 'Replaced copies', text: `a superseded copy of any document is deleted ${days(f.supersededRetentionDays)} after its replacement is accepted.` },
      { term: 'Stored files', text: 'documents and IGC files are stored encrypted on the server.' },
      { term: 'The audit log', text: 'records who changed what and when, by ids and field names; it never keeps personal free text such as phone numbers or contacts.' },
      { term: 'The rest of your entry', text: 'stays with the competition’s record (results, payments, grid checks) until you delete your account; then your name and contact details are removed from it.' },
    ]),
    section('rights', 'Your rights', [
      `You may see, correct and take away your data, have it deleted, restrict its use or object to it. To do so, ${askWho}; you may also complain to the data protection authority of your country.`,
    ], [
      SEE_AND_TAKE_AWAY,
      { term: 'Correct', text: 'change your entry yourself while registration is open, or ask the office.' },
      { term: 'Delete', text: 'delete your account from your account page: your licence and medical files go at once, and your name and contact details are removed from your entries.' },
    ]),
  ]
}

/** What the site itself keeps about an account, whichever competitions it takes part in. */
export function siteNoticeSections(): PrivacyNoticeSection[] {
  return [
    section('site', 'This site', [
      'Gridmark keeps the scrutineering records of gliding competitions. Each competition is run by its organisers, who decide what is done with the data of its entries: read the notice of the competition you enter (listed below). This notice is about the account itself.',
    ]),
    section('account', 'What is kept about your account', [], [
      { term: 'Your account', text: 'your name, your e-mail address and when you confirmed it; your password only as a one-way hash.' },
      { term: 'Sign-ins', text: 'each session with its start, last use, browser and network address. Changing your password ends every other session, deleting your account ends them all; your data download lists them.' },
      { term: 'Links sent by e-mail', text: 'for confirming your address or resetting your password: stored as a hash and valid for a short time.' },
      { term: 'Limits', text: 'failed sign-ins, sign-ups and password reset requests are counted per network address for up to an hour, against password guessing and abuse.' },
      { term: 'Roles', text: 'which competitions you take part in, and as what (entrant, scrutineer, director, organiser).' },
      { term: 'E-mails', text: 'the messages the site sent you, as a record of what you were told.' },
      { term: 'In your browser', text: 'one cookie for your session, and your display preferences; nothing that tracks you, no advertising.' },
    ]),
    section('account-rights', 'Your rights', [], [
      SEE_AND_TAKE_AWAY,
      { term: 'Correct', text: 'change your name, address and password on your account page.' },
      { term: 'Delete', text: 'delete your account from your account page; what each competition keeps after that is said in its notice.' },
      { term: 'Ask', text: 'for anything about an entry, ask the organisers of its competition: their notice names who to write to.' },
    ]),
  ]
}

/**
 * A digest of a notice as it reads (its wording, its facts): SHA-256 over the sections, in hex.
 * Web Crypto, so the server and the demo seed compute the same.
 */
export async function privacyNoticeVersion(sections: readonly PrivacyNoticeSection[]): Promise<string> {
  const bytes = new TextEncoder().encode(JSON.stringify({ revision: PRIVACY_NOTICE_REVISION, sections }))
  const digest = await globalThis.crypto.subtle.digest('SHA-256', bytes)
  return [...new Uint8Array(digest)].map(b => b.toString(16).padStart(2, '0')).join('')
}

/** The privacy contact a competition stored in its settings, or null. */
export function privacyContactOf(settings: unknown): string | null {
  const stored = (settings && typeof settings === 'object') ? (settings as { privacyContactEmail?: unknown }).privacyContactEmail : undefined
  return typeof stored === 'string' && stored.includes('@') ? stored : null
}
