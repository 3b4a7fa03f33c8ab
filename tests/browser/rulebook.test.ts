// The rulebook on screen: an entrant follows a finding's rule link from the entry page and lands
// on that check, marked; the page opened at an anchor shows that check; at 390 px nothing
// scrolls sideways. On the grid phone, folded findings carry the caution mark and a rule link,
// and a failed antennas or ballast item shows the caution under it. Screenshots in
// artifacts/screenshots/.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { join } from 'node:path'
import type { Locator, Page } from 'playwright-core'
import { HARDWARE_CAUTION } from '#shared/engine'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, createEntry } from '../support/db'
import { artifactsDir, gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { collisionWarningUnit, createEntryVia, entriesWorld, entryBody, flightRecorderUnit, randomRadioId, type EntriesWorld } from '../support/entries'

const baseUrl = inject('baseUrl')

let browser: Browser
let w: EntriesWorld
let entryId: string
beforeAll(async () => {
  browser = await launchBrowser()
  w = await entriesWorld(baseUrl, 'Browser Rulebook Cup')
  entryId = await createEntryVia(w.entrant.client, w.competitionId, entryBody(w.classId, { compId: 'RB' }))
  const units = `/api/competitions/${w.competitionId}/entries/${entryId}/units`
  // The test competition ends 2027-05-07: firmware expiring on that day stops the unit during it.
  expect((await w.entrant.client.post(units, collisionWarningUnit({ radioId: randomRadioId(), firmwareExpiresOn: '2027-05-07' }))).status).toBe(201)
  expect((await w.entrant.client.post(units, flightRecorderUnit())).status).toBe(201)
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

/** A screenshot of one part of the page, beside the full-page ones. */
async function shoot(part: Locator, name: string): Promise<void> {
  await part.scrollIntoViewIfNeeded()
  await part.screenshot({ path: join(artifactsDir(), 'screenshots', `${name}.png`) })
}

async function noSidewaysScroll(page: Page): Promise<boolean> {
  return page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)
}

/** Whether the element's top is inside the viewport (a pixel's rounding either way allowed). */
async function inView(page: Page, id: string): Promise<boolean> {
  return page.evaluate((checkId) => {
    const top = document.getElementById(checkId)!.getBoundingClientRect().top
    return top > -2 && top < window.innerHeight / 2
  }, id)
}

describe('the rulebook', () => {
  it('on a phone: a finding’s rule link lands on its check in the rulebook, marked; nothing scrolls sideways', async () => {
    const entryPath = `/competitions/${w.competitionId}/entries/${entryId}`
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await browser.context.clearCookies()
      await signInThroughForm(page, baseUrl, w.entrant.email, GOOD_PASSWORD, entryPath)
      const finding = page.getByTestId('findings').locator('[data-check-id="firmware.valid-through-contest"]')
      const link = finding.getByTestId('finding-rule-link')
      await link.waitFor()
      expect(await link.textContent()).toContain('Rule: firmware.valid-through-contest')
      expect(await link.getAttribute('href')).toBe(`/competitions/${w.competitionId}/checks#firmware.valid-through-contest`)
      await shoot(finding, 'rulebook-finding-link-phone')

      await Promise.all([page.waitForURL(url => url.pathname.endsWith('/checks')), link.click()])
      expect(new URL(page.url()).hash).toBe('#firmware.valid-through-contest')
      await page.getByRole('heading', { name: 'Rulebook', level: 1 }).waitFor()
      const check = page.locator('[data-testid="rulebook-check"][data-check-id="firmware.valid-through-contest"]')
      await expect.poll(() => check.getAttribute('data-targeted')).toBe('true')
      await expect.poll(() => inView(page, 'firmware.valid-through-contest')).toBe(true)
      expect(await check.getByTestId('rulebook-setting').first().textContent()).toContain('0 days')
      expect(await check.getByTestId('rulebook-hardware').count()).toBe(1)
      await page.screenshot({ path: join(artifactsDir(), 'screenshots', 'rulebook-landed-phone.png') })

      // At 390 px the whole page fits, in normal and sunlight mode.
      for (const sunlight of [false, true]) {
        await browser.context.addCookies([{ name: 'gridmark-sunlight', value: sunlight ? 'on' : 'off', url: baseUrl }])
        await gotoApp(page, baseUrl, `/competitions/${w.competitionId}/checks`)
        await page.getByTestId('rulebook-check').first().waitFor()
        expect(await page.evaluate(() => window.innerWidth)).toBe(390)
        expect(await noSidewaysScroll(page)).toBe(true)
        await screenshot(page, `rulebook-${sunlight ? 'sunlight-' : ''}phone`)
      }
      await browser.context.addCookies([{ name: 'gridmark-sunlight', value: 'off', url: baseUrl }])

      // The competition's pages name the rulebook for an entrant too.
      await gotoApp(page, baseUrl, `/competitions/${w.competitionId}`)
      expect(await page.getByTestId('competition-pages').getByRole('link', { name: 'Rulebook' }).getAttribute('href')).toBe(`/competitions/${w.competitionId}/checks`)
    }
    finally {
      await page.close()
    }
  })

  it('on a desk: the page opened at a check’s anchor shows that check, marked', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    try {
      await browser.context.clearCookies()
      await signInThroughForm(page, baseUrl, w.scrutineer.email, GOOD_PASSWORD, `/competitions/${w.competitionId}`)
      await gotoApp(page, baseUrl, `/competitions/${w.competitionId}/checks#mass.class-limit`)
      const check = page.locator('[data-testid="rulebook-check"][data-check-id="mass.class-limit"]')
      expect(await check.evaluate(el => el.matches(':target'))).toBe(true)
      await expect.poll(() => inView(page, 'mass.class-limit')).toBe(true)
      expect(await check.getByTestId('rulebook-settings').textContent()).toContain('Standard: maximum take-off mass: 525 kg')
      expect(await noSidewaysScroll(page)).toBe(true)
      await screenshot(page, 'rulebook-anchor-desk')
    }
    finally {
      await page.close()
    }
  })
})

