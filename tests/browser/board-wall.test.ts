// The wall board in full screen at 1920 × 1080 and at 3840 × 2160, with a field of forty
// gliders in three classes and every readiness state: every tile is on the screen without
// scrolling; the competition IDs and readiness words are read from five metres (capital
// height at least 1/40 of the screen's height); each held and caution glider's reason is shown
// whole in the reason strip; the four states differ in brightness, so a grey screenshot tells
// them apart; the last check names the scrutineer, never initials alone. Screenshots of both
// sizes in artifacts/screenshots/board-wall-fit-*.png.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, createClass, testDb } from '../support/db'
import { launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../support/grid'
import { decodePng, meanLuminance } from '../support/png'

const baseUrl = inject('baseUrl')

// The demo's field: forty competition IDs, three classes in turn.
const COMP_IDS = ['K7', 'T3', 'B2', 'M5', 'F9', 'R4', 'H8', 'A1', 'C4', 'D6', 'E2', 'G5', 'J3', 'L8', 'N1', 'P6', 'Q9', 'S2', 'U7', 'V4', 'W1', 'X8', 'Y3', 'Z5', 'AB', 'CD', 'EF', 'GH', 'JK', 'LM', 'NP', 'QR', 'ST', 'UV', 'WX', 'YZ', '11', '22', '33', '44']
const READY = ['K7', 'T3', 'B2', 'M5', 'F9', 'R4', 'A1', 'C4', 'E2', 'G5', 'J3', 'L8', 'P6', 'Q9']
const CAUTION = ['H8', 'S2']
const FAILED = { compId: 'D6', note: 'Lower antenna cable loose at the fin' }
const HOLDS: Record<string, string> = {
  N1: 'Tail dolly left on the glider; see the director before launch',
  U7: 'Water ballast dump valve leaking onto the grid; drain, have the valve checked by the glider’s maintainer and show the director the entry in the technical log before this glider is launched today',
}

let w: GridWorld
const entry: Record<string, string> = {}
const browsers: Browser[] = []

beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Browser Wall Cup')
  const thirdClassId = await createClass(w.competitionId, 'Eighteen Metre')
  const classOf = [w.classId, thirdClassId, w.otherClassId]
  for (let i = 0; i < COMP_IDS.length; i += 8) {
    const batch = COMP_IDS.slice(i, i + 8)
    const ids = await Promise.all(batch.map(compId => gridEntry(w, { compId })))
    batch.forEach((compId, j) => (entry[compId] = ids[j]!))
  }
  const classNames = ['Standard', 'Eighteen Metre', 'Club']
  for (const [i, compId] of COMP_IDS.entries()) {
    await testDb()('entries').where({ id: entry[compId] }).update({ class_id: classOf[i % 3] })
    // The recorder's declaration follows the class, or it would be a finding of its own.
    await testDb()('igc_files').where({ entry_id: entry[compId] }).update({ declared_class: classNames[i % 3] })
  }
  // An old firmware update: an advisory finding, so these read "caution" once checked.
  await testDb()('units').whereIn('entry_id', CAUTION.map(c => entry[c]!)).where({ kind: 'collision-warning' }).update({ firmware_updated_on: '2025-02-01' })

  const opened = await w.director.client.post(`${w.base}/days`, { kind: 'practice' })
  expect([200, 201]).toContain(opened.status)
  for (const compId of [...READY, ...CAUTION]) {
    const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entry[compId]!))
    expect(res.status).toBe(201)
  }
  const failed = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entry[FAILED.compId]!, {
    answers: [
      { itemId: 'cwu-operating', result: 'pass' },
      { itemId: 'cwu-firmware', result: 'pass' },
      { itemId: 'antennas', result: 'fail', note: FAILED.note },
    ],
  }))
  expect(failed.status).toBe(201)
  for (const [compId, reason] of Object.entries(HOLDS)) {
    const held = await w.director.client.post(`${w.base}/entries/${entry[compId]}/hold`, { reason })
    expect(held.status).toBe(201)
  }
}, 180_000)

afterAll(async () => {
  for (const b of browsers) await b.close()
  await closeTestDb()
})

interface Box { x: number, y: number, width: number, height: number }

/** The board fitted to the wall: in full screen (the button), or on `?wall` (a kiosk browser, no button pressed). */
async function openWall(size: { width: number, height: number }, how: 'button' | 'address' = 'button'): Promise<Page> {
  const browser = await launchBrowser()
  browsers.push(browser)
  const page = await openPage(browser.context, baseUrl, '/sign-in', 'wall')
  await page.setViewportSize(size)
  await signInThroughForm(page, baseUrl, w.director.email, GOOD_PASSWORD, `/competitions/${w.competitionId}/board${how === 'address' ? '?wall' : ''}`)
  await page.locator('[data-testid="board"][data-connection="live"][data-loaded="true"]').waitFor({ timeout: 20_000 })
  if (how === 'button') {
    await page.getByTestId('board-fullscreen').click()
    await page.waitForFunction(() => document.fullscreenElement?.getAttribute('data-testid') === 'board')
  }
  await page.locator('[data-testid="board-tiles"][data-fit-scale]').waitFor()
  await page.evaluate(() => document.fonts.ready.then(() => undefined))
  return page
}

