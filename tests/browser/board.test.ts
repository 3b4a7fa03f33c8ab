// The live readiness board in Chromium against the built server: a grid check submitted on
// the API shows on the director's wall screen within a second and is highlighted; filters
// live in the address; when the server stops, the board says it is reconnecting, and when
// the server returns it is live again and shows what changed meanwhile. Screenshots at wall,
// desk and phone sizes in artifacts/screenshots/.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { launchBrowser, openPage, screenshot, signInThroughForm, VIEWPORTS, type Browser } from '../support/browser'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../support/grid'
import { startServer, type RunningServer } from '../support/server'

const baseUrl = inject('baseUrl')

let w: GridWorld
/** Entries by competition ID. */
const entry: Record<string, string> = {}
const browsers: Browser[] = []
const servers: RunningServer[] = []

beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Browser Board Cup')
  // Two classes, a dozen gliders: enough to see the wall screen's columns.
  const ids = ['3', '7', '12', '21', '33', '48', 'AB', 'K5', 'LX', 'M1', 'P8', 'Z9']
  for (const compId of ids) entry[compId] = await gridEntry(w, { compId })
  await testDb()('entries').whereIn('id', ['AB', 'K5', 'LX', 'M1', 'P8', 'Z9'].map(c => entry[c]!)).update({ class_id: w.otherClassId })
  // An old firmware update: an advisory finding, so this glider reads "caution" once checked.
  await testDb()('units').where({ entry_id: entry.K5, kind: 'collision-warning' }).update({ firmware_updated_on: '2025-02-01' })

  // Today is not a scheduled day of this competition: the director opens it as a practice day.
  const opened = await w.director.client.post(`${w.base}/days`, { kind: 'practice' })
  expect([200, 201]).toContain(opened.status)

  // Some history on the board: checks that pass, one that fails an item, one advisory, a hold.
  for (const compId of ['3', '21', 'AB', 'K5', 'M1']) {
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entry[compId]!))
    expect(res.status).toBe(201)
  }
  const failed = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entry['48']!, {
    answers: [
      { itemId: 'cwu-operating', result: 'pass' },
      { itemId: 'cwu-firmware', result: 'pass' },
      { itemId: 'antennas', result: 'fail', note: 'Lower antenna cable loose' },
    ],
  }))
  expect(failed.status).toBe(201)
  const held = await w.director.client.post(`${w.base}/entries/${entry.LX}/hold`, { reason: 'Tail dolly left on the glider; see the director before launch' })
  expect(held.status).toBe(201)
})

afterAll(async () => {
  for (const b of browsers) await b.close()
  for (const s of servers) await s.stop()
  await closeTestDb()
})

const boardPath = () => `/competitions/${w.competitionId}/board`
const tileOf = (page: Page, entryId: string) => page.locator(`[data-testid="board-tile"][data-entry-id="${entryId}"]`)

async function openBoardAsDirector(origin: string, viewport: keyof typeof VIEWPORTS): Promise<Page> {
  const browser = await launchBrowser()
  browsers.push(browser)
  const page = await openPage(browser.context, origin, '/sign-in', viewport)
  await signInThroughForm(page, origin, w.director.email, GOOD_PASSWORD, boardPath())
  await page.locator('[data-testid="board"][data-connection="live"][data-loaded="true"]').waitFor({ timeout: 20_000 })
  return page
}

const noSideScroll = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)

