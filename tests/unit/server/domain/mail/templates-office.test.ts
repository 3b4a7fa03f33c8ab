// The withdrawal e-mails (the entrant's confirmation or the office's reason; the organisers'
// notice with the refund due) and the "finish your entry" reminder to a draft.
import { describe, expect, it } from 'vitest'
import { draftReminderMail, entryWithdrawnMail, entryWithdrawnOfficeMail } from '#domain/mail/templates-office'
import { reminderMail } from '#domain/mail/templates'

const BASE = 'https://gridmark.example'
const ENTRY = `${BASE}/competitions/c-1/entries/e-1`
const withLink = (mail: { text: string, html: string }, label: string, url: string) => {
  expect(mail.text).toContain(`${label}:\n${url}`)
  expect(mail.html).toContain(`href="${url}"`)
}
const common = { entryLabel: 'K7 (Kestrel 19, G-KSTR)', compId: 'K7', competitionName: 'Moor Open' }

describe('entryWithdrawnMail (to the entrant)', () => {
  it('confirms the entrant’s own withdrawal and says what was paid', () => {
    const mail = entryWithdrawnMail({ ...common, entrantName: 'Ann', paid: '€300.00', entryUrl: ENTRY })
    expect(mail.subject).toBe('Entry K7 withdrawn — Moor Open')
    expect(mail.text).toContain('your entry K7 (Kestrel 19, G-KSTR) in Moor Open is withdrawn, as you asked.')
    expect(mail.text).toContain('You paid €300.00 for this entry.')
    expect(mail.text).not.toContain('competition office (')
    withLink(mail, 'Open your entry', ENTRY)
  })

  it('names the office and its reason when the office withdrew it, and says when nothing was paid', () => {
    const mail = entryWithdrawnMail({ ...common, entrantName: 'Ann', byOffice: { name: 'Olga Organiser', reason: 'The pilot phoned: injured.' }, paid: null, entryUrl: ENTRY })
    expect(mail.text).toContain('the competition office (Olga Organiser) has withdrawn your entry K7 (Kestrel 19, G-KSTR) from Moor Open for you.')
    expect(mail.text).toContain('Their reason: The pilot phoned: injured.')
    expect(mail.text).toContain('No entry fee was paid for this entry')
    expect(mail.html).toContain('Their reason: The pilot phoned: injured.')
  })
})

describe('entryWithdrawnOfficeMail (to each organiser)', () => {
  it('names the entry, who withdrew it and the refund due, and links to its payments', () => {
    const mail = entryWithdrawnOfficeMail({ ...common, pilotName: 'Ann Pilot', withdrawnBy: { name: 'Ann Entrant', office: false }, refundDue: '€300.00', paymentsUrl: `${ENTRY}/payment` })
    expect(mail.subject).toBe('Entry K7 withdrawn — refund due: €300.00 — Moor Open')
    expect(mail.text).toContain('Ann Entrant withdrew their entry K7 (Kestrel 19, G-KSTR) (pilot Ann Pilot) from Moor Open.')
    expect(mail.text).toContain('Refund due: €300.00, the money received for this entry.')
    withLink(mail, 'Open the entry’s payments', `${ENTRY}/payment`)
  })

  it('says no fee was paid when none was, and carries the office’s reason', () => {
    const mail = entryWithdrawnOfficeMail({ ...common, pilotName: 'Ann Pilot', withdrawnBy: { name: 'Olga Organiser', office: true, reason: 'Injured.' }, refundDue: null, paymentsUrl: ENTRY })
    expect(mail.subject).toBe('Entry K7 withdrawn — refund due: none — Moor Open')
    expect(mail.text).toContain('Olga Organiser withdrew the entry K7 (Kestrel 19, G-KSTR) (pilot Ann Pilot) from Moor Open for the pilot.')
    expect(mail.text).toContain('The reason given: Injured.')
    expect(mail.text).toContain('Refund due: none, no fee was paid for this entry.')
    withLink(mail, 'Open the entry', ENTRY)
  })
})

describe('the scheduled reminders', () => {
  it('a draft is told what submitting still needs, and when registration closes', () => {
    const mail = draftReminderMail({
      competitionName: 'Moor Open', firstContestDay: '2027-07-12', daysLeft: 30, registrationClosesOn: '2027-06-30',
      entrantName: 'Ann', compId: 'K7', needed: ['Add the collision-warning unit.', 'Add a flight recorder.'], url: ENTRY,
    })
    expect(mail.subject).toBe('Finish your entry: Moor Open starts on 12 July 2027')
    expect(mail.text).toContain('Moor Open starts on 12 July 2027 (in 30 days). Your entry K7 is still a draft')
    expect(mail.text).toContain('Registration closes on 30 June 2027.')
    expect(mail.text).toContain('  - Add the collision-warning unit.\n  - Add a flight recorder.')
    withLink(mail, 'Finish your entry', ENTRY)
  })

  it('a complete draft is told to submit it', () => {
    const mail = draftReminderMail({ competitionName: 'Moor Open', firstContestDay: '2027-07-12', daysLeft: 1, registrationClosesOn: null, entrantName: 'Ann', compId: '', needed: [], url: ENTRY })
    expect(mail.text).toContain('(in 1 day). Your entry is still a draft')
    expect(mail.text).toContain('It has everything submitting needs: open it and submit it.')
    expect(mail.text).not.toContain('Registration closes')
  })

  it('the pre-event reminder says how many days are left', () => {
    const mail = reminderMail({ competitionName: 'Moor Open', firstContestDay: '2027-07-12', daysLeft: 14, pilotName: 'Ann', compId: 'K7', openItems: ['Blocking: x'], url: ENTRY })
    expect(mail.subject).toBe('Reminder: Moor Open starts on 12 July 2027')
    expect(mail.text).toContain('Moor Open starts on 12 July 2027 (in 14 days). This is a reminder about your entry K7 (Ann).')
  })
})
