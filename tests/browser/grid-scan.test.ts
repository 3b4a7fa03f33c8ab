// The scrutineer's phone on the launch grid: the camera reads a glider's tag and the grid check
// screen opens; typing the short code does the same; a check with a weigh-in shows its outcome
// at once and is stored on the server. Screenshots in artifacts/screenshots/.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, createEntry } from '../support/db'
import { launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { entriesWorld, type EntriesWorld } from '../support/entries'
import { fakeCameraArgs } from '../support/fake-camera'

const baseUrl = inject('baseUrl')

let w: EntriesWorld
let entryId: string
let tagUrl: string
let shortCode: string
const browsers: Browser[] = []
beforeAll(async () => {
  w = await entriesWorld(baseUrl, 'Browser Grid Scan Cup')
  entryId = await createEntry({ competitionId: w.competitionId, classId: w.classId, entrantUserId: w.entrant.user.id, compId: 'GS', status: 'accepted' })
  const issued = await w.organiser.client.post(`/api/competitions/${w.competitionId}/tags`, { entryIds: [entryId] })
  expect(issued.status).toBeLessThan(300)
  const sheet = await w.organiser.client.get(`/api/competitions/${w.competitionId}/tags/sheet?entryIds=${entryId}`)
  expect(sheet.status).toBe(200)
  tagUrl = sheet.body.tags[0].url
  shortCode = sheet.body.tags[0].tag.shortCode
})
afterAll(async () => {
  for (const b of browsers) await b.close()
  await closeTestDb()
})

const gridPath = () => `/competitions/${w.competitionId}/grid`

describe('scanning a tag on the grid', () => {
  it('the camera decodes the tag and the glider’s grid check screen opens; its library loads only when the camera is opened', async () => {
    const browser = await launchBrowser({ args: await fakeCameraArgs(tagUrl) })
    browsers.push(browser)
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    // Every script the page fetches, and whether it is the scanner's library (its own name is in it).
    const scripts: { url: string, scanner: Promise<boolean> }[] = []
    page.on('response', (response) => {
      if (response.request().resourceType() !== 'script') return
      scripts.push({ url: response.url(), scanner: response.text().then(t => t.includes('html5-qrcode'), () => false) })
    })
    await signInThroughForm(page, baseUrl, w.scrutineer.email, GOOD_PASSWORD, gridPath())
    await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
    expect(await page.getByTestId('tag-scanner').getAttribute('data-state')).toBe('idle')
    const before = scripts.length
    expect(before).toBeGreaterThan(0)
    expect(await Promise.all(scripts.map(s => s.scanner))).not.toContain(true)

    await page.getByTestId('open-camera').click()
    // The library (about 375 KB before gzip) is fetched and parsed now, then the camera starts and
    // decodes about a second of frames: generous under a loaded CI machine.
    // A camera that fails, or a tag the page refuses, says so on the page: reported as such.
    const refused = page.locator('[data-testid="scan-message"], [data-testid="tag-scanner"]:is([data-state="failed"], [data-state="denied"], [data-state="no-camera"], [data-state="unsupported"])')
    const outcome = await Promise.race([
      page.waitForURL(url => url.pathname === `${gridPath()}/${entryId}`, { timeout: 60_000 }).then(() => 'opened'),
      refused.first().waitFor({ timeout: 60_000 }).then(() => 'refused'),
    ]).catch(async (error: Error) => `neither (${error.message.split('\n')[0]}); the camera: ${await page.getByTestId('tag-scanner').getAttribute('data-state').catch(() => '?')}`)
    if (outcome !== 'opened') {
      const said = await page.locator('[data-testid="scan-message"], [data-testid="tag-scanner-message"]').allTextContents().catch(() => [])
      await screenshot(page, 'grid-scan-failed')
      expect.fail(`The camera did not open the glider: ${outcome}; the page says: ${said.join(' | ')}`)
    }
    const after = await Promise.all(scripts.slice(before).map(s => s.scanner))
    expect(after).toContain(true)
    expect(new URL(page.url()).searchParams.get('foundBy')).toBe('scan')
    await page.getByTestId('grid-check-cid').waitFor()
    expect((await page.getByTestId('grid-check-cid').textContent())?.trim()).toBe('GS')
    expect(await page.locator('h1').count()).toBe(1)
  }, 120_000)

  it('typing the short code opens the same screen; a check with a weigh-in shows its outcome and is stored', async () => {
    const browser = await launchBrowser()
    browsers.push(browser)
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, w.scrutineer.email, GOOD_PASSWORD, gridPath())
    await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
    await screenshot(page, 'grid-scanner')

    // A wrong code is refused in words; the right one, typed in lower case, opens the entry.
    await page.getByLabel('Short code').fill('XXXX')
    await page.getByRole('button', { name: 'Open' }).click()
    await page.locator('#grid-short-code-error').waitFor()
    await page.getByLabel('Short code').fill(shortCode.toLowerCase())
    expect(await page.getByLabel('Short code').inputValue()).toBe(`${shortCode.slice(0, 4)}-${shortCode.slice(4)}`)
    await page.getByRole('button', { name: 'Open' }).click()
    await page.waitForURL(url => url.pathname === `${gridPath()}/${entryId}`)
    await page.locator('[data-testid="grid-check"][data-ready="true"]').waitFor()

    const items = page.getByTestId('checklist-item')
    const n = await items.count()
    expect(n).toBeGreaterThan(0)
    for (let i = 0; i < n; i++) await items.nth(i).locator('[data-result="pass"]').click()
    expect(await items.first().locator('[data-result="pass"]').getAttribute('aria-pressed')).toBe('true')
    await page.getByTestId('weigh-toggle').click()
    await page.getByTestId('weigh-weight-0').fill('310')
    await page.getByTestId('weigh-arm-0').fill('0.12')
    await page.getByTestId('weigh-weight-1').fill('25')
    await page.getByTestId('weigh-arm-1').fill('4.5')
    expect(await page.getByTestId('weigh-mass').textContent()).toContain('335.0 kg')
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
    await screenshot(page, 'grid-check')
    await page.getByTestId('grid-check-submit').click()

    const outcome = page.getByTestId('grid-check-outcome')
    await outcome.or(page.getByRole('alert')).first().waitFor()
    expect(await page.getByRole('alert').allTextContents()).toEqual([])
    const shown = await outcome.getAttribute('data-readiness')
    expect(['ready', 'caution', 'held']).toContain(shown)
    await page.locator('[data-testid="grid-check-outcome"][data-state="recorded"]').waitFor()

    const day = await page.evaluate(() => document.querySelector('[data-testid="grid-check"]')?.getAttribute('data-day'))
    const list = await w.scrutineer.client.get(`/api/competitions/${w.competitionId}/grid-checks?day=${day}`)
    expect(list.status).toBe(200)
    const mine = list.body.gridChecks.filter((c: { entryId: string }) => c.entryId === entryId)
    expect(mine).toHaveLength(1)
    expect(mine[0].foundBy).toBe('code')
    expect(mine[0].weighIn.massKg).toBeCloseTo(335, 6)
    // The server keeps the arm to 0.1 mm.
    expect(mine[0].weighIn.cgArmM).toBeCloseTo(149.7 / 335, 3)
    expect(mine[0].readiness).toBe(shown)

    await page.getByTestId('next-glider').click()
    await page.waitForURL(url => url.pathname === gridPath())
    await page.getByTestId('last-scan').first().waitFor()
    expect(await page.getByTestId('last-scan').first().textContent()).toContain('GS')
  })
})