describe('the readiness board', () => {
  it('shows a grid check on the wall screen within a second of the API’s answer, highlighted', async () => {
    const page = await openBoardAsDirector(baseUrl, 'wall')
    expect(await page.locator('h1').count()).toBe(1)
    expect(await page.locator('h1').textContent()).toContain('Browser Board Cup')
    expect(await page.getByTestId('board-day').getAttribute('data-status')).toBe('open')
    expect(await page.getByTestId('board-live').textContent()).toContain('Live')
    expect(await page.getByTestId('board-tile').count()).toBe(12)
    // Grouped by class, in the snapshot's (competition-ID) order.
    const snapshot = await w.director.client.get(`${w.base}/board`)
    expect(snapshot.status).toBe(200)
    const order = await page.getByTestId('board-tile-cid').allTextContents()
    const classesInOrder = snapshot.body.classes as { id: string, name: string }[]
    const tilesInOrder = snapshot.body.tiles as { compId: string, classId: string }[]
    expect(order.map(s => s.trim())).toEqual(classesInOrder.flatMap(c => tilesInOrder.filter(t => t.classId === c.id).map(t => t.compId)))
    expect((await page.getByTestId('board-class').locator('h2').allTextContents()).map(s => s.trim())).toEqual(snapshot.body.classes.map((c: { name: string }) => c.name))
    expect(await tileOf(page, entry['48']!).getAttribute('data-readiness')).toBe('held')
    expect(await tileOf(page, entry['48']!).getByTestId('board-tile-headline').textContent()).toContain('Failed on the grid: Antennas')
    expect(await tileOf(page, entry.LX!).getAttribute('data-readiness')).toBe('held')
    expect(await tileOf(page, entry.K5!).getAttribute('data-readiness')).toBe('caution')
    expect(await tileOf(page, entry['7']!).getAttribute('data-readiness')).toBe('unchecked')
    expect(await tileOf(page, entry['7']!).getByTestId('board-tile-check').textContent()).toContain('Not checked yet')
    expect(await page.getByTestId('board-count-held').getAttribute('data-count')).toBe('2')
    expect(await tileOf(page, entry['7']!).getAttribute('href')).toBe(`${boardPath()}/${entry['7']}`)
    // About eleven tiles across at 1920 px: the width of a class's row over one tile's.
    const across = await page.evaluate(() => {
      const row = document.querySelector('[data-testid="board-class-tiles"]')!.getBoundingClientRect().width
      const tile = document.querySelector('[data-testid="board-tile"]')!.getBoundingClientRect().width
      return { row, tile, perRow: Math.floor(row / tile) }
    })
    expect(across.perRow, JSON.stringify(across)).toBeGreaterThanOrEqual(10)
    expect(across.perRow, JSON.stringify(across)).toBeLessThanOrEqual(12)

    // A scrutineer's grid check arrives through the API; the tile follows within a second.
    const target = entry['7']!
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(target))
    expect(res.status).toBe(201)
    const answeredAt = Date.now()
    const readiness = res.body.gridCheck.readiness as string
    expect(readiness).not.toBe('unchecked')
    await page.locator(`[data-testid="board-tile"][data-entry-id="${target}"][data-readiness="${readiness}"]`).waitFor({ timeout: 1000 })
    expect(Date.now() - answeredAt).toBeLessThan(1000)
    expect(await tileOf(page, target).getAttribute('data-changed')).toBe('true')
    expect(await tileOf(page, target).getByTestId('board-tile-check').textContent()).toMatch(/\d\d:\d\d by S\. Scrutineer/)
    await screenshot(page, 'board-wall')

    // The highlight is brief.
    await page.locator(`[data-testid="board-tile"][data-entry-id="${target}"][data-changed="false"]`).waitFor({ timeout: 8000 })
    expect(await noSideScroll(page)).toBe(true)

    // The chime is remembered on this device; sunlight mode keeps every state readable.
    const chime = page.getByTestId('board-chime')
    expect(await chime.getAttribute('aria-pressed')).toBe('false')
    await chime.click()
    await expect.poll(() => chime.getAttribute('aria-pressed')).toBe('true')
    await page.getByTestId('sunlight-toggle').click()
    await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('sunlight'))).toBe(true)
    await page.reload({ waitUntil: 'load' })
    await page.locator('[data-testid="board"][data-connection="live"][data-loaded="true"]').waitFor()
    expect(await page.getByTestId('board-chime').getAttribute('aria-pressed')).toBe('true')
    expect(await noSideScroll(page)).toBe(true)
    await screenshot(page, 'board-wall-sunlight')
    await page.getByTestId('sunlight-toggle').click()
  })

  it('keeps its filters in the address and fits a laptop and a phone', async () => {
    const page = await openBoardAsDirector(baseUrl, 'desk')
    expect(await noSideScroll(page)).toBe(true)
    await screenshot(page, 'board-desk')

    await page.locator('[data-testid="board-filter-state"][data-state="held"]').click()
    await page.waitForURL(url => url.searchParams.get('readiness') === 'held')
    await page.locator('[data-testid="board-tile"]').nth(1).waitFor()
    const shown = await page.locator('[data-testid="board-tile"]').evaluateAll(els => els.map(e => e.getAttribute('data-readiness')))
    expect(shown).toEqual(['held', 'held'])
    expect(await page.locator('[data-testid="board-filter-state"][data-state="held"]').getAttribute('aria-pressed')).toBe('true')
    await screenshot(page, 'board-desk-filtered')

    // A bookmarked filtered address opens filtered.
    await page.goto(new URL(`${boardPath()}?readiness=ready,caution&class=${w.otherClassId}`, baseUrl).toString())
    await page.locator('[data-testid="board"][data-loaded="true"]').waitFor()
    await page.locator('[data-testid="board-tile"]').first().waitFor()
    const filtered = await page.getByTestId('board-tile-cid').allTextContents()
    expect(filtered.map(s => s.trim()).sort()).toEqual(['AB', 'K5', 'M1'])
    await page.getByTestId('board-filter-clear').click()
    await page.waitForURL(url => !url.searchParams.has('readiness') && !url.searchParams.has('class'))
    await page.locator('[data-testid="board-tile"]').nth(11).waitFor()

    await page.setViewportSize(VIEWPORTS.phone)
    expect(await noSideScroll(page)).toBe(true)
    await screenshot(page, 'board-phone')
    await page.setViewportSize(VIEWPORTS.narrowPhone)
    expect(await noSideScroll(page)).toBe(true)
  })

  it('says so when no day has been opened yet', async () => {
    const other = await gridWorld(baseUrl, 'Browser Board No Day Cup')
    const browser = await launchBrowser()
    browsers.push(browser)
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    const path = `/competitions/${other.competitionId}/board`
    await signInThroughForm(page, baseUrl, other.director.email, GOOD_PASSWORD, path)
    await page.locator('[data-testid="board"][data-connection="live"]').waitFor()
    await page.getByTestId('board-no-day').waitFor()
    expect(await page.getByTestId('board-no-day').textContent()).toContain('The contest director opens the day on Contest days.')
    expect(await page.getByTestId('board-no-day').getByRole('link', { name: 'Contest days' }).getAttribute('href')).toBe(`/competitions/${other.competitionId}/days`)
    await screenshot(page, 'board-no-day')
  })

  it('shows a day closed while it is open on the screen, and says the board shows how it ended', async () => {
    const other = await gridWorld(baseUrl, 'Browser Board Closing Cup')
    const first = await gridEntry(other, { compId: 'C1' })
    await gridEntry(other, { compId: 'C2' })
    const opened = await other.director.client.post(`${other.base}/days`, { kind: 'practice' })
    expect(opened.status).toBe(201)
    const checked = await other.scrutineer.client.post(`${other.base}/grid-checks`, checkBody(first))
    expect(checked.status).toBe(201)

    const browser = await launchBrowser()
    browsers.push(browser)
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    await signInThroughForm(page, baseUrl, other.director.email, GOOD_PASSWORD, `/competitions/${other.competitionId}/board`)
    await page.locator('[data-testid="board"][data-connection="live"][data-loaded="true"]').waitFor({ timeout: 20_000 })
    expect(await page.getByTestId('board-closed').count()).toBe(0)

    const closed = await other.director.client.post(`${other.base}/days/${opened.body.day.day}/close`)
    expect(closed.status).toBe(200)
    // Pushed as a day change: the board is fetched again, no reload.
    await page.locator('[data-testid="board-day"][data-status="closed"]').waitFor({ timeout: 5000 })
    expect(await page.getByTestId('board-closed').textContent()).toContain('shows how it ended')
    expect(await page.getByTestId('board-tile').count()).toBe(2)
    // One class has gliders on this board: no chips to choose between classes.
    expect(await page.getByTestId('board-filter-class').count()).toBe(0)
    await screenshot(page, 'board-closed')
  })

  it('says it is reconnecting while the server is away, then is live again with what changed meanwhile', async () => {
    const own = await startServer()
    servers.push(own)
    const port = own.port
    const page = await openBoardAsDirector(own.url, 'desk')
    const target = entry['12']!
    expect(await tileOf(page, target).getAttribute('data-readiness')).toBe('unchecked')

    await own.stop()
    servers.splice(servers.indexOf(own), 1)
    await page.locator('[data-testid="board"]:is([data-connection="reconnecting"], [data-connection="offline"])').waitFor({ timeout: 15_000 })
    expect(await page.getByTestId('board-live').textContent()).toMatch(/Reconnecting…|Offline since \d\d:\d\d/)
    expect(await page.getByTestId('board-live').getAttribute('role')).toBe('status')
    expect(await page.getByTestId('board-stale').textContent()).toContain('Not live since')
    await screenshot(page, 'board-reconnecting')

    // While this screen's server is away, a check is recorded through another instance.
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(target))
    expect(res.status).toBe(201)
    const readiness = res.body.gridCheck.readiness as string

    const back = await startServer({}, port)
    servers.push(back)
    await page.locator('[data-testid="board"][data-connection="live"]').waitFor({ timeout: 30_000 })
    expect(await page.getByTestId('board-live').textContent()).toContain('Live')
    expect(await page.getByTestId('board-stale').count()).toBe(0)
    // Live means the board was fetched after the new join: the change is already there.
    expect(await tileOf(page, target).getAttribute('data-readiness')).toBe(readiness)
    expect(await tileOf(page, target).getAttribute('data-changed')).toBe('true')
  }, 120_000)
})
