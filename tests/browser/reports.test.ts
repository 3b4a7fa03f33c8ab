// The office's paperwork where staff find it: the entries table downloads the tracking list and
// links each glider's report; the board links the day's tracking list; the director's desk and
// the entry page link the glider's report; a class card on the competition page links the
// class's reports. Each link is followed with the page's own session: a CSV or a PDF comes back.
// Screenshots: reports-entries-wall.png, reports-entries-phone.png.
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb } from '../support/db'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { openToday } from '../support/board'
import { gridEntry, gridWorld, type GridWorld } from '../support/grid'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
let browser: Browser
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Browser Paperwork Cup')
  entryId = await gridEntry(w, { compId: 'PX' })
  await openToday(w)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

/** Follows a download link with the page's cookies; its content type and first bytes. */
async function follow(page: Page, testId: string, nth = 0): Promise<{ type: string, head: string, disposition: string }> {
  const href = await page.getByTestId(testId).nth(nth).getAttribute('href')
  expect(href).toBeTruthy()
  const res = await page.request.get(new URL(href!, baseUrl).toString())
  expect(res.status()).toBe(200)
  const body = await res.body()
  return { type: res.headers()['content-type'] ?? '', head: body.subarray(0, 80).toString('latin1'), disposition: res.headers()['content-disposition'] ?? '' }
}

describe('links to the tracking list and the glider reports', () => {
  it('the entries table (wall and phone), the board, the desk, the entry page and the class card each link them', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'wall')
    await signInThroughForm(page, baseUrl, w.organiser.email, GOOD_PASSWORD, `/competitions/${w.competitionId}/entries`)
    await page.getByRole('heading', { name: 'Entries', level: 1 }).waitFor()

    const csv = await follow(page, 'tracking-export')
    expect(csv.type).toBe('text/csv; charset=utf-8')
    expect(csv.head).toMatch(/^comp_id,registration,glider_type,class,pilot,radio_id\nPX,/)
    expect((await follow(page, 'tracking-export-json')).head).toMatch(/^\{"competitionId":/)
    const report = await follow(page, 'entry-report')
    expect(report.type).toBe('application/pdf')
    expect(report.head.startsWith('%PDF-')).toBe(true)
    expect(report.disposition).toMatch(/-PX\.pdf"$/)
    await screenshot(page, 'reports-entries-wall')

    await page.setViewportSize({ width: 390, height: 844 })
    await page.getByTestId('entry-cards').waitFor()
    expect(await page.getByTestId('entry-report').filter({ visible: true }).textContent()).toContain('Glider report of PX (PDF)')
    await screenshot(page, 'reports-entries-phone')

    await gotoApp(page, baseUrl, `/competitions/${w.competitionId}/board`)
    expect((await follow(page, 'board-tracking-export')).disposition).toMatch(/-tracking-\d{4}-\d\d-\d\d\.csv"$/)

    await gotoApp(page, baseUrl, `/competitions/${w.competitionId}/board/${entryId}`)
    expect((await follow(page, 'desk-report')).type).toBe('application/pdf')

    await gotoApp(page, baseUrl, `/competitions/${w.competitionId}/entries/${entryId}`)
    expect((await follow(page, 'dossier-report-link')).type).toBe('application/pdf')

    await gotoApp(page, baseUrl, `/competitions/${w.competitionId}`)
    await page.getByTestId('class-card').first().waitFor()
    expect(await page.getByTestId('class-report').count()).toBe(2)
    expect((await follow(page, 'class-report')).head.startsWith('%PDF-')).toBe(true)
  })

  it('the entrant sees their own report on the entry page, and no class reports', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, w.entrant.email, GOOD_PASSWORD, `/competitions/${w.competitionId}/entries/${entryId}`)
    expect((await follow(page, 'dossier-report-link')).type).toBe('application/pdf')
    await gotoApp(page, baseUrl, `/competitions/${w.competitionId}`)
    await page.getByTestId('class-card').first().waitFor()
    expect(await page.getByTestId('class-report').count()).toBe(0)
  })
})
