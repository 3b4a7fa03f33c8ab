// A grid check on a weak signal: the phone has the day's pack, and the server is slow to send
// a fresh one (its answer held back by the test). The glider opened from the day's list shows at
// once from the pack the phone holds — it does not wait for the download — and the fresh pack,
// when it comes, leaves the answers given meanwhile as they were. Opened by its address (the
// page loaded whole), the server's page brings the pack with it and the phone asks for none.
import type { Route } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb } from '../support/db'
import { launchBrowser, openPage, signInThroughForm, type Browser } from '../support/browser'
import { GOOD_PASSWORD } from '../support/api'
import { gridEntry, gridWorld, type GridWorld } from '../support/grid'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
let browser: Browser
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Browser Grid Weak Signal Cup')
  entryId = await gridEntry(w, { compId: 'WS' })
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

/** Holds every request for the day's pack until `release` (the worker's requests too). */
async function holdPack() {
  const held: Route[] = []
  let requested = 0
  const pattern = '**/grid/pack'
  await browser.context.route(pattern, (route) => {
    requested++
    held.push(route)
  })
  return {
    requested: () => requested,
    release: async () => {
      for (const r of held.splice(0)) await r.continue()
      await browser.context.unroute(pattern)
    },
  }
}

describe('a grid check on a weak signal', () => {
  it('shows the glider from the pack on the phone while the server’s fresh pack is still coming', async () => {
    const gridPath = `/competitions/${w.competitionId}/grid`
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, w.scrutineer.email, GOOD_PASSWORD, gridPath)
    await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
    await page.locator(`[data-testid="glider-list-item"][href*="/grid/${entryId}?"]`).waitFor()

    // From the day's list: the server does not answer for the pack.
    const pack = await holdPack()
    await page.locator(`[data-testid="glider-list-item"][href*="/grid/${entryId}?"]`).click()
    await page.locator('[data-testid="grid-check"][data-ready="true"] [data-testid="grid-check-cid"]').waitFor({ timeout: 10_000 })
    expect((await page.getByTestId('grid-check-cid').textContent())?.trim()).toBe('WS')
    await expect.poll(pack.requested, { timeout: 10_000 }).toBeGreaterThan(0)
    // Answered while the fresh pack is still on its way …
    const pass = page.locator('[data-testid="checklist-item"][data-item-id="antennas"] [data-result="pass"]')
    await pass.click()
    expect(await pass.getAttribute('aria-pressed')).toBe('true')
    // … and still so once it has come (the pack's time of keeping moves on).
    const keptAt = await page.getByTestId('grid-check').getAttribute('data-pack-at')
    expect(keptAt).not.toBeNull()
    await pack.release()
    await expect.poll(() => page.getByTestId('grid-check').getAttribute('data-pack-at'), { timeout: 10_000 }).not.toBe(keptAt)
    expect(await pass.getAttribute('aria-pressed')).toBe('true')

    // By its address (the page loaded whole): the server's page brings the day's pack with it,
    // so the glider is there and the phone, its pack kept, asks for none (a request for it
    // would be held, and the page would never finish opening).
    const again = await holdPack()
    await page.goto(`${baseUrl}${gridPath}/${entryId}`)
    await page.locator('[data-testid="grid-check"][data-opened="true"] [data-testid="grid-check-cid"]').waitFor({ timeout: 10_000 })
    expect((await page.getByTestId('grid-check-cid').textContent())?.trim()).toBe('WS')
    expect(again.requested()).toBe(0)
    expect(await page.getByTestId('grid-check').getAttribute('data-pack-at')).not.toBeNull()
    await again.release()
  })
})
