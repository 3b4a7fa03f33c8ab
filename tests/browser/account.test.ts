// The account page on a phone: reached from the header's menu, it changes the name (the menu
// shows the new one at once) and downloads "my data" as a JSON file holding that name, with no
// sideways scrolling on a 390 px screen.
import { readFile } from 'node:fs/promises'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD, signedUpClient } from '../support/api'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'

const baseUrl = inject('baseUrl')

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('the account page', () => {
  it('is reached from the menu on a phone, renames the account and downloads the data', async () => {
    const { email } = await signedUpClient(baseUrl, 'Phone Pilot')
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD)
      // Home, loaded whole: the menu is the one that stays.
      await gotoApp(page, baseUrl, '/')
      await page.getByTestId('app-nav-toggle').click()
      // The panel has opened once focus has moved into it.
      await expect.poll(() => page.evaluate(() => document.activeElement?.closest('#app-nav-panel') !== null)).toBe(true)
      await Promise.all([
        page.waitForURL(url => url.pathname === '/account'),
        page.getByTestId('app-nav-account').click(),
      ])
      await page.getByRole('heading', { level: 1, name: 'Your account' }).waitFor()
      expect(await page.getByTestId('account-email-address').textContent()).toBe(email)

      await page.getByLabel('Your name').fill('Renamed On Phone')
      await page.getByRole('button', { name: 'Save the name' }).click()
      await page.getByTestId('account-name-saved').waitFor()
      await page.getByTestId('app-nav-toggle').click()
      await expect.poll(() => page.getByTestId('app-nav-panel').textContent()).toContain('Renamed On Phone')
      await page.keyboard.press('Escape')

      const [download] = await Promise.all([
        page.waitForEvent('download'),
        page.getByTestId('account-export').click(),
      ])
      expect(download.suggestedFilename()).toMatch(/^gridmark-my-data-\d{4}-\d{2}-\d{2}\.json$/)
      const data = JSON.parse(await readFile((await download.path())!, 'utf8'))
      expect(data.account).toMatchObject({ email, name: 'Renamed On Phone' })

      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
      expect(overflow).toBeLessThanOrEqual(0)
      await screenshot(page, 'account-phone')
    }
    finally {
      await page.close()
    }
  })
})
