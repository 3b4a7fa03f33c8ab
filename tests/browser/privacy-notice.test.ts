// The privacy notices in the browser: from sign-up the privacy link opens the site's notice,
// which leads to each open competition's; the entry form links to its competition's notice and
// refuses to send the entry until the pilot ticks the box confirming it (phone size); the
// footer leads to the competition's notice on its pages and to the site's elsewhere.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { GOOD_PASSWORD, signedUpClient } from '../support/api'
import { launchBrowser, openPage, screenshot, signInThroughForm, waitForHydration, type Browser } from '../support/browser'
import { closeTestDb, createClass, createCompetition, testDb } from '../support/db'

const baseUrl = inject('baseUrl')

let browser: Browser
let competitionId: string
let competitionName: string
let entrant: Awaited<ReturnType<typeof signedUpClient>>

beforeAll(async () => {
  browser = await launchBrowser()
  const organiser = await signedUpClient(baseUrl, 'Perdita Office')
  entrant = await signedUpClient(baseUrl, 'Pia Privacy')
  competitionName = `Heron Edge Cup ${Math.random().toString(36).slice(2, 6).toUpperCase()}`
  competitionId = await createCompetition(competitionName, [{ userId: organiser.user.id, role: 'organiser' }])
  await createClass(competitionId, 'Standard')
  await testDb()('competitions').where({ id: competitionId })
    .update({ settings: { privacyContactEmail: 'privacy@heron-edge.example', medicalRetentionDays: 21 } })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

/** Clicks a link that opens a new tab and answers that tab once its page has hydrated. */
async function openedInNewTab(page: Page, click: () => Promise<void>): Promise<Page> {
  const [tab] = await Promise.all([page.context().waitForEvent('page'), click()])
  await tab.waitForLoadState('load')
  await waitForHydration(tab)
  return tab
}

describe('privacy notices in the browser', () => {
  it('from sign-up the privacy link opens the site’s notice, which leads to the competition’s', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-up', 'phone')
    try {
      const link = page.getByTestId('sign-up-privacy').getByRole('link', { name: /privacy notice/ })
      const site = await openedInNewTab(page, () => link.click())
      try {
        expect(new URL(site.url()).pathname).toBe('/privacy')
        await site.getByRole('heading', { level: 1, name: 'Privacy' }).waitFor()
        await site.getByRole('heading', { level: 2, name: 'What is kept about your account' }).waitFor()
        // Elsewhere than a competition's pages, the footer leads to the site's notice.
        expect(await site.getByTestId('footer-privacy').getAttribute('href')).toBe('/privacy')
        await screenshot(site, 'privacy-site-phone')

        await Promise.all([
          site.waitForURL(url => url.pathname === `/competitions/${competitionId}/privacy`),
          site.getByTestId('privacy-competitions').getByRole('link', { name: `Privacy notice of ${competitionName}` }).click(),
        ])
        await site.getByRole('heading', { level: 1, name: `Privacy notice of ${competitionName}` }).waitFor()
        const text = await site.locator('main').textContent()
        expect(text).toContain('privacy@heron-edge.example')
        expect(text).toContain('21 days after the last contest day')
        expect(text).toContain('Perdita Office')
      }
      finally {
        await site.close()
      }
    }
    finally {
      await page.close()
    }
  })

  it('the entry form links to the competition’s notice and refuses to send the entry until the box is ticked (phone)', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    const newEntry = `/competitions/${competitionId}/entries/new`
    try {
      await signInThroughForm(page, baseUrl, entrant.email, GOOD_PASSWORD, newEntry)
      await page.getByRole('heading', { name: `Enter ${competitionName}` }).waitFor()
      // On a competition's pages the footer leads to that competition's notice.
      expect(await page.getByTestId('footer-privacy').getAttribute('href')).toBe(`/competitions/${competitionId}/privacy`)

      const notice = await openedInNewTab(page, () => page.getByTestId('entry-privacy-link').click())
      try {
        expect(new URL(notice.url()).pathname).toBe(`/competitions/${competitionId}/privacy`)
        await notice.getByRole('heading', { level: 1, name: `Privacy notice of ${competitionName}` }).waitFor()
        await notice.getByRole('heading', { level: 2, name: 'Who sees it' }).waitFor()
        await screenshot(notice, 'privacy-competition-phone')
      }
      finally {
        await notice.close()
      }

      await page.getByLabel('Glider type').fill('Heron 15')
      await page.getByLabel('Registration').fill('G-HRON')
      await page.getByLabel('Competition ID').fill('hr')
      await page.getByRole('button', { name: 'Save the draft entry' }).click()
      const summary = page.getByTestId('error-summary')
      await summary.getByText('tick the box to confirm it').waitFor()
      expect(await summary.getByTestId('error-summary-field').allTextContents()).toEqual(['Privacy notice'])
      expect(await page.getByLabel('Privacy notice').getAttribute('aria-invalid')).toBe('true')
      await screenshot(page, 'entry-new-privacy-refused-phone')
      expect(new URL(page.url()).pathname).toBe(newEntry)
      expect(await testDb()('entries').where({ competition_id: competitionId }).count('* as n').first()).toEqual({ n: '0' })

      await page.getByLabel('Privacy notice').check()
      await Promise.all([
        page.waitForURL(/\/entries\/[0-9a-f-]{36}$/),
        page.getByRole('button', { name: 'Save the draft entry' }).click(),
      ])
      const entryId = new URL(page.url()).pathname.split('/').pop()
      const row = await testDb()('entries').where({ id: entryId }).first('privacy_confirmed_at', 'privacy_notice_version')
      expect(row.privacy_confirmed_at).toBeInstanceOf(Date)
      expect(row.privacy_notice_version).toMatch(/^[0-9a-f]{64}$/)
    }
    finally {
      await page.close()
    }
  })
})