describe('cautions on the grid phone', () => {
  it('marks folded findings that carry the caution, links each to its rule, and shows the caution under a failed antennas item', async () => {
    // No units, documents or payment: more findings than the grid shows unfolded, one of them
    // (no flight recorder) with the hardware caution.
    const bare = await createEntry({ competitionId: w.competitionId, classId: w.classId, entrantUserId: w.entrant.user.id, compId: 'RG', status: 'accepted' })
    const path = `/competitions/${w.competitionId}/grid/${bare}`
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await browser.context.clearCookies()
      await signInThroughForm(page, baseUrl, w.scrutineer.email, GOOD_PASSWORD, path)
      await page.locator('[data-testid="grid-check"][data-ready="true"]').waitFor()
      const folded = page.getByTestId('findings-folded')
      await folded.waitFor()
      const recorder = folded.locator('[data-testid="folded-finding"][data-check-id="recorder.present"]')
      expect(await recorder.getByTestId('finding-caution-mark').count()).toBe(1)
      expect(await recorder.getByTestId('finding-caution-mark').textContent()).toContain('Caution')
      expect(await folded.locator('[data-testid="folded-finding"][data-check-id="entry.paid"]').getByTestId('finding-caution-mark').count()).toBe(0)
      expect(await recorder.getByTestId('finding-rule-link').getAttribute('href')).toBe(`/competitions/${w.competitionId}/checks#recorder.present`)

      const antennas = page.locator('[data-testid="checklist-item"][data-item-id="antennas"]')
      expect(await antennas.getByTestId('checklist-caution').count()).toBe(0)
      await antennas.locator('[data-result="fail"]').click()
      await antennas.getByTestId('checklist-caution').waitFor()
      expect(await antennas.getByTestId('checklist-caution').textContent()).toContain(HARDWARE_CAUTION)
      // An item whose failure is no work on hardware shows none.
      const tag = page.locator('[data-testid="checklist-item"][data-item-id="tag-readable"]')
      await tag.locator('[data-result="fail"]').click()
      expect(await tag.getByTestId('checklist-caution').count()).toBe(0)
      expect(await noSidewaysScroll(page)).toBe(true)
      await shoot(folded, 'rulebook-grid-folded-phone')
      await shoot(antennas, 'rulebook-grid-caution-phone')
      // Passed again, the caution goes.
      await antennas.locator('[data-result="pass"]').click()
      await expect.poll(() => antennas.getByTestId('checklist-caution').count()).toBe(0)
    }
    finally {
      await page.close()
    }
  })
})
