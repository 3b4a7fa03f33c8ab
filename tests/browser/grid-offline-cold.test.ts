// A grid check never opened online, opened with no signal: a scrutineer opens the launch grid
// online once (the worker takes control, the day's pack and the grid app shell are kept), loses
// the connection and opens a glider's grid check by its address (a cold navigation, as from a
// bookmark or the day's list) and by its tag link. The worker serves the shell, the page guard
// goes on with the session kept on the phone, the page renders the glider from the pack; a check
// recorded there survives a reload and is sent exactly once when the signal returns. A
// competition whose pack is not on the phone, an unknown tag and a signed-out phone get words,
// never another user's or competition's page.
import { randomUUID } from 'node:crypto'
import type { Page } from 'playwright-core'
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
const entries: { id: string, compId: string, tagPath: string }[] = []
beforeAll(async () => {
  browser = await launchBrowser()
  link = await openCuttableLink(baseUrl)
  w = await entriesWorld(baseUrl, 'Browser Grid Cold Link Cup')
  const ids: string[] = []
  for (const compId of ['CA', 'CB']) ids.push(await createEntry({ competitionId: w.competitionId, classId: w.classId, entrantUserId: w.entrant.user.id, compId, status: 'accepted' }))
  expect((await w.organiser.client.post(`/api/competitions/${w.competitionId}/tags`, { entryIds: ids })).status).toBeLessThan(300)
  const sheet = await w.organiser.client.get(`/api/competitions/${w.competitionId}/tags/sheet?entryIds=${ids.join(',')}`)
  for (const t of sheet.body.tags) entries.push({ id: t.entryId, compId: t.compId, tagPath: new URL(t.url).pathname })
  entries.sort((a, b) => a.compId.localeCompare(b.compId))
  expect(entries.map(e => e.compId)).toEqual(['CA', 'CB'])
})
afterAll(async () => {
  await browser?.close()
  await link?.close()
  await closeTestDb()
})

/** The page came from the grid app shell (rendered on the phone), not from the server. */
const renderedOnPhone = (page: Page) => page.evaluate(() => document.getElementById('__NUXT_DATA__')?.dataset.ssr === 'false')

const keptSessionOf = (page: Page) => page.evaluate(() => new Promise<string | null>((resolve) => {
  const open = indexedDB.open('gridmark-session')
  open.onerror = () => resolve(null)
  open.onsuccess = () => {
    const db = open.result
    if (!db.objectStoreNames.contains('session')) return resolve(null)
    const get = db.transaction('session').objectStore('session').get('me')
    get.onsuccess = () => resolve((get.result as { me?: { user?: { name?: string } } } | undefined)?.me?.user?.name ?? null)
    get.onerror = () => resolve(null)
  }
}))

describe('a grid check from a cold link offline', () => {
  it('renders from the pack, keeps a check across a reload, sends it once, and keeps nothing after sign-out', async () => {
    const gridPath = `/competitions/${w.competitionId}/grid`
    const [ca, cb] = entries as [typeof entries[number], typeof entries[number]]
    const { page, day } = await openLaunchGridForOffline(browser, link.url, w.scrutineer.email, w.competitionId)
    expect(day).toMatch(/^\d{4}-\d{2}-\d{2}$/)
    // The shell is kept beside the grid page, and the session the server confirmed. (Polled from
    // here: waitForFunction would take the predicate's promise itself for a yes.)
    await expect.poll(() => page.evaluate(async () => (await caches.match('/grid-shell', { cacheName: 'gridmark-grid-pages' })) !== undefined)).toBe(true)
    await expect.poll(() => keptSessionOf(page)).toBe(w.scrutineer.user.name)

    await loseSignal(browser, link)
    await page.locator('[data-testid="sync-status"][data-online="false"]').waitFor()

    // A grid check never opened on this phone, by its address.
    await page.goto(`${link.url}${gridPath}/${ca.id}`, { waitUntil: 'load' })
    await waitForHydration(page)
    await page.locator('[data-testid="grid-check"][data-ready="true"]').waitFor()
    expect(await renderedOnPhone(page)).toBe(true)
    expect(await page.getByTestId('grid-check-cid').textContent()).toContain('CA')
    await page.getByTestId('checklist-item').first().locator('[data-result="pass"]').click()
    await page.getByTestId('grid-check-submit').click()
    await page.locator('[data-testid="grid-check-outcome"][data-state="waiting"]').waitFor()
    await screenshot(page, 'grid-offline-cold-check')

    // Reloaded with no signal: the shell again, the glider again, the check still on the phone.
    await page.reload({ waitUntil: 'load' })
    await waitForHydration(page)
    await page.locator('[data-testid="grid-check"][data-ready="true"]').waitFor()
    expect(await page.getByTestId('grid-check-cid').textContent()).toContain('CA')
    await page.getByRole('link', { name: 'Back to the launch grid' }).click()
    await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
    await page.locator('[data-testid="sync-status"][data-waiting="1"]').waitFor()

    // A tag link never opened on this phone: the pack knows the tag, the page leads to the glider.
    await page.goto(`${link.url}${cb.tagPath}`, { waitUntil: 'load' })
    await page.waitForURL(url => url.pathname === `${gridPath}/${cb.id}` && url.searchParams.get('foundBy') === 'scan')
    await page.locator('[data-testid="grid-check"][data-ready="true"]').waitFor()
    expect(await page.getByTestId('grid-check-cid').textContent()).toContain('CB')

    // A tag no kept pack knows: said plainly on the page.
    await page.goto(`${link.url}/t/${'Q'.repeat(43)}`, { waitUntil: 'load' })
    await expect.poll(() => page.getByTestId('tag-problem').textContent()).toContain('no pack kept on this phone has this tag')

    // A competition whose pack is not on this phone: the guard does not go on offline.
    await page.goto(`${link.url}/competitions/${randomUUID()}/grid/${randomUUID()}`, { waitUntil: 'load' })
    await expect.poll(() => page.locator('body').textContent()).toContain('cannot reach its server')
    expect(await page.getByTestId('grid-check-cid').count()).toBe(0)

    const before = await w.scrutineer.client.get(`/api/competitions/${w.competitionId}/grid-checks?day=${day}`)
    expect(before.body.gridChecks).toHaveLength(0)

    // Back online on the launch grid: the check is sent, once.
    await regainSignal(browser, link)
    await page.goto(`${link.url}${gridPath}`, { waitUntil: 'load' })
    await waitForHydration(page)
    await page.locator('[data-testid="sync-status"][data-waiting="0"]').waitFor({ timeout: 30_000 })
    await page.getByTestId('sync-now').click()
    await page.locator('[data-testid="sync-status"][data-waiting="0"]').waitFor()
    const after = await w.scrutineer.client.get(`/api/competitions/${w.competitionId}/grid-checks?day=${day}`)
    const stored = after.body.gridChecks as { entryId: string }[]
    expect(stored.map(c => c.entryId)).toEqual([ca.id])

    // Signed out: neither the shell nor the session stays, so no grid page opens offline.
    await page.getByTestId('sign-out').click()
    await page.waitForURL(url => url.pathname === '/sign-in')
    await expect.poll(() => keptSessionOf(page)).toBeNull()
    expect(await page.evaluate(async () => (await caches.keys()).includes('gridmark-grid-pages'))).toBe(false)
    await loseSignal(browser, link)
    const cold = await page.goto(`${link.url}${gridPath}/${cb.id}`, { waitUntil: 'load' }).then(() => 'opened', () => 'refused')
    if (cold === 'opened') expect(await page.getByTestId('grid-check-cid').count()).toBe(0)
    await regainSignal(browser, link)
  })
})
