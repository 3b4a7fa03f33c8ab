// E-mails that list findings: each finding links to its rule on the competition's rulebook
// page (in the text part and as a link in the HTML part), and the hold and release e-mails end
// with the hardware caution in full, the one shared text.
import { describe, expect, it } from 'vitest'
import { HARDWARE_CAUTION, type Finding } from '#shared/engine'
import {
  documentRejectedMail, entryAcceptedMail, entryRejectedMail, entrySubmittedMail, entryToReviewMail, findingItems,
  invitationMail, paymentReceivedMail, paymentRecordedMail, readinessMail, refundMail, reminderMail, renderMail, ruleLink, waiverMail,
} from '#domain/mail/templates'

const BASE = 'https://gridmark.example'
const expired: Finding = { checkId: 'firmware.valid-through-contest', severity: 'blocking', reason: 'The firmware expires 2027-07-18.', fixHint: 'Update it.', caution: HARDWARE_CAUTION, unitId: 'u1' }
const unpaid: Finding = { checkId: 'entry.paid', severity: 'blocking', reason: 'The entry fee is not paid yet.', fixHint: 'Pay it.' }

describe('a finding’s rule in an e-mail', () => {
  it('is the check’s anchor on the rulebook page, at the public address', () => {
    expect(ruleLink(BASE, 'c-1', 'entry.paid')).toEqual({ label: 'Rule: entry.paid', url: 'https://gridmark.example/competitions/c-1/checks#entry.paid' })
  })

  it('shows under each finding, in both parts of the message', () => {
    const mail = renderMail({ paragraphs: ['Hello'], list: findingItems([expired, unpaid], BASE, 'c-1') })
    expect(mail.text).toContain('  - Blocking: The firmware expires 2027-07-18. How to fix: Update it. The fix touches hardware: read the caution below.\n    Rule: firmware.valid-through-contest\n    https://gridmark.example/competitions/c-1/checks#firmware.valid-through-contest')
    expect(mail.text).toContain('  - Blocking: The entry fee is not paid yet. How to fix: Pay it.\n    Rule: entry.paid\n    https://gridmark.example/competitions/c-1/checks#entry.paid')
    expect(mail.html).toContain('<a href="https://gridmark.example/competitions/c-1/checks#entry.paid" style="color:#0f766e;font-size:14px">Rule: entry.paid</a>')
  })

  it('leaves plain lines as they were', () => {
    expect(renderMail({ paragraphs: [], list: ['One thing'] }).text).toContain('  - One thing\n\n')
  })
})

describe('readinessMail (hold and release)', () => {
  it('lists the open findings with their rules and ends with the caution in full', () => {
    const mail = readinessMail({ greeting: 'Hello Ann,', paragraphs: ['your glider is held.'], findings: [expired], competitionId: 'c-1', base: BASE, entryUrl: `${BASE}/e` })
    expect(mail.text).toContain('The checks find this on your entry now:')
    expect(mail.text).toContain('Rule: firmware.valid-through-contest\n    https://gridmark.example/competitions/c-1/checks#firmware.valid-through-contest')
    expect(mail.text).toContain(`Caution where a fix touches hardware: ${HARDWARE_CAUTION}`)
    expect(mail.text.indexOf('Rule:')).toBeLessThan(mail.text.indexOf('Caution where'))
  })

  it('carries the caution even when no finding is open (a hold for a reason no check names)', () => {
    const mail = readinessMail({ greeting: 'Hello Ann,', paragraphs: ['your glider is held: antenna loose.'], findings: [], competitionId: 'c-1', base: BASE, entryUrl: `${BASE}/e` })
    expect(mail.text).not.toContain('The checks find')
    expect(mail.text).toContain(HARDWARE_CAUTION)
    // The HTML part escapes the caution's apostrophes like any other text.
    expect(mail.html).toContain('Follow the manufacturer’s instructions.')
  })
})

// Every e-mail ends with the page where its reader acts, in both parts, and says only what
// fits its case.
const ENTRY = `${BASE}/competitions/c-1/entries/e-1`
const withLink = (mail: { text: string, html: string }, label: string, url: string) => {
  expect(mail.text).toContain(`${label}:\n${url}`)
  expect(mail.html).toContain(`href="${url}"`)
}

