// A grid check loaded whole (a reload, a link opened) comes from the server with the glider,
// its units and the day's checklist in the page, and with the day's pack for the phone to
// keep: nothing waits for a second download. A copy of that page the worker kept, opened later
// with no signal, brings the pack of its day: when the phone holds a newer one (the dossier
// changed since), the newer one is what the page shows.
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../support/db'
import { launchBrowser, loseSignal, openLaunchGridForOffline, regainSignal, screenshot, waitForHydration, type Browser } from '../support/browser'
import { openCuttableLink, type CuttableLink } from '../support/cuttable-link'
import { gridEntry, gridWorld, type GridWorld } from '../support/grid'

const baseUrl = inject('baseUrl')

let browser: Browser
let link: CuttableLink
let w: GridWorld
let entryId: string
beforeAll(async () => {
  browser = await launchBrowser()
  link = await openCuttableLink(baseUrl)
  w = await gridWorld(baseUrl, 'Browser Grid Served Pack Cup')
  entryId = await gridEntry(w, { compId: 'SP' })
})
afterAll(async () => {
  await browser?.close()
  await link?.close()
  await closeTestDb()
})

/** The firmware version of the entry's collision-warning unit in the pack kept on the phone. */
const keptFirmware = (page: Page, id: string) => page.evaluate(async (entry) => {
  const db = await new Promise<IDBDatabase>((resolve, reject) => {
    const open = indexedDB.open('gridmark-grid-desk')
    open.onsuccess = () => resolve(open.result)
    open.onerror = () => reject(open.error)
  })
  const packs = await new Promise<{ pack: { entries: { dossier: { entry: { id: string }, units: { kind: string, firmwareVersion?: string }[] } }[] } }[]>((resolve, reject) => {
    const all = db.transaction('packs').objectStore('packs').getAll()
    all.onsuccess = () => resolve(all.result)
    all.onerror = () => reject(all.error)
  })
  db.close()
  const versions = packs.flatMap(p => p.pack.entries).filter(e => e.dossier.entry.id === entry)
    .flatMap(e => e.dossier.units).filter(u => u.kind === 'collision-warning').map(u => u.firmwareVersion)
  return versions.join(',')
}, id)

const shownFirmware = async (page: Page) => (await page.locator('[data-kind="collision-warning"] [data-testid="grid-unit-firmware"]').textContent())?.trim() ?? ''

describe('a grid check loaded whole', () => {
  it('has the glider, its units and the checklist in the server’s page, and the page’s pack yields to a newer one kept on the phone', async () => {
    const checkPath = `/competitions/${w.competitionId}/grid/${entryId}`
    const [unit] = await testDb()('units').where({ entry_id: entryId, kind: 'collision-warning' }).select('firmware_version', 'serial')

    // The server's answer alone, before any script runs: the glider, its units, the checklist.
    const { page } = await openLaunchGridForOffline(browser, link.url, w.scrutineer.email, w.competitionId)
    const html = await (await page.request.get(`${link.url}${checkPath}`)).text()
    expect(html).toContain('data-testid="grid-check-cid"')
    expect(html).toMatch(/data-testid="grid-check-cid"[^>]*>\s*SP\s*</)
    expect(html).toContain('Collision-warning unit')
    expect(html).toContain(unit.firmware_version)
    expect(html.match(/data-testid="checklist-item"/g)?.length).toBeGreaterThanOrEqual(3)
    expect(html).not.toContain('Opening the day’s pack')

    // Opened: the pack it came with is kept on the phone, and the worker keeps the page.
    await page.goto(`${link.url}${checkPath}`, { waitUntil: 'load' })
    await waitForHydration(page)
    await page.locator('[data-testid="grid-check"][data-opened="true"]').waitFor()
    expect(await page.getByTestId('grid-check').getAttribute('data-pack-at')).not.toBeNull()
    expect(await shownFirmware(page)).toBe(unit.firmware_version)
    await expect.poll(() => page.evaluate(async () => (await (await caches.open('gridmark-grid-pages')).match(location.href)) !== undefined)).toBe(true)

    // The dossier changes; the launch grid, opened online, keeps the newer pack.
    await testDb()('units').where({ entry_id: entryId, kind: 'collision-warning' }).update({ firmware_version: '9.9.9-served-test' })
    await page.goto(`${link.url}/competitions/${w.competitionId}/grid`, { waitUntil: 'load' })
    await waitForHydration(page)
    await expect.poll(() => keptFirmware(page, entryId)).toBe('9.9.9-served-test')

    // No signal: the worker serves its copy of the grid check, with the older pack in it; the
    // page shows the newer pack the phone holds.
    await loseSignal(browser, link)
    await page.goto(`${link.url}${checkPath}`, { waitUntil: 'load' })
    await waitForHydration(page)
    expect(await page.evaluate(() => document.getElementById('__NUXT_DATA__')?.dataset.ssr)).not.toBe('false')
    await page.locator('[data-testid="grid-check"][data-opened="true"]').waitFor()
    expect(await shownFirmware(page)).toBe('9.9.9-served-test')
    await screenshot(page, 'grid-check-served-offline')
    await regainSignal(browser, link)
  })
})
