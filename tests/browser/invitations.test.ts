// An organiser invites a scrutineer on the people page; the invitee opens the link from the
// captured e-mail, creates an account, accepts, and sees the competition with the new role.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, accountLinkOf, signedUpClient, uniqueEmail } from '../support/api'
import { closeTestDb, createCompetition } from '../support/db'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { invitationLink, waitForMail } from '../support/mail'
import { MESSAGES } from '../../shared/constants/messages'

const baseUrl = inject('baseUrl')

let browser: Browser
let competitionId: string
let organiserEmail: string

beforeAll(async () => {
  browser = await launchBrowser()
  const organiser = await signedUpClient(baseUrl, 'Petra People')
  organiserEmail = organiser.email
  competitionId = await createCompetition('Heather Ridge Open', [{ userId: organiser.user.id, role: 'organiser' }])
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('inviting a scrutineer', () => {
  it('from the people page to the invitee holding the role', async () => {
    const invitee = uniqueEmail('browser-invitee')
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, organiserEmail, GOOD_PASSWORD, `/competitions/${competitionId}`)
    await page.getByRole('navigation', { name: 'Your pages' }).getByRole('link', { name: 'People' }).click()
    await page.waitForURL(url => url.pathname === `/competitions/${competitionId}/people`)
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor()
    expect(await page.getByTestId('members-organiser').getByTestId('member-row').allTextContents()).toEqual([expect.stringContaining('Petra People')])

    // A bad address is refused beside the field, before anything is sent.
    await page.getByLabel('E-mail address').fill('not an address')
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await page.getByTestId('error-summary').getByText('Enter an e-mail address like name@example.org.').waitFor()

    await page.getByLabel('E-mail address').fill(invitee)
    await page.getByLabel('Role', { exact: true }).selectOption('scrutineer')
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await page.getByTestId('invite-sent').getByText(`Invitation sent to ${invitee}.`).waitFor()
    await page.getByTestId('invitation-row').filter({ hasText: invitee }).waitFor()
    await screenshot(page, 'people-phone')
    await page.setViewportSize({ width: 1920, height: 1080 })
    await screenshot(page, 'people-wall')
    // Sunlight mode for the field: the same page in high contrast, then back.
    await page.getByTestId('sunlight-toggle').click()
    await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('sunlight'))).toBe(true)
    await screenshot(page, 'people-sunlight-wall')
    await page.getByTestId('sunlight-toggle').click()
    await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('sunlight'))).toBe(false)

    const [mail] = await waitForMail(invitee)
    expect(mail!.subject).toBe('Invitation: scrutineer at Heather Ridge Open')
    const link = invitationLink(mail!)

    // The invitee: a fresh, signed-out browser session.
    await browser.context.clearCookies()
    await page.setViewportSize({ width: 390, height: 844 })
    await gotoApp(page, baseUrl, new URL(link).pathname)
    await page.getByTestId('invitation-role').getByText('Scrutineer').waitFor()
    await page.getByRole('heading', { name: 'Heather Ridge Open' }).waitFor()
    await screenshot(page, 'invitation-phone')

    await page.getByTestId('invitation-sign-up').click()
    await page.waitForURL(url => url.pathname === '/sign-up')
    await page.getByLabel('Your name').fill('Ines Invitee')
    await page.getByLabel('E-mail address').fill(invitee)
    await page.getByLabel('Password').fill(GOOD_PASSWORD)
    await page.getByRole('button', { name: /create/i }).click()
    await page.getByTestId('sign-up-sent').waitFor()
    // The confirmation link signs the newcomer in and leads back to the invitation.
    const confirmation = (await waitForMail(invitee, { count: 2 })).find(m => m.subject.startsWith('Confirm'))!
    const confirmLink = new URL(accountLinkOf(confirmation, '/verify-email').link)
    await gotoApp(page, baseUrl, confirmLink.pathname + confirmLink.search)
    await page.waitForURL(url => url.pathname.startsWith('/invitations/'))
    await page.getByTestId('invitation-accept').waitFor()
    await screenshot(page, 'invitation-signed-in-phone')
    await Promise.all([
      page.waitForURL(url => url.pathname === `/competitions/${competitionId}`),
      page.getByTestId('invitation-accept').click(),
    ])
    await page.getByRole('heading', { level: 1, name: 'Heather Ridge Open' }).waitFor()
    await page.getByTestId('role-duties').getByRole('heading', { name: 'Scrutineer' }).waitFor()
    expect(await page.getByRole('navigation', { name: 'Your pages' }).getByRole('link', { name: 'People' }).count()).toBe(0)
    const denied = await page.goto(new URL(`/competitions/${competitionId}/people`, baseUrl).toString())
    expect(denied?.status()).toBe(403)
    await screenshot(page, 'invitation-accepted-phone')

    // The link is spent: opening it again says so.
    await gotoApp(page, baseUrl, new URL(link).pathname)
    await page.getByTestId('invitation-problem').getByText(MESSAGES.invitationUsed).waitFor()
    await page.close()
  })

  it('signed in with another account, the page names the invited address and switches to it', async () => {
    const invitee = await signedUpClient(baseUrl, 'Vera Invited')
    const organiser = new ApiClient(baseUrl)
    expect((await organiser.post('/api/auth/login', { email: organiserEmail, password: GOOD_PASSWORD })).status).toBe(200)
    expect((await organiser.post(`/api/competitions/${competitionId}/invitations`, { email: invitee.email, role: 'director' })).status).toBe(201)
    const [mail] = await waitForMail(invitee.email)
    const path = new URL(invitationLink(mail!)).pathname

    // The organiser, signed in on this browser, opens the forwarded link.
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, organiserEmail, GOOD_PASSWORD, path)
    await page.waitForURL(url => url.pathname === path)
    const notice = page.getByTestId('invitation-other-address')
    await notice.getByText(`This invitation is for ${invitee.email}`).waitFor()
    // No button that could only fail: the page offers the way to the invited account instead.
    expect(await page.getByTestId('invitation-accept').count()).toBe(0)
    await screenshot(page, 'invitation-other-account-phone')

    await Promise.all([
      page.waitForURL(url => url.pathname === '/sign-in'),
      page.getByTestId('invitation-switch-account').click(),
    ])
    expect(await page.getByLabel('E-mail address').inputValue()).toBe(invitee.email)
    await page.getByLabel('Password').fill(GOOD_PASSWORD)
    await Promise.all([
      page.waitForURL(url => url.pathname === path),
      page.getByRole('button', { name: 'Sign in' }).click(),
    ])
    await Promise.all([
      page.waitForURL(url => url.pathname === `/competitions/${competitionId}`),
      page.getByTestId('invitation-accept').click(),
    ])
    await page.getByTestId('role-duties').getByRole('heading', { name: 'Contest director' }).waitFor()
    await page.close()
  })

  it('a link that is not valid says so in a sentence', async () => {
    const page = await openPage(browser.context, baseUrl, `/invitations/${'a'.repeat(43)}.${'b'.repeat(43)}`, 'phone')
    await page.getByTestId('invitation-problem').getByText(MESSAGES.invitationInvalid).waitFor()
    await screenshot(page, 'invitation-invalid-phone')
    await page.close()
  })
})
