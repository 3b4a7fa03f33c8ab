// The grid without signal: a scrutineer opens the launch-grid page online (the worker takes
// control, the day's pack is kept), loses the connection, records three grid checks by typed
// short codes, reloads the page still offline (it renders from the worker's cache and shows the
// three waiting), and when the connection returns they are sent: exactly three stored, none twice.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, createEntry } from '../support/db'
import { launchBrowser, loseSignal, openLaunchGridForOffline, regainSignal, screenshot, waitForHydration, type Browser } from '../support/browser'
import { openCuttableLink, type CuttableLink } from '../support/cuttable-link'
import { entriesWorld, type EntriesWorld } from '../support/entries'

const baseUrl = inject('baseUrl')

let browser: Browser
// The phone reaches the app through a link the test cuts when the signal goes.
let link: CuttableLink
let w: EntriesWorld
const entries: { id: string, code: string }[] = []
beforeAll(async () => {
  browser = await launchBrowser()
  link = await openCuttableLink(baseUrl)
  w = await entriesWorld(baseUrl, 'Browser Grid Offline Cup')
  const ids: string[] = []
  for (const compId of ['OA', 'OB', 'OC']) ids.push(await createEntry({ competitionId: w.competitionId, classId: w.classId, entrantUserId: w.entrant.user.id, compId, status: 'accepted' }))
  expect((await w.organiser.client.post(`/api/competitions/${w.competitionId}/tags`, { entryIds: ids })).status).toBeLessThan(300)
  const sheet = await w.organiser.client.get(`/api/competitions/${w.competitionId}/tags/sheet?entryIds=${ids.join(',')}`)
  for (const t of sheet.body.tags) entries.push({ id: t.entryId, code: t.tag.shortCode })
  expect(entries).toHaveLength(3)
})
afterAll(async () => {
  await browser?.close()
  await link?.close()
  await closeTestDb()
})

describe('the launch grid offline', () => {
  it('keeps three checks made offline across a reload and sends each exactly once when back online', async () => {
    const gridPath = `/competitions/${w.competitionId}/grid`
    // The page itself is in the worker's cache (put there by plugins/grid-page-cache.client.ts).
    const { page, day } = await openLaunchGridForOffline(browser, link.url, w.scrutineer.email, w.competitionId)
    expect(day).toMatch(/^\d{4}-\d{2}-\d{2}$/)

    await loseSignal(browser, link)
    await page.locator('[data-testid="sync-status"][data-online="false"]').waitFor()
    for (const e of entries) {
      await page.getByLabel('Short code').fill(e.code)
      await page.getByRole('button', { name: 'Open' }).click()
      await page.waitForURL(url => url.pathname === `${gridPath}/${e.id}`)
      await page.locator('[data-testid="grid-check"][data-ready="true"]').waitFor()
      await page.getByTestId('checklist-item').first().locator('[data-result="pass"]').click()
      await page.getByTestId('grid-check-submit').click()
      await page.locator('[data-testid="grid-check-outcome"][data-state="waiting"]').waitFor()
      await page.getByTestId('next-glider').click()
      await page.waitForURL(url => url.pathname === gridPath)
    }
    await page.locator('[data-testid="sync-status"][data-waiting="3"]').waitFor()

    // Reload with no signal: the worker serves the kept page, IndexedDB still holds the three.
    await page.reload({ waitUntil: 'load' })
    await waitForHydration(page)
    await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
    await page.locator('[data-testid="sync-status"][data-waiting="3"]').waitFor()
    expect(await page.getByTestId('sync-waiting').textContent()).toContain('3 checks waiting')
    expect(await page.getByTestId('last-scan').count()).toBe(3)
    await screenshot(page, 'grid-offline')

    const before = await w.scrutineer.client.get(`/api/competitions/${w.competitionId}/grid-checks?day=${day}`)
    expect(before.body.gridChecks).toHaveLength(0)

    await regainSignal(browser, link)
    await page.locator('[data-testid="sync-status"][data-waiting="0"]').waitFor({ timeout: 30_000 })
    // A second sync sends nothing again.
    await page.getByTestId('sync-now').click()
    await page.locator('[data-testid="sync-status"][data-waiting="0"]').waitFor()
    const after = await w.scrutineer.client.get(`/api/competitions/${w.competitionId}/grid-checks?day=${day}`)
    expect(after.status).toBe(200)
    const stored = after.body.gridChecks as { entryId: string, idempotencyKey: string, foundBy: string }[]
    expect(stored).toHaveLength(3)
    expect(new Set(stored.map(c => c.entryId))).toEqual(new Set(entries.map(e => e.id)))
    expect(new Set(stored.map(c => c.idempotencyKey)).size).toBe(3)
    expect(stored.every(c => c.foundBy === 'code')).toBe(true)
    expect(await page.getByTestId('sync-attention').count()).toBe(0)
  })
})
