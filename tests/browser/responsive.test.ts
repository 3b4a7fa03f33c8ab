import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../seeds/demo-data'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'

const baseUrl = inject('baseUrl')

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** Nothing may push the page sideways on the narrowest phone we support. */
async function expectNoSidewaysScroll(page: Page) {
  const { scrollWidth, innerWidth } = await page.evaluate(() => ({
    scrollWidth: document.documentElement.scrollWidth,
    innerWidth: window.innerWidth,
  }))
  expect(scrollWidth).toBeLessThanOrEqual(innerWidth)
}

describe('at 360 px, in normal and sunlight mode', () => {
  it('fits the landing, sign-in, sign-up, home and competition pages without sideways scrolling', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/', 'narrowPhone')
    try {
      for (const sunlight of [false, true]) {
        await browser.context.addCookies([{ name: 'gridmark-sunlight', value: sunlight ? 'on' : 'off', url: baseUrl }])
        for (const path of ['/', '/sign-in', '/sign-up']) {
          await gotoApp(page, baseUrl, path)
          await expectNoSidewaysScroll(page)
        }
        await screenshot(page, `sign-up-${sunlight ? 'sunlight-' : ''}narrow`)
      }

      await signInThroughForm(page, baseUrl, 'organiser@gridmark.example', DEMO_PASSWORD)
      await expectNoSidewaysScroll(page)
      await screenshot(page, 'home-organiser-sunlight-narrow')
      await page.getByTestId('membership-card').getByRole('link').first().click()
      await page.getByTestId('class-card').first().waitFor()
      await expectNoSidewaysScroll(page)
      await screenshot(page, 'competition-organiser-sunlight-narrow')
    }
    finally {
      await page.close()
    }
  })
})
