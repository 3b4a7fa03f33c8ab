// The entrant's dossier on a contest day: the glider's readiness on today's board, kept live —
// the director's hold appears on the pilot's screen without a reload, with its reason, and the
// release clears it. Screenshot: entry-day-readiness.png (phone).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb } from '../support/db'
import { launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../support/grid'
import { openToday } from '../support/board'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
let browser: Browser
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Entrant Live Cup')
  entryId = await gridEntry(w, { compId: 'EL' })
  await openToday(w)
  expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))).status).toBe(201)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('the entrant’s view of today’s board', () => {
  it('shows the glider ready, then held with the director’s reason the moment it is held, then released', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, w.entrant.email, GOOD_PASSWORD, `/competitions/${w.competitionId}/entries/${entryId}`)
    const panel = page.getByTestId('entry-day-readiness')
    await panel.waitFor()
    expect(await panel.getAttribute('data-readiness')).toBe('ready')
    await page.getByTestId('entry-day-live').filter({ hasText: 'Live' }).waitFor()
    expect(await panel.textContent()).toContain('Grid check')

    expect((await w.director.client.post(`${w.base}/entries/${entryId}/hold`, { reason: 'Wing pins not secured' })).status).toBe(201)
    await page.locator('[data-testid="entry-day-readiness"][data-readiness="held"]').waitFor({ timeout: 3000 })
    expect(await page.getByTestId('entry-day-hold').textContent()).toContain('Wing pins not secured')
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
    await screenshot(page, 'entry-day-readiness')

    expect((await w.director.client.post(`${w.base}/entries/${entryId}/release`, { reason: 'Pins secured, checked' })).status).toBe(201)
    await page.locator('[data-testid="entry-day-readiness"][data-readiness="ready"]').waitFor({ timeout: 3000 })
    expect(await page.getByTestId('entry-day-hold').count()).toBe(0)
  })

  it('says it is connecting until it is live, and what its status line says never moves what follows on a phone', async () => {
    const page = await openPage(browser.context, baseUrl, `/competitions/${w.competitionId}/entries/${entryId}`, 'phone')
    // The server's page (no script run) says the truth of that moment.
    const html = await (await page.request.get(`${baseUrl}/competitions/${w.competitionId}/entries/${entryId}`)).text()
    expect(html).toMatch(/data-testid="entry-day-live"[^>]*>\s*Connecting…/)
    await page.getByTestId('entry-day-live').filter({ hasText: 'Live' }).waitFor()
    // Each of the line's three states in place: the next section stays where it is (a pilot
    // reading the finding below does not see it jump as the page goes live or loses the line).
    const tops = await page.evaluate(() => {
      const live = document.querySelector('[data-testid="entry-day-live"]')!
      const next = document.querySelector('[data-testid="status-banner"]')!
      return ['Connecting…', 'Live', 'Updates when the page is reloaded'].map((words) => {
        live.textContent = words
        return next.getBoundingClientRect().top
      })
    })
    expect(new Set(tops).size).toBe(1)
  })
})
