// Findings on screen: the entrant reads a blocking finding with its fix hint and caution on the
// dossier and counted on My entries (phone), and it goes once the firmware is fixed; the demo
// organiser filters the entries table to entries with blocking findings (wall). Screenshots in
// artifacts/screenshots/.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { join } from 'node:path'
import { artifactsDir, gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { collisionWarningUnit, createEntryVia, entriesWorld, entryBody, flightRecorderUnit, randomRadioId, type EntriesWorld } from '../support/entries'
import { DEMO_COMPETITION, DEMO_PASSWORD } from '../../seeds/demo-data'

const baseUrl = inject('baseUrl')

let browser: Browser
let w: EntriesWorld
let entryId: string
let unitId: string
let radioId: string
beforeAll(async () => {
  browser = await launchBrowser()
  w = await entriesWorld(baseUrl, 'Browser Findings Cup')
  entryId = await createEntryVia(w.entrant.client, w.competitionId, entryBody(w.classId, { compId: 'FB' }))
  radioId = randomRadioId()
  const units = `/api/competitions/${w.competitionId}/entries/${entryId}/units`
  // The test competition ends 2027-05-07: firmware expiring on that day stops the unit during it.
  const cw = await w.entrant.client.post(units, collisionWarningUnit({ radioId, firmwareExpiresOn: '2027-05-07' }))
  expect(cw.status).toBe(201)
  unitId = cw.body.id
  expect((await w.entrant.client.post(units, flightRecorderUnit())).status).toBe(201)
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('findings on screen', () => {
  it('on a phone: the entrant sees the blocking finding first, with its fix hint and caution; fixed, it goes', async () => {
    const path = `/competitions/${w.competitionId}/entries/${entryId}`
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await browser.context.clearCookies()
      await signInThroughForm(page, baseUrl, w.entrant.email, GOOD_PASSWORD, path)
      const section = page.getByTestId('findings')
      await section.getByRole('heading', { name: 'Findings' }).waitFor()
      expect(await section.textContent()).toContain('does not replace their judgement')

      const finding = section.locator('[data-check-id="firmware.valid-through-contest"]')
      await finding.waitFor()
      expect(await finding.getAttribute('data-severity')).toBe('blocking')
      expect(await finding.textContent()).toContain('Blocking')
      expect(await finding.getByTestId('finding-reason').textContent()).toContain('expires 2027-05-07, the last contest day is 2027-05-07')
      expect(await finding.getByTestId('finding-fix').textContent()).toContain('Update the unit to a firmware release that expires after 2027-05-07')
      expect(await finding.getByTestId('finding-caution').textContent()).toContain('Power the unit off before inserting or removing update media')
      expect(await finding.locator('svg[data-shape="blocking"]').count()).toBeGreaterThan(0)
      // Blocking before advisory.
      const severities = await section.getByTestId('finding').evaluateAll(els => els.map(e => e.getAttribute('data-severity')))
      expect(severities.indexOf('advisory') === -1 || severities.lastIndexOf('blocking') < severities.indexOf('advisory')).toBe(true)
      // Phone-first: nothing scrolls sideways.
      expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
      await finding.scrollIntoViewIfNeeded()
      await screenshot(page, 'findings-dossier-phone')
      await section.screenshot({ path: join(artifactsDir(), 'screenshots', 'findings-section-phone.png') })

      // My entries counts them.
      await gotoApp(page, baseUrl, '/entries')
      const card = page.getByTestId('my-entry').filter({ hasText: 'FB' })
      const counts = card.getByTestId('finding-counts')
      await counts.waitFor()
      expect(Number(await counts.getAttribute('data-blocking'))).toBeGreaterThan(0)
      expect(await counts.textContent()).toMatch(/\d+ blocking/)
      await screenshot(page, 'findings-my-entries-phone')

      const fixed = await w.entrant.client.request('PATCH', `/api/competitions/${w.competitionId}/entries/${entryId}/units/${unitId}`, collisionWarningUnit({ radioId, firmwareExpiresOn: '2028-05-01' }))
      expect(fixed.status).toBe(200)
      await gotoApp(page, baseUrl, path)
      await section.getByRole('heading', { name: 'Findings' }).waitFor()
      expect(await section.locator('[data-check-id="firmware.valid-through-contest"]').count()).toBe(0)
    }
    finally {
      await page.close()
    }
  })

  it('on a wall screen: the demo organiser filters the entries to those with blocking findings', async () => {
    const competition = await testDb()('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
    const path = `/competitions/${competition.id}/entries`
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'wall')
    try {
      await browser.context.clearCookies()
      await signInThroughForm(page, baseUrl, 'organiser@gridmark.example', DEMO_PASSWORD, path)
      const count = () => page.getByTestId('entries-count').textContent()
      await expect.poll(count).toContain('of 40 entries')
      await page.getByLabel('Findings').selectOption({ label: 'Has blocking findings' })
      await expect.poll(count).not.toContain('of 40 entries')
      expect(page.url()).toContain('findings=blocking')
      const blocking = await page.getByTestId('entry-row').getByTestId('finding-counts').evaluateAll(els => els.map(e => Number(e.getAttribute('data-blocking'))))
      expect(blocking.length).toBeGreaterThan(0)
      expect(blocking.every(n => n > 0)).toBe(true)
      const ids = await page.getByTestId('entry-row').locator('a.numerals-cid').allTextContents()
      for (const id of ['B2', 'F9', 'K7']) expect(ids.map(s => s.trim())).toContain(id)
      expect(await page.getByTestId('entries-export').getAttribute('href')).toContain('findings=blocking')
      await screenshot(page, 'findings-table-blocking-wall')
    }
    finally {
      await page.close()
    }
  })
})