describe('waiverMail', () => {
  const granted = {
    event: 'granted' as const, entrantName: 'Ann', compId: 'K7', competitionName: 'Moor Open', competitionId: 'c-1',
    checkId: 'entry.paid', checkRule: 'The entry fee is paid before the first contest day.', finding: 'The entry fee is not paid yet.',
    scope: 'day' as const, day: '2027-07-12', lastContestDay: '2027-07-20', grantedBy: 'Dana Director', grantReason: 'Paid in cash', base: BASE, entryUrl: ENTRY,
  }
  it('on a grant: the check in words with its rule, the day, who and why, and the entry page', () => {
    const mail = waiverMail(granted)
    expect(mail.subject).toBe('A finding on K7 is waived — Moor Open')
    expect(mail.text).toContain('Dana Director waived one finding on your entry K7 at Moor Open, for 12 July 2027 only.')
    expect(mail.text).toContain('The director’s reason: Paid in cash')
    expect(mail.text).toContain('  - The entry fee is paid before the first contest day. What the check found: The entry fee is not paid yet.\n    Rule: entry.paid\n    https://gridmark.example/competitions/c-1/checks#entry.paid')
    expect(mail.text).toContain('counts again on the next day')
    withLink(mail, 'See the waiver on your entry', ENTRY)
  })

  it('for the whole competition: runs to the last contest day', () => {
    const mail = waiverMail({ ...granted, scope: 'competition', day: null })
    expect(mail.text).toContain('for the whole competition (to 20 July 2027)')
    expect(mail.text).toContain('may withdraw a waiver')
  })

  it('on a withdrawal: who withdrew it and why, what counts again, held again or not', () => {
    const mail = waiverMail({ ...granted, event: 'withdrawn', withdrawnBy: 'Dana Director', withdrawalReason: 'No cash was received', heldAgain: true })
    expect(mail.subject).toBe('A waiver on K7 is withdrawn — Moor Open')
    expect(mail.text).toContain('the contest director Dana Director withdrew the waiver granted for 12 July 2027 only on your entry K7 at Moor Open.')
    expect(mail.text).toContain('The reason for withdrawing it: No cash was received')
    expect(mail.text).toContain('It had been granted by Dana Director: Paid in cash')
    expect(mail.text).toContain('held on today’s board')
    expect(waiverMail({ ...granted, event: 'withdrawn', withdrawnBy: 'Dana Director', withdrawalReason: 'x', heldAgain: false }).text).not.toContain('held on today’s board')
    withLink(mail, 'Open your entry', ENTRY)
  })
})

