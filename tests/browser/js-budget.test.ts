// The JavaScript budget (issue "On the field", item 1): before anyone touches it, each page loads
// at most its budget of gzipped script — the launch grid and a grid check 150 KB, the board
// 120 KB, the landing page 100 KB — counted cold, every script until the network is idle
// (tests/support/js-weight.ts, the same count `npm run bench` prints). A size, not a time.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb } from '../support/db'
import { launchBrowser, type Browser } from '../support/browser'
import { gridEntry, gridWorld, type GridWorld } from '../support/grid'
import { JS_BUDGET_KB, measurePageJs } from '../support/js-weight'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
const browsers: Browser[] = []
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Browser Budget Cup')
  entryId = await gridEntry(w, { compId: 'JB' })
  const opened = await w.director.client.post(`${w.base}/days`, { kind: 'practice' })
  expect([200, 201]).toContain(opened.status)
})
afterAll(async () => {
  for (const b of browsers) await b.close()
  await closeTestDb()
})

/** A blank page in a fresh browser (nothing cached), signed in with `cookie` when given. */
async function freshPage(cookie?: string) {
  const browser = await launchBrowser()
  browsers.push(browser)
  if (cookie) {
    const [name, ...value] = cookie.split('=')
    await browser.context.addCookies([{ name: name!, value: value.join('='), url: baseUrl }])
  }
  return await browser.context.newPage()
}

/**
 * The page opened in a fresh browser, signed in with `cookie` when given; it must show `shown`
 * (the page itself, not a sign-in or error page that weighs less).
 */
async function weigh(path: string, shown: string, cookie?: string) {
  const page = await freshPage(cookie)
  const weight = await measurePageJs(page, new URL(path, baseUrl).toString())
  expect(await page.locator(shown).count()).toBe(1)
  return weight
}

describe('gzipped JavaScript before first interaction', () => {
  it('the landing page stays within 100 KB', async () => {
    const weight = await weigh('/', 'h1:has-text("Every glider on the grid")')
    expect(weight.gzKb, JSON.stringify(weight.scripts)).toBeLessThanOrEqual(JS_BUDGET_KB.landing)
  })

  it('the launch grid stays within 150 KB, without the camera scanner', async () => {
    const weight = await weigh(`/competitions/${w.competitionId}/grid`, '[data-testid="grid-scanner"][data-ready="true"]', w.scrutineer.client.cookie)
    expect(weight.gzKb, JSON.stringify(weight.scripts)).toBeLessThanOrEqual(JS_BUDGET_KB.grid)
  })

  it('a grid check stays within 150 KB', async () => {
    const weight = await weigh(`/competitions/${w.competitionId}/grid/${entryId}`, '[data-testid="grid-check-cid"]', w.scrutineer.client.cookie)
    expect(weight.gzKb, JSON.stringify(weight.scripts)).toBeLessThanOrEqual(JS_BUDGET_KB.grid_check)
  })

  it('the board stays within 120 KB', async () => {
    const weight = await weigh(`/competitions/${w.competitionId}/board`, '[data-testid="board"]', w.director.client.cookie)
    expect(weight.gzKb, JSON.stringify(weight.scripts)).toBeLessThanOrEqual(JS_BUDGET_KB.board)
  })
})

describe('the browser\'s locale data', () => {
  // Its first date or number format costs a page 30–70 ms on a desktop (docs/bench.md); a worker
  // started by the page's head pays it beside the page, and must run to its end under the CSP.
  it('is loaded by a worker the page starts from its head, which runs to its end', async () => {
    const page = await freshPage(w.director.client.cookie)
    const errors: string[] = []
    page.on('console', msg => msg.type() === 'error' && errors.push(msg.text()))
    page.on('pageerror', error => errors.push(error.message))
    // Heard from the moment it starts: it may well end before the page has loaded.
    const ended = new Promise<void>((resolve) => {
      page.on('worker', (worker) => {
        if (new URL(worker.url()).pathname === '/warm-intl.js') worker.once('close', () => resolve())
      })
    })
    await page.goto(new URL(`/competitions/${w.competitionId}/board`, baseUrl).toString())
    await ended
    // The board, which formats times as it starts, came up.
    await page.locator('[data-testid="board"][data-connection="live"]').waitFor()
    expect(errors).toEqual([])
  })
})

describe('V8\'s compile hint', () => {
  // A script marked `//# allFunctionsCalledOnLoad` is compiled whole off the main thread while it
  // downloads (nuxt.config.ts, docs/bench.md): every script of 8 KB or more that the launch grid
  // loads carries it; smaller ones are left as they are.
  it('heads every script of 8 KB or more that the launch grid loads as it starts', async () => {
    const page = await freshPage(w.scrutineer.client.cookie)
    const heads = new Map<string, Promise<string>>()
    page.on('response', (response) => {
      if (response.request().resourceType() !== 'script' || !new URL(response.url()).pathname.startsWith('/_nuxt/')) return
      heads.set(response.url(), response.text().then(text => (text.length >= 8192 ? text.slice(0, 40) : 'small')))
    })
    await page.goto(new URL(`/competitions/${w.competitionId}/grid`, baseUrl).toString())
    await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
    await page.waitForLoadState('networkidle')
    const large = (await Promise.all([...heads].map(async ([url, head]) => [url, await head] as const))).filter(([, head]) => head !== 'small')
    expect(large.length).toBeGreaterThanOrEqual(3)
    for (const [url, head] of large) expect(head, url).toMatch(/^\/\/# allFunctionsCalledOnLoad\n/)
  })
})

