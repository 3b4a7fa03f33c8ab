// The audit log a page at a time: "Older entries" and "Newest" are links whose address holds
// the filters and the cursor, so a page can be reloaded or shared; long texts wrap on a phone.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { closeTestDb, testDb } from '../support/db'
import { competitionWithRoles, type RoleClients } from '../support/setup'

const baseUrl = inject('baseUrl')

let browser: Browser
let t: RoleClients
beforeAll(async () => {
  browser = await launchBrowser()
  t = await competitionWithRoles(baseUrl, 'Audit Pages Cup')
  // Invented history: 120 rows a second apart, 90 holds and 30 releases, each with a long
  // unbroken reason.
  const start = Date.parse('2027-05-02T07:00:00.000Z')
  await testDb()('audit_log').insert(Array.from({ length: 120 }, (_, i) => ({
    at: new Date(start + i * 1000),
    actor_user_id: t.ids.director,
    competition_id: t.competitionId,
    action: i % 4 === 0 ? 'director.release' : 'director.hold',
    subject_type: 'entry',
    details: { reason: `Reason-${i}-${'x'.repeat(120)}` },
  })))
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('audit log pages in the browser', () => {
  it('pages back 50 rows at a time with the filter kept in the address, and back to the newest', async () => {
    const email = (await testDb()('users').where({ id: t.ids.director }).first('email')).email
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      const path = `/competitions/${t.competitionId}/audit`
      await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD, path)
      await page.getByTestId('audit-card').first().waitFor()
      expect(await page.getByTestId('audit-card').count()).toBe(50)
      expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
      await screenshot(page, 'audit-pages-phone')

      await page.getByRole('link', { name: 'Older entries' }).click()
      await page.waitForURL(url => /_\d+$/.test(url.searchParams.get('before') ?? ''))
      await expect.poll(() => page.getByTestId('audit-card').first().textContent()).toContain('Reason-69-')
      expect(await page.getByTestId('audit-card').count()).toBe(50)

      // A filter starts again from the newest; its older page keeps it.
      await page.getByLabel('Action').selectOption({ label: 'Held' })
      await page.waitForURL(url => url.searchParams.get('action') === 'director.hold' && !url.searchParams.has('before'))
      await expect.poll(() => page.getByTestId('audit-card').first().textContent()).toContain('Reason-119-')
      expect(await page.getByTestId('audit-card').count()).toBe(50)
      await page.getByRole('link', { name: 'Older entries' }).click()
      await page.waitForURL(url => url.searchParams.get('action') === 'director.hold' && url.searchParams.has('before'))
      await expect.poll(() => page.getByTestId('audit-card').count()).toBe(40)
      expect(await page.getByRole('link', { name: 'Older entries' }).count()).toBe(0)

      // The address alone opens that page again; "Newest" goes back, the filter kept.
      const older = new URL(page.url())
      await gotoApp(page, baseUrl, older.pathname + older.search)
      await expect.poll(() => page.getByTestId('audit-card').count()).toBe(40)
      await page.getByRole('link', { name: 'Newest' }).click()
      await page.waitForURL(url => url.searchParams.get('action') === 'director.hold' && !url.searchParams.has('before'))
      await expect.poll(() => page.getByTestId('audit-card').count()).toBe(50)
    }
    finally {
      await page.close()
    }
  })
})

