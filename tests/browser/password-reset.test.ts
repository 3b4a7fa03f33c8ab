// Password reset as a person does it: "Forgot your password?" on the sign-in page, the link from
// the captured e-mail, a new password, then signing in with it (the old one no longer works).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, accountLinkOf, signedUpClient } from '../support/api'
import { closeTestDb } from '../support/db'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { waitForMail } from '../support/mail'
import { MESSAGES } from '../../shared/constants/messages'

const baseUrl = inject('baseUrl')
const NEW_PASSWORD = 'lenticular clouds at dawn'

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('a forgotten password', () => {
  it('is replaced through the link in the e-mail, and the new one signs in', async () => {
    const { client: elsewhere, email } = await signedUpClient(baseUrl, 'Fenna Forgetful')
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await page.getByTestId('forgot-password').click()
    await page.waitForURL(url => url.pathname === '/password/forgot')
    await page.getByLabel('E-mail address').fill(email)
    await page.getByRole('button', { name: 'Send the link' }).click()
    await page.getByTestId('reset-request-sent').getByText(MESSAGES.resetCheckMail).waitFor()
    await screenshot(page, 'password-reset-sent-phone')

    const [mail] = await waitForMail(email)
    expect(mail!.subject).toBe('Choose a new Gridmark password')
    const link = new URL(accountLinkOf(mail!, '/password/reset').link)
    await gotoApp(page, baseUrl, link.pathname + link.search)
    await page.getByRole('heading', { level: 1, name: 'Choose a new password' }).waitFor()
    // A password too short is refused beside the field, before anything is sent.
    await page.getByLabel('New password', { exact: true }).fill('short')
    await page.getByRole('button', { name: 'Save the new password' }).click()
    await page.getByTestId('error-summary').getByText('Use at least 10 characters.').waitFor()
    await page.getByLabel('New password', { exact: true }).fill(NEW_PASSWORD)
    await screenshot(page, 'password-reset-choose-phone')
    await Promise.all([
      page.waitForURL(url => url.pathname === '/sign-in'),
      page.getByRole('button', { name: 'Save the new password' }).click(),
    ])
    await page.getByTestId('sign-in-after-reset').waitFor()
    await screenshot(page, 'password-reset-done-phone')

    // Every other session of the account ended with the change.
    expect((await elsewhere.get('/api/me')).status).toBe(401)
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(401)

    // Signing in leaves the sign-in page only when the password was accepted.
    await signInThroughForm(page, baseUrl, email, NEW_PASSWORD)
    expect(new URL(page.url()).pathname).toBe('/')

    // The link is spent: opening it again and saving says so.
    await gotoApp(page, baseUrl, link.pathname + link.search)
    await page.getByLabel('New password', { exact: true }).fill('yet another long passphrase')
    await page.getByRole('button', { name: 'Save the new password' }).click()
    await page.getByTestId('error-summary').getByText(MESSAGES.tokenUsed).waitFor()
    await page.close()
  })
})
