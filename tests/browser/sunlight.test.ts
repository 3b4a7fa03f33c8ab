import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { launchBrowser, openPage, screenshot, waitForHydration, type Browser } from '../support/browser'

const baseUrl = inject('baseUrl')

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

const htmlHasSunlight = (html: string) => /<html[^>]*\bclass="[^"]*\bsunlight\b/.test(html)

describe('sunlight mode', () => {
  it('toggles from the header, enlarges controls and survives a reload without a flash', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      const toggle = page.getByTestId('sunlight-toggle')
      expect(await toggle.getAttribute('aria-pressed')).toBe('false')
      const normalHeight = (await page.getByRole('button', { name: 'Sign in' }).boundingBox())!.height

      await toggle.click()
      await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('sunlight'))).toBe(true)
      expect(await toggle.getAttribute('aria-pressed')).toBe('true')

      const submit = (await page.getByRole('button', { name: 'Sign in' }).boundingBox())!
      const field = (await page.getByLabel('E-mail address').boundingBox())!
      expect(submit.height).toBeGreaterThanOrEqual(48)
      expect(field.height).toBeGreaterThanOrEqual(48)
      expect(submit.height).toBeGreaterThan(normalHeight)
      await screenshot(page, 'sign-in-sunlight-phone')

      // The server renders the class itself, from the cookie: the first paint is already right.
      const response = await page.reload({ waitUntil: 'load' })
      expect(htmlHasSunlight(await response!.text())).toBe(true)
      await waitForHydration(page)
      expect(await page.getByTestId('sunlight-toggle').getAttribute('aria-pressed')).toBe('true')

      await page.getByTestId('sunlight-toggle').click()
      await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('sunlight'))).toBe(false)
      const again = await page.reload({ waitUntil: 'load' })
      expect(htmlHasSunlight(await again!.text())).toBe(false)
    }
    finally {
      await page.close()
    }
  })

  it('applies on the landing page at wall size too', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/', 'wall')
    try {
      await screenshot(page, 'landing-wall')
      await page.getByTestId('sunlight-toggle').click()
      await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('sunlight'))).toBe(true)
      await screenshot(page, 'landing-sunlight-wall')
    }
    finally {
      await page.close()
    }
  })
})