describe('the entry’s e-mails link to its page and list only what is open', () => {
  const common = { entrantName: 'Ann', entryLabel: 'K7 (Glider 15, D-1234)', compId: 'K7', competitionName: 'Moor Open', entryUrl: ENTRY }

  it('submitted: what the dossier still asks for, or that nothing is needed', () => {
    const asks = entrySubmittedMail({ ...common, missing: ['Upload the insurance certificate.'] })
    expect(asks.text).toContain('Meanwhile, the dossier still asks for:\n\n  - Upload the insurance certificate.')
    withLink(asks, 'Open your entry', ENTRY)
    const none = entrySubmittedMail({ ...common, missing: [] })
    expect(none.text).toContain('nothing more is needed from you for now')
    expect(none.text).not.toContain('IGC')
  })

  it('to review (the organiser): the entry page, where it is accepted or rejected', () => {
    const mail = entryToReviewMail({ pilotName: 'Ann', entryLabel: common.entryLabel, compId: 'K7', competitionName: 'Moor Open', entryUrl: ENTRY })
    expect(mail.subject).toBe('New entry to review: K7 — Moor Open')
    withLink(mail, 'Review the entry', ENTRY)
  })

  it('accepted: a paid pilot is not told about the fee; what is open is listed', () => {
    const paid = entryAcceptedMail({ ...common, openItems: [] })
    expect(paid.text).not.toMatch(/fee/)
    expect(paid.text).toContain('Nothing is open on your entry at the moment.')
    withLink(paid, 'Open your entry', ENTRY)
    const unpaidMail = entryAcceptedMail({ ...common, openItems: [{ text: 'Blocking: The entry fee is not paid yet.', link: ruleLink(BASE, 'c-1', 'entry.paid') }] })
    expect(unpaidMail.text).toContain('put right what is still open on your entry:\n\n  - Blocking: The entry fee is not paid yet.')
  })

  it('rejected: the organiser’s reason and the page to change and resubmit', () => {
    const mail = entryRejectedMail({ ...common, reason: 'The MTOM does not match.' })
    expect(mail.text).toContain('The MTOM does not match.')
    withLink(mail, 'Change and resubmit your entry', ENTRY)
  })

  it('payment received and refunds: the amount, what remains paid, and the entry page', () => {
    withLink(paymentReceivedMail({ entrantName: 'Ann', compId: 'K7', competitionName: 'Moor Open', money: '€300.00', entryUrl: ENTRY }), 'Open your entry', ENTRY)
    const full = refundMail({ entrantName: 'Ann', compId: 'K7', competitionName: 'Moor Open', money: '€300.00', method: 'card', reason: 'Withdrew before the event.', full: true, owed: null, entryUrl: ENTRY })
    expect(full.text).toContain('Nothing of the fee remains paid.')
    expect(full.text).toContain('Reason: Withdrew before the event.')
    withLink(full, 'Open your entry', ENTRY)
    expect(refundMail({ entrantName: 'Ann', compId: 'K7', competitionName: 'Moor Open', money: '€50.00', method: 'card', reason: null, full: false, owed: null, entryUrl: ENTRY }).text).toContain('The rest of the fee stays paid.')
  })

  it('document rejected: the reason and where to upload a corrected one', () => {
    const mail = documentRejectedMail({ entrantName: 'Ann', compId: 'K7', competitionName: 'Moor Open', kindLabel: 'Insurance certificate', filename: 'ins.pdf', reason: 'Expired.', entryUrl: ENTRY })
    expect(mail.text).toContain('could not accept the insurance certificate you uploaded for entry K7 (ins.pdf).')
    withLink(mail, 'Upload a corrected document', ENTRY)
  })

  it('invitation and reminder keep their pages: the invitation, the entry', () => {
    const inv = invitationMail({ competitionName: 'Moor Open', role: 'scrutineer', invitedByName: 'Olga', url: `${BASE}/invitations/t.k`, expiresAt: new Date('2027-07-01T00:00:00Z') })
    withLink(inv, 'Open the invitation', `${BASE}/invitations/t.k`)
    const reminder = reminderMail({ competitionName: 'Moor Open', firstContestDay: '2027-07-12', pilotName: 'Ann', compId: 'K7', openItems: [], url: ENTRY })
    expect(reminder.text).not.toMatch(/fee/)
    withLink(reminder, 'Open your entry', ENTRY)
  })
})

describe('payments any way: recorded payments, waivers, refunds', () => {
  const base = { entrantName: 'Ann', compId: 'K7', competitionName: 'Moor Open', entryUrl: `${BASE}/competitions/c-1/entries/e-1` }
  it('a bank transfer recorded: the amount, how, the day and reference, and that the fee is paid', () => {
    const mail = paymentRecordedMail({ ...base, money: '€300.00', method: 'bank-transfer', day: '3 March 2027', reference: 'KM-0042', reason: null, owed: null })
    expect(mail.subject).toBe('Payment recorded: K7 at Moor Open')
    expect(mail.text).toContain('recorded your payment of €300.00 by bank transfer on 3 March 2027 (reference KM-0042)')
    expect(mail.text).toContain('Your entry fee is now paid.')
  })

  it('a part payment in cash says what is still to pay', () => {
    const mail = paymentRecordedMail({ ...base, money: '€100.00', method: 'cash', day: '3 March 2027', reference: null, reason: null, owed: '€200.00' })
    expect(mail.text).toContain('€100.00 in cash on 3 March 2027 for the entry fee')
    expect(mail.text).toContain('€200.00 of the entry fee is still to pay.')
  })

  it('a waiver gives its reason', () => {
    const mail = paymentRecordedMail({ ...base, money: '€300.00', method: 'waived', day: '3 March 2027', reference: null, reason: 'Guest pilot of the club.', owed: null })
    expect(mail.subject).toBe('Entry fee waived: K7 at Moor Open')
    expect(mail.text).toContain('has waived €300.00 of the entry fee of K7 at Moor Open.')
    expect(mail.text).toContain('Reason: Guest pilot of the club.')
  })

  it('a recorded refund of cash names how it was paid, its reason and what is owed again', () => {
    const mail = refundMail({ ...base, money: '€50.00', method: 'cash', reason: 'Paid twice.', full: false, owed: '€20.00' })
    expect(mail.subject).toBe('Refund: K7 at Moor Open')
    expect(mail.text).toContain('refunded €50.00 of the entry fee for K7 at Moor Open, which you paid in cash.')
    expect(mail.text).toContain('Reason: Paid twice.')
    expect(mail.text).toContain('€20.00 of the entry fee is now to pay.')
  })
})
