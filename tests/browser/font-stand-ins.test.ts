// Barlow arrives after the page is drawn (on a weak signal, seconds after): until then the page
// is set in a stand-in, the platform's sans-serif sized to Barlow (assets/css/main.css). Nothing
// may move when Barlow comes: a scrutineer about to tap a glider, or a pilot reading a finding,
// must not see the page jump under the finger. Here Barlow's files are held back until the page
// is up and settled, then let through; every block of the page's main part keeps its place.
// (Before the stand-ins, this machine's fallback moved the entry page's last blocks by 530 px.)
// Nor may the page move as the app takes over the server's HTML: what the server draws is where
// it stays (the layout shifts the browser reports, from the start of the load).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { closeTestDb } from '../support/db'
import { launchBrowser, openPage, VIEWPORTS, waitForHydration, type ViewportName } from '../support/browser'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../support/grid'
import { openToday } from '../support/board'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Stand-in Cup')
  entryId = await gridEntry(w, { compId: 'SI' })
  await gridEntry(w, { compId: 'S2' })
  await openToday(w)
  expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))).status).toBe(201)
})
afterAll(async () => {
  await closeTestDb()
})

/** Top and height of every block of the page's main part, with its first words. */
function blocks(page: Page): Promise<string[]> {
  return page.evaluate(() => [...document.querySelectorAll('main section, main h1, main h2, main h3, main p, main li, main dt, main label, main a')]
    .map((el) => {
      const r = el.getBoundingClientRect()
      return `${Math.round(r.top)} ${Math.round(r.height)} ${(el.textContent ?? '').trim().slice(0, 50)}`
    }))
}

/** A browser of its own (nothing cached: Barlow is fetched anew), signed in with `cookie`. */
async function browserWith(cookie: string) {
  const browser = await launchBrowser()
  const [name, ...value] = cookie.split('=')
  await browser.context.addCookies([{ name: name!, value: value.join('='), url: baseUrl }])
  return browser
}

const barlowLoaded = (page: Page) => page.evaluate(() => [...document.fonts].filter(f => f.family === 'Barlow' && f.status === 'loaded').length)

/** The page drawn in the stand-ins and settled (`settled` resolves), then Barlow let through. */
async function movesWhenBarlowArrives(cookie: string, path: string, viewport: ViewportName, settled: (page: Page) => Promise<unknown>) {
  const browser = await browserWith(cookie)
  try {
    const page = await browser.context.newPage()
    await page.setViewportSize(VIEWPORTS[viewport])
    let release!: () => void
    const held = new Promise<void>((resolve) => { release = resolve })
    await page.route('**/*.woff2', async (route) => {
      await held
      await route.continue()
    })
    await page.goto(new URL(path, baseUrl).toString(), { waitUntil: 'domcontentloaded' })
    await waitForHydration(page)
    await settled(page)
    expect(await barlowLoaded(page)).toBe(0)
    const before = await blocks(page)
    release()
    await page.waitForFunction(() => document.fonts.status === 'loaded' && [...document.fonts].some(f => f.family === 'Barlow' && f.status === 'loaded'))
    await page.evaluate(() => new Promise(resolve => requestAnimationFrame(() => resolve(undefined))))
    expect(await barlowLoaded(page)).toBeGreaterThan(0)
    const after = await blocks(page)
    expect(after.length).toBe(before.length)
    const moved = before.flatMap((b, i) => {
      const [top, height] = b.split(' ').map(Number)
      const [top2, height2] = after[i]!.split(' ').map(Number)
      return Math.abs(top! - top2!) > 2 || Math.abs(height! - height2!) > 2 ? [`${b} → ${after[i]}`] : []
    })
    return { moved, blocks: before.length }
  }
  finally {
    await browser.close()
  }
}

describe('the page set in Barlow’s stand-in keeps its layout when Barlow arrives (common practice: size-adjusted fallback fonts)', () => {
  it('the launch grid on a phone', async () => {
    const { moved, blocks: n } = await movesWhenBarlowArrives(w.scrutineer.client.cookie, `/competitions/${w.competitionId}/grid`, 'phone',
      page => page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor())
    expect(n).toBeGreaterThan(10)
    expect(moved).toEqual([])
  })

  it('the entry page on a phone', async () => {
    const { moved, blocks: n } = await movesWhenBarlowArrives(w.entrant.client.cookie, `/competitions/${w.competitionId}/entries/${entryId}`, 'phone',
      page => page.getByTestId('entry-day-live').filter({ hasText: 'Live' }).waitFor())
    expect(n).toBeGreaterThan(20)
    expect(moved).toEqual([])
  })

  it('the board on the wall', async () => {
    const { moved, blocks: n } = await movesWhenBarlowArrives(w.director.client.cookie, `/competitions/${w.competitionId}/board`, 'wall',
      page => page.locator('[data-connection="live"]').first().waitFor())
    expect(n).toBeGreaterThan(2)
    expect(moved).toEqual([])
  })
})

/** The layout shifts the browser reported since the page began loading, with what moved. */
async function layoutShifts(page: Page): Promise<{ total: number, moved: string[] }> {
  return page.evaluate(() => new Promise((resolve) => {
    const moved: string[] = []
    let total = 0
    new PerformanceObserver((list) => {
      for (const e of list.getEntries() as (PerformanceEntry & { value: number, hadRecentInput: boolean, sources: { node?: Node }[] })[]) {
        if (e.hadRecentInput) continue
        total += e.value
        // A hair (a button nudged sideways by a shorter word beside it) is not a jump.
        if (e.value >= 0.001) for (const s of e.sources) moved.push(`${e.value.toFixed(4)} ${(s.node?.textContent ?? '').trim().slice(0, 60)}`)
      }
      resolve({ total, moved })
    }).observe({ type: 'layout-shift', buffered: true })
    // No shift at all: the observer has nothing to report.
    setTimeout(() => resolve({ total, moved }), 500)
  }))
}

describe('the page as the server drew it does not move as the app starts (common practice: no layout shift)', () => {
  it('the launch grid on a phone: the camera’s button is drawn by the server, the short code stays put', async () => {
    const browser = await browserWith(w.scrutineer.client.cookie)
    try {
      const page = await openPage(browser.context, baseUrl, `/competitions/${w.competitionId}/grid`, 'phone')
      await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
      await page.evaluate(() => document.fonts.ready.then(() => undefined))
      const html = await (await page.request.get(`${baseUrl}/competitions/${w.competitionId}/grid`)).text()
      expect(html).toContain('data-testid="open-camera"')
      const { total, moved } = await layoutShifts(page)
      expect(moved).toEqual([])
      expect(total).toBeLessThan(0.002)
    }
    finally {
      await browser.close()
    }
  })
})
