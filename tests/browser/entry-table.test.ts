// The staff entries table on a phone (cards) and a wall screen (table): filter, search, sort, page.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, createClass, testDb } from '../support/db'
import { launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { competitionWithRoles, insertGeneratedEntries, type RoleClients } from '../support/setup'

const baseUrl = inject('baseUrl')

let browser: Browser
let t: RoleClients
beforeAll(async () => {
  browser = await launchBrowser()
  t = await competitionWithRoles(baseUrl, 'Browser Table Cup')
  const classIds = [await createClass(t.competitionId, 'Standard'), await createClass(t.competitionId, 'Club')]
  await insertGeneratedEntries(t.competitionId, classIds, t.ids.entrant, 60)
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

async function signIn(page: Page, who: 'organiser' | 'scrutineer') {
  await browser.context.clearCookies()
  const email = (await testDb()('users').where({ id: t.ids[who] }).first('email')).email
  await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD, `/competitions/${t.competitionId}/entries`)
  await page.getByRole('heading', { name: 'Entries', level: 1 }).waitFor()
}

const count = (page: Page) => page.getByTestId('entries-count').textContent()

describe('staff entries table', () => {
  it('on a wall screen: sorts by a column header, filters by class and status, searches, pages, links to the dossier', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'wall')
    try {
      await signIn(page, 'organiser')
      await expect.poll(() => count(page)).toContain('1–25 of 60 entries')
      await page.getByTestId('entries-export').waitFor()
      await screenshot(page, 'entries-wall')

      // The test cluster's collation is byte order, as JavaScript's < on ASCII names.
      const names = (await testDb()('entries').where({ competition_id: t.competitionId }).pluck('pilot_name')) as string[]
      names.sort((a, b) => (a.toLowerCase() < b.toLowerCase() ? -1 : 1))
      await page.getByRole('button', { name: 'Pilot' }).click()
      await expect.poll(() => page.locator('th[aria-sort="ascending"]').textContent()).toContain('Pilot')
      await expect.poll(() => page.getByTestId('entry-row').first().textContent()).toContain(names[0])
      await page.getByRole('button', { name: 'Pilot' }).click()
      await expect.poll(() => page.locator('th[aria-sort="descending"]').textContent()).toContain('Pilot')
      await expect.poll(() => page.getByTestId('entry-row').first().textContent()).toContain(names.at(-1))

      await page.getByRole('button', { name: 'Next →' }).click()
      await expect.poll(() => count(page)).toContain('26–50 of 60')
      expect(page.url()).toContain('page=2')

      await page.getByLabel('Class').selectOption({ label: 'Club' })
      await expect.poll(() => count(page)).toContain('of 30 entries')
      await page.getByLabel('Status').selectOption('accepted')
      await expect.poll(() => count(page)).toContain('1–6 of 6 entries')
      await page.getByLabel('Search').fill('d-1007')
      await expect.poll(() => count(page)).toContain('1–1 of 1 entry')
      expect(await page.getByTestId('entry-row').first().textContent()).toMatch(/Accepted.*Paid|Accepted.*Unpaid|Accepted.*Refunded/)
      await screenshot(page, 'entries-filtered-wall')
      const link = page.getByTestId('entry-row').first().getByRole('link').first()
      expect(await link.getAttribute('href')).toMatch(new RegExp(`^/competitions/${t.competitionId}/entries/[0-9a-f-]{36}$`))
      expect(await page.getByTestId('entries-export').getAttribute('href')).toContain('q=d-1007')
    }
    finally {
      await page.close()
    }
  })

  it('on a phone: cards, a sort menu, search and filters; no CSV button for a scrutineer; no sideways scrolling', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signIn(page, 'scrutineer')
      await page.getByTestId('entry-card').first().waitFor()
      expect(await page.getByTestId('entries-export').count()).toBe(0)
      await screenshot(page, 'entries-phone')

      await page.getByLabel('Sort', { exact: true }).selectOption('submitted')
      await page.getByRole('button', { name: /switch to descending/ }).click()
      await expect.poll(() => page.url()).toContain('direction=desc')
      await page.getByLabel('Payment').selectOption('refunded')
      await page.getByLabel('Search').fill('ridgeway')
      // Ridgeway pilots are entries 20–29; of those, 25–29 are refunded.
      await expect.poll(() => count(page)).toContain('1–5 of 5 entries')
      await expect.poll(() => page.getByTestId('entry-card').count()).toBe(5)
      const cards = await page.getByTestId('entry-card').allTextContents()
      expect(cards.every(c => /Refunded/.test(c) && /Ridgeway/i.test(c))).toBe(true)
      const { scrollWidth, innerWidth } = await page.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth }))
      expect(scrollWidth).toBeLessThanOrEqual(innerWidth)
      await screenshot(page, 'entries-filtered-phone')

      // Sunlight mode on the grid: the same cards, higher contrast, still no sideways scrolling.
      await browser.context.addCookies([{ name: 'gridmark-sunlight', value: 'on', url: baseUrl }])
      await page.reload()
      await page.getByTestId('entry-card').first().waitFor()
      expect(await page.evaluate(() => document.documentElement.classList.contains('sunlight'))).toBe(true)
      const wide = await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)
      expect(wide).toBe(true)
      await screenshot(page, 'entries-sunlight-phone')
      await browser.context.addCookies([{ name: 'gridmark-sunlight', value: 'off', url: baseUrl }])
    }
    finally {
      await page.close()
    }
  })
})
