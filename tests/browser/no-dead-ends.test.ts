// Every screen leads on: a new account finds an open competition from home in one click and
// starts its entry with its own name filled in; after paying, the return page offers to submit
// the entry; the header takes a scrutineer on a phone to the launch grid of their competition.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD, accountLinkOf, signedUpClient, uniqueEmail } from '../support/api'
import { waitForMail } from '../support/mail'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { closeTestDb, createClass, createCompetition, testDb } from '../support/db'
import { completeEntry, entryBody, randomRadioId } from '../support/entries'
import { competitionWithRoles } from '../support/setup'

const baseUrl = inject('baseUrl')

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('no dead ends', () => {
  it('a new account finds an open competition on home and starts an entry in one click, its name filled in', async () => {
    const name = `Larkspur Vale Open ${Math.random().toString(36).slice(2, 6).toUpperCase()}`
    const competitionId = await createCompetition(name)
    await createClass(competitionId, 'Club')
    await browser.context.clearCookies()
    const email = uniqueEmail('newcomer')
    const page = await openPage(browser.context, baseUrl, '/sign-up', 'phone')
    try {
      await page.getByLabel('Your name').fill('Nova Newcomer')
      await page.getByLabel('E-mail address').fill(email)
      await page.getByLabel('Password').fill(GOOD_PASSWORD)
      await page.getByRole('button', { name: 'Create account' }).click()
      await page.getByTestId('sign-up-sent').waitFor()
      // The confirmation link from the e-mail signs the newcomer in.
      const link = new URL(accountLinkOf((await waitForMail(email))[0]!, '/verify-email').link)
      await gotoApp(page, baseUrl, link.pathname + link.search)
      await page.getByTestId('verify-done').waitFor()
      await Promise.all([
        page.waitForURL(url => url.pathname === '/'),
        page.getByRole('link', { name: 'Continue' }).click(),
      ])
      await page.getByTestId('no-competitions').waitFor()
      const card = page.getByTestId('home-open-competition').filter({ hasText: name })
      await card.waitFor()
      await screenshot(page, 'home-new-account-phone')
      await card.getByRole('link', { name: 'Enter a glider' }).click()
      await page.waitForURL(url => url.pathname === `/competitions/${competitionId}/entries/new`)
      await page.getByRole('heading', { name: `Enter ${name}` }).waitFor()

      // The pilot's own name is there already; fields submitting needs say so from the start.
      expect(await page.getByLabel('Pilot in command').inputValue()).toBe('Nova Newcomer')
      expect(await page.getByTestId('entry-signed-in-as').textContent()).toContain(email)
      expect(await page.locator('label[for="entry-new-pilotLicenceNumber"]').textContent()).toContain('needed to submit')
      expect(await page.locator('label[for="entry-new-spanM"]').textContent()).toContain('needed to submit')
      expect(await page.locator('label[for="entry-new-compId"]').textContent()).toContain('required')

      // Every line of the error summary names its field.
      await page.getByLabel('Glider type').fill('')
      await page.getByRole('button', { name: 'Save the draft entry' }).click()
      const summary = page.getByTestId('error-summary')
      await summary.waitFor()
      const named = await summary.getByTestId('error-summary-field').allTextContents()
      expect(named).toEqual(expect.arrayContaining(['Glider type', 'Registration', 'Competition ID']))
      expect(await summary.locator('li').count()).toBe(named.length)
      await screenshot(page, 'entry-new-summary-phone')
    }
    finally {
      await page.close()
    }
  })

  it('after paying, the return page leads to submitting the entry', async () => {
    const entrant = await signedUpClient(baseUrl, 'Pia Payer')
    const competitionId = await createCompetition('Return Path Trophy')
    const classId = await createClass(competitionId, 'Standard', 25000)
    const entryId = await completeEntry(entrant.client, competitionId, entryBody(classId, { compId: 'RP', pilotName: 'Pia Payer' }), randomRadioId())
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      const path = `/competitions/${competitionId}/entries/${entryId}/payment`
      await signInThroughForm(page, baseUrl, entrant.email, GOOD_PASSWORD, path)
      await page.getByTestId('pay-by-card').click()
      await page.waitForURL(url => url.pathname.startsWith('/pay/'))
      await page.getByLabel('Card number').fill('4242 4242 4242 4242')
      await page.getByRole('button', { name: /^Pay/ }).click()
      await page.waitForURL(url => url.pathname === path && url.searchParams.get('return') === 'success')
      await page.getByTestId('payment-received').waitFor()
      const submitNow = page.getByTestId('payment-submit-now')
      await submitNow.waitFor()
      await screenshot(page, 'payment-return-submit-phone')
      await submitNow.click()
      await page.waitForURL(url => url.pathname === `/competitions/${competitionId}/entries/${entryId}`)
      await expect.poll(() => page.getByTestId('entry-status').textContent()).toContain('Submitted')
      expect((await testDb()('entries').where({ id: entryId }).first()).status).toBe('submitted')

      // Once submitted, the way back offers only the entry.
      await gotoApp(page, baseUrl, `${path}?return=success`)
      await page.getByTestId('payment-back').waitFor()
      expect(await page.getByTestId('payment-submit-now').count()).toBe(0)
    }
    finally {
      await page.close()
    }
  })

  it('the header on a phone shows a scrutineer the launch grid of their competition, and nothing of the office', async () => {
    const t = await competitionWithRoles(baseUrl, 'Header Links Cup')
    const email = (await testDb()('users').where({ id: t.ids.scrutineer }).first('email')).email
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD)
      const nav = page.getByRole('navigation', { name: 'Main' })
      const toggle = nav.getByRole('button', { name: 'Pages' })
      expect(await toggle.getAttribute('aria-expanded')).toBe('false')
      expect(await page.getByTestId('app-nav-panel').isVisible()).toBe(false)
      await toggle.click()
      expect(await toggle.getAttribute('aria-expanded')).toBe('true')
      const panel = page.getByTestId('app-nav-panel')
      await panel.waitFor()
      // Focus moves into the panel it opened.
      await expect.poll(() => page.evaluate(() => document.activeElement?.closest('#app-nav-panel') !== null)).toBe(true)
      const { scrollWidth, innerWidth } = await page.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth }))
      expect(scrollWidth).toBeLessThanOrEqual(innerWidth)
      await screenshot(page, 'header-nav-scrutineer-phone')

      const links = await panel.getByRole('link').evaluateAll(els => els.map(a => [a.textContent?.trim(), new URL((a as HTMLAnchorElement).href).pathname]))
      expect(links).toEqual([
        ['Competitions', '/'],
        ['My entries', '/entries'],
        ['Launch grid', `/competitions/${t.competitionId}/grid`],
        ['Document review', `/competitions/${t.competitionId}/documents`],
        ['Your account', '/account'],
      ])
      expect(await panel.getByTestId('app-nav-competition').first().textContent()).toContain('Header Links Cup')

      // Escape closes it and gives focus back to its button.
      await page.keyboard.press('Escape')
      expect(await toggle.getAttribute('aria-expanded')).toBe('false')
      expect(await page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('app-nav-toggle')

      await toggle.click()
      await panel.getByRole('link', { name: 'Launch grid' }).click()
      await page.waitForURL(url => url.pathname === `/competitions/${t.competitionId}/grid`)
      await expect.poll(() => toggle.getAttribute('aria-expanded')).toBe('false')

      // A wider phone (412 px, where the wordmark's name shows) still holds the whole header.
      await page.setViewportSize({ width: 412, height: 915 })
      const signOut = await page.getByTestId('sign-out').boundingBox()
      expect(signOut!.x + signOut!.width).toBeLessThanOrEqual(412)
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(412)
    }
    finally {
      await page.close()
    }
  })
})