/** Capital height in px of an element's own font, measured on a canvas ("H"'s ascent). */
function capHeights(page: Page, testId: string): Promise<number[]> {
  return page.getByTestId(testId).evaluateAll((els) => {
    const ctx = document.createElement('canvas').getContext('2d')!
    return els.map((el) => {
      const s = getComputedStyle(el)
      ctx.font = `${s.fontStyle} ${s.fontWeight} ${s.fontSize} ${s.fontFamily}`
      return ctx.measureText('H').actualBoundingBoxAscent
    })
  })
}

// "Differs by 15 %": |L1 − L2| / max(L1, L2) ≥ 0.15, L the mean relative luminance (WCAG 2)
// of every pixel of a tile's screenshot.
const differs = (a: number, b: number) => Math.abs(a - b) / Math.max(a, b) >= 0.15

async function assertWall(page: Page, size: { width: number, height: number }, name: string) {
  const { width, height } = size
  // Every glider, every tile inside the screen, and nothing to scroll.
  const tiles = page.getByTestId('board-tile')
  expect(await tiles.count()).toBe(40)
  // The layout settles once the screen's size is measured (fonts, header and strip laid out).
  await expect.poll(() => tiles.evaluateAll(els => Math.max(...els.map(e => e.getBoundingClientRect().bottom))), { timeout: 5000 }).toBeLessThanOrEqual(height)
  const boxes = await tiles.evaluateAll(els => els.map((e) => {
    const r = e.getBoundingClientRect()
    return { x: r.x, y: r.y, width: r.width, height: r.height }
  })) as Box[]
  for (const b of boxes) {
    expect(b.x, JSON.stringify(b)).toBeGreaterThanOrEqual(0)
    expect(b.y, JSON.stringify(b)).toBeGreaterThanOrEqual(0)
    expect(b.x + b.width, JSON.stringify(b)).toBeLessThanOrEqual(width)
    expect(b.y + b.height, JSON.stringify(b)).toBeLessThanOrEqual(height)
  }
  const scrolls = await page.evaluate(() => [document.fullscreenElement ?? document.querySelector('[data-testid="board"]')!, document.querySelector('[data-testid="board-tiles"]')!]
    .map(e => ({ v: e.scrollHeight - e.clientHeight, h: e.scrollWidth - e.clientWidth })))
  for (const s of scrolls) expect(s, JSON.stringify(scrolls)).toEqual({ v: 0, h: 0 })

  // Read from five metres: capitals at least 1/40 of the screen's height.
  const least = height / 40
  for (const testId of ['board-tile-cid', 'board-tile-word']) {
    const caps = await capHeights(page, testId)
    expect(caps.length).toBe(40)
    expect(Math.min(...caps), `${testId} at ${width}×${height}`).toBeGreaterThanOrEqual(least)
  }

  // Each held and caution glider's reason, whole, in the strip on the screen.
  const snapshot = await w.director.client.get(`${w.base}/board`)
  expect(snapshot.status).toBe(200)
  const reasons = new Map<string, string>()
  for (const t of snapshot.body.tiles as { entryId: string, readiness: string, headline: { text: string } | null }[]) {
    if (t.readiness === 'held' || t.readiness === 'caution') reasons.set(t.entryId, t.headline!.text)
  }
  expect(reasons.size).toBe(CAUTION.length + 1 + Object.keys(HOLDS).length)
  expect(await page.getByTestId('board-reasons').getAttribute('data-count')).toBe(String(reasons.size))
  const seen = new Set<string>()
  let datesSeen = 0
  for (let i = 0; i < reasons.size; i++) {
    const shown = page.getByTestId('board-reason')
    const entryId = (await shown.getAttribute('data-entry-id'))!
    expect(reasons.has(entryId)).toBe(true)
    seen.add(entryId)
    // The strip's glider is outlined on the board.
    expect(await page.locator(`[data-testid="board-tile"][data-entry-id="${entryId}"]`).getAttribute('data-featured')).toBe('true')
    const text = page.getByTestId('board-reason-text')
    await expect.poll(() => text.evaluate((el: HTMLElement) => {
      const box = el.parentElement!
      return el.scrollWidth <= el.clientWidth && el.offsetHeight <= box.clientHeight + 1
    })).toBe(true)
    const whole = await text.evaluate((el) => {
      const s = getComputedStyle(el)
      const r = el.getBoundingClientRect()
      return { text: el.textContent!.trim(), overflow: s.textOverflow, clamp: s.getPropertyValue('-webkit-line-clamp'), bottom: r.bottom, right: r.right, size: parseFloat(s.fontSize) }
    })
    expect(whole.text).toBe(reasons.get(entryId))
    expect(whole.overflow).not.toBe('ellipsis')
    expect(['none', '']).toContain(whole.clamp)
    expect(whole.bottom).toBeLessThanOrEqual(height)
    expect(whole.right).toBeLessThanOrEqual(width)
    // Large: a long reason is set smaller to fit whole, but never below 1/54 of the screen (20 px at 1080).
    expect(whole.size).toBeGreaterThanOrEqual(height / 54)
    // A date or a registration is never broken at its hyphen over two lines.
    const unbroken = await text.evaluate(el => [...el.querySelectorAll('[data-unbroken]')].map(s => ({ text: s.textContent, lines: s.getClientRects().length })))
    for (const date of reasons.get(entryId)!.match(/\d{4}-\d{2}-\d{2}/g) ?? []) {
      expect(unbroken.map(u => u.text)).toContain(date)
      datesSeen++
    }
    expect(unbroken.filter(u => u.lines !== 1)).toEqual([])
    if (i === 1) await screenshot(page, `board-wall-fit-${name}-reason`)
    await page.getByTestId('board-reason-next').click()
    await page.locator(`[data-testid="board-reason"]:not([data-entry-id="${entryId}"])`).waitFor()
  }
  expect(seen.size).toBe(reasons.size)
  // The demo's reasons name dates (a firmware's or a document's expiry): the rule above was met.
  expect(datesSeen).toBeGreaterThan(0)

  // Four states, four brightnesses: each pair of states' tiles differs by at least 15 %.
  const luminance: Record<string, number> = {}
  for (const [state, compId] of [['ready', 'K7'], ['caution', 'H8'], ['held', 'N1'], ['unchecked', 'V4']] as const) {
    const tile = page.locator(`[data-testid="board-tile"][data-entry-id="${entry[compId]}"]`)
    expect(await tile.getAttribute('data-readiness')).toBe(state)
    luminance[state] = meanLuminance(decodePng(await tile.screenshot()))
  }
  const states = Object.keys(luminance)
  for (const a of states) {
    for (const b of states) {
      if (a < b) expect(differs(luminance[a]!, luminance[b]!), `${a} ${luminance[a]} vs ${b} ${luminance[b]}`).toBe(true)
    }
  }

  // The last check says when and by whom in words; nothing in it reads as a competition ID.
  const checkLines = await page.getByTestId('board-tile-check').evaluateAll(els => els.map(el => ({
    text: (el as HTMLElement).innerText.trim(),
    parts: [el, ...el.querySelectorAll('*')].map(e => (e as HTMLElement).innerText?.trim() ?? ''),
  })))
  for (const line of checkLines) {
    for (const part of line.parts) expect(part, line.text).not.toMatch(/^[A-Z0-9]{1,3}$/)
  }
  // What the screen shows (the words for screen readers aside).
  const k7 = await page.locator(`[data-testid="board-tile"][data-entry-id="${entry.K7}"]`).getByTestId('board-tile-check').evaluate((el) => {
    const copy = el.cloneNode(true) as HTMLElement
    copy.querySelectorAll('.sr-only').forEach(e => e.remove())
    return copy.textContent!.trim()
  })
  expect(k7).toMatch(/^\d\d:\d\d by S\. Scrutineer$/)

  await screenshot(page, `board-wall-fit-${name}`)
  return luminance
}

describe('the wall board in full screen', () => {
  it('shows the whole field of forty, readable from five metres, at 1920 × 1080 and at 3840 × 2160', async () => {
    const hd = { width: 1920, height: 1080 }
    const page = await openWall(hd)
    await assertWall(page, hd, 'hd')

    // The same screen grown to 2160 lines: the tiles follow.
    const uhd = { width: 3840, height: 2160 }
    const before = await page.getByTestId('board-tiles').getAttribute('data-fit-k')
    await page.setViewportSize(uhd)
    await page.waitForFunction(() => document.fullscreenElement?.getBoundingClientRect().height === 2160)
    await page.locator(`[data-testid="board-tiles"][data-fit-k]:not([data-fit-k="${before}"])`).waitFor()
    await assertWall(page, uhd, 'uhd')

    // And a wall opened at that size from the start.
    const fresh = await openWall(uhd)
    await assertWall(fresh, uhd, 'uhd-fresh')
  }, 240_000)

  it('fits the same way on a kiosk browser opened on ?wall, without Full screen pressed', async () => {
    const hd = { width: 1920, height: 1080 }
    const page = await openWall(hd, 'address')
    expect(await page.evaluate(() => document.fullscreenElement)).toBeNull()
    // The board covers the whole window, from its top edge; the page under it does not scroll.
    expect(await page.getByTestId('board').evaluate(e => e.getBoundingClientRect().top)).toBe(0)
    expect(await page.evaluate(() => document.scrollingElement!.scrollHeight <= window.innerHeight)).toBe(true)
    await assertWall(page, hd, 'hd-address')
  }, 120_000)
})
