// The director's desk through the browser: the director opens today on the contest days page;
// on one entry's desk they hold it (the badge turns Held, the timeline shows the hold), release
// it, and waive a blocking finding for the day, then withdraw that waiver; the entrant is
// e-mailed the hold and the release and sees the waiver on their entry; the audit log filtered by that entry lists all three; a scrutineer reads the desk
// without the director's actions. Screenshots: days.png, desk-desk.png, desk-phone.png, audit.png.
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { launchBrowser, openPage, screenshot, signInThroughForm, gotoApp, type Browser } from '../support/browser'
import { checkBody, gridEntry, gridWorld, shiftDay, todayIn, type GridWorld } from '../support/grid'
import { capturedMail, type CapturedMessage } from '../support/mail'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
let otherId: string
const browsers: Browser[] = []
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Browser Desk Cup')
  entryId = await gridEntry(w, { compId: 'DX' })
  otherId = await gridEntry(w, { compId: 'DY' })
  // An advisory finding whose fix touches hardware, so the desk shows its caution: the firmware
  // runs out within 30 days after the last contest day (2027-05-07).
  await testDb()('units').where({ entry_id: entryId, kind: 'collision-warning' }).update({ firmware_expires_on: '2027-05-20' })
  // The set-up's days: tomorrow's practice (within reach) and the first contest day (months
  // ahead); today is not among them, so opening it asks what kind of day it is.
  await testDb()('competition_days').insert([
    { competition_id: w.competitionId, day: shiftDay(todayIn(), 1), kind: 'practice' },
    { competition_id: w.competitionId, day: '2027-05-01', kind: 'contest' },
  ])
})
afterAll(async () => {
  // Times are formatted alike on the server and in the browser, so pages hydrate without a mismatch.
  expect(consoleErrors.filter(e => /hydration/i.test(e))).toEqual([])
  for (const b of browsers) await b.close()
  await closeTestDb()
})

const consoleErrors: string[] = []
async function signedIn(email: string, path: string, viewport: 'phone' | 'desk' = 'desk'): Promise<Page> {
  const browser = await launchBrowser()
  browsers.push(browser)
  const page = await openPage(browser.context, baseUrl, '/sign-in', viewport)
  page.on('console', (m) => { if (m.type() === 'error') consoleErrors.push(m.text()) })
  await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD, path)
  return page
}

const deskPath = () => `/competitions/${w.competitionId}/board/${entryId}`
const badge = (page: Page, state: string) => page.locator(`[data-testid="desk-readiness"][data-readiness="${state}"]`)
const noSideScroll = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)

async function gridCheck() {
  const res = await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body
}

async function mailFor(subjectPart: string): Promise<CapturedMessage> {
  const deadline = Date.now() + 15_000
  for (;;) {
    const found = (await capturedMail(w.entrant.email)).find(m => m.subject.includes(subjectPart))
    if (found) return found
    if (Date.now() > deadline) throw new Error(`no message to the entrant with “${subjectPart}”`)
    await new Promise(r => setTimeout(r, 200))
  }
}

describe('the director’s desk', () => {
  it('the director opens today on the contest days page, saying what kind of day it is', async () => {
    const today = todayIn()
    const page = await signedIn(w.director.email, `/competitions/${w.competitionId}/days`)
    await page.getByRole('heading', { name: 'Contest days', level: 1 }).waitFor()
    expect(await page.locator('h1').count()).toBe(1)
    await expect(page.getByTestId('days-today').textContent()).resolves.toContain(new Date(`${today}T12:00:00Z`).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }))
    expect(await page.getByText('Every accepted entry goes on the day’s board as').count()).toBe(1)

    // Tomorrow can be opened; the first contest day not yet (the server's range, said in words).
    const tomorrow = page.locator(`[data-testid="days-scheduled-day"][data-day="${shiftDay(today, 1)}"]`)
    expect(await tomorrow.getByTestId('days-open-named').count()).toBe(1)
    const far = page.locator('[data-testid="days-scheduled-day"][data-day="2027-05-01"]')
    expect(await far.textContent()).toContain('Can be opened from Fri 30 Apr')
    expect(await far.getByTestId('days-open-named').count()).toBe(0)

    // Today is not in the set-up, so it needs its kind; nothing is sent without it.
    await page.getByRole('button', { name: 'Open today' }).click()
    await page.locator('#day-open-kind-error').waitFor()
    expect(await page.locator('#day-open-kind-error').textContent()).toContain('say whether it is a practice or a contest day')
    expect(await testDb()('board_days').where({ competition_id: w.competitionId }).count('* as n').first()).toEqual({ n: '0' })

    await page.getByLabel('Practice day').check()
    await page.getByRole('button', { name: 'Open today' }).click()
    await page.getByTestId('days-notice').waitFor()
    await page.locator(`[data-testid="days-open-day"][data-day="${today}"]`).waitFor()
    expect(await page.getByTestId('days-open-day').textContent()).toContain('Practice day')
    const listed = await w.director.client.get(`${w.base}/days`)
    expect(listed.body.openDay).toBe(today)
    expect(listed.body.days[0]).toMatchObject({ day: today, kind: 'practice', status: 'open' })

    // Another day waits until this one is closed.
    expect(await tomorrow.getByTestId('days-open-named').count()).toBe(0)
    expect(await page.getByText('Close the open day before opening another.').count()).toBe(1)

    // The day opened is listed with its board and both exports.
    const row = page.locator(`[data-testid="days-opened-row"][data-day="${today}"]`)
    await row.waitFor()
    expect(await row.getByRole('link', { name: `Board of ${today}` }).getAttribute('href')).toBe(`/competitions/${w.competitionId}/board?day=${today}`)
    expect(await row.getByRole('link', { name: `Readiness CSV of ${today}` }).getAttribute('href')).toBe(`/api/competitions/${w.competitionId}/board/export.csv?day=${today}`)
    expect(await row.getByRole('link', { name: `Scrutineering log CSV of ${today}` }).getAttribute('href')).toBe(`/api/competitions/${w.competitionId}/grid-checks/export.csv?day=${today}`)
    // Closing asks first.
    await page.getByTestId('days-close').click()
    await page.getByTestId('days-close-confirm').waitFor()
    await page.getByRole('button', { name: 'Keep it open' }).click()
    expect(await page.getByTestId('days-close-confirm').count()).toBe(0)
    await screenshot(page, 'days')

    await page.setViewportSize({ width: 360, height: 740 })
    expect(await noSideScroll(page)).toBe(true)
    await page.locator(`[data-testid="days-opened-card"][data-day="${today}"]`).waitFor()
    await screenshot(page, 'days-phone')
  })

  it('holds with a reason (Held, on the timeline, e-mailed), then releases with a reason', async () => {
    expect((await gridCheck()).gridCheck.readiness).toBe('caution')
    const page = await signedIn(w.director.email, deskPath())
    await page.locator('[data-testid="desk"][data-can-direct="true"]').waitFor()
    expect(await page.locator('h1').count()).toBe(1)
    expect((await page.getByTestId('desk-cid').textContent())?.trim()).toBe('DX')
    await badge(page, 'caution').waitFor()
    expect(await page.getByTestId('desk-day-status').getAttribute('data-status')).toBe('open')
    // The advisory finding's hardware caution is shown in full.
    const caution = page.getByTestId('desk-finding-caution').first()
    expect(await caution.textContent()).toContain('Power the unit off before inserting or removing update media')
    expect(await caution.textContent()).toContain('Local procedures and the competition’s rules prevail')
    expect(await page.getByText('A release ends only the director’s hold').count()).toBe(1)

    // No reason: the field says so and nothing is recorded.
    await page.getByTestId('desk-hold-open').click()
    await page.getByRole('button', { name: 'Hold this glider' }).click()
    await page.locator('#desk-hold-reason-error').waitFor()
    expect(await testDb()('director_actions').where({ entry_id: entryId }).count('* as n').first()).toEqual({ n: '0' })

    await page.getByLabel('Why is it held?').fill('Canopy crack seen at the wing run')
    await page.getByRole('button', { name: 'Hold this glider' }).click()
    await badge(page, 'held').waitFor()
    expect(await page.getByTestId('desk-hold-info').textContent()).toContain('Canopy crack seen at the wing run')
    expect(await page.getByTestId('desk-hold-info').textContent()).toContain('Dana Director')
    await page.locator('[data-testid="timeline-item"][data-kind="hold"]').waitFor()
    expect(await page.getByTestId('timeline-item').first().getAttribute('data-kind')).toBe('hold')
    expect(await page.getByTestId('timeline-item').first().textContent()).toContain('Canopy crack seen at the wing run')
    expect(await page.locator('[data-testid="desk-action"][data-kind="hold"]').count()).toBe(1)

    await page.getByTestId('desk-release-open').click()
    await page.getByLabel('Why is it released?').fill('Crack inspected and taped by the duty inspector')
    await page.getByRole('button', { name: 'Release', exact: true }).click()
    await badge(page, 'caution').waitFor()
    expect(await page.getByTestId('desk-hold-info').count()).toBe(0)
    await page.locator('[data-testid="timeline-item"][data-kind="release"]').waitFor()
    expect(await page.getByTestId('timeline-item').first().getAttribute('data-kind')).toBe('release')
    expect(await page.getByTestId('desk-hold-open').count()).toBe(1)

    const held = await mailFor('DX is held')
    expect(held.text).toContain('Canopy crack seen at the wing run')
    const released = await mailFor('DX is released')
    expect(released.text).toContain('Crack inspected and taped by the duty inspector')
  })

  it('waives a blocking finding for the day: the glider is no longer held by it', async () => {
    // An unpaid entry has a blocking finding; the next grid check holds the glider.
    await testDb()('entries').where({ id: entryId }).update({ payment_status: 'unpaid' })
    const checked = await gridCheck()
    expect(checked.gridCheck.readiness).toBe('held')

    const page = await signedIn(w.director.email, deskPath())
    await page.locator('[data-testid="desk"][data-can-direct="true"]').waitFor()
    await badge(page, 'held').waitFor()
    const finding = page.locator('[data-testid="desk-finding"][data-check-id="entry.paid"]')
    expect(await finding.getAttribute('data-severity')).toBe('blocking')
    expect(await finding.getAttribute('data-waived')).toBe('false')
    // Blocking findings come first.
    expect(await page.getByTestId('desk-finding').first().getAttribute('data-check-id')).toBe('entry.paid')

    await finding.getByTestId('desk-waive').click()
    const form = finding.getByTestId('desk-waiver-form')
    await form.getByRole('button', { name: 'Waive the finding' }).click()
    await form.locator('.field-error').first().waitFor()
    expect(await form.locator('.field-error').first().textContent()).toContain('Give a reason')
    await form.getByLabel('Why is it accepted?').fill('Paid in cash at the office this morning')
    await form.getByRole('button', { name: 'Waive the finding' }).click()
    await page.locator('[data-testid="desk-finding"][data-check-id="entry.paid"][data-waived="true"]').waitFor()
    await badge(page, 'caution').waitFor()
    expect(await page.locator('[data-testid="desk-finding"][data-check-id="entry.paid"] [data-testid="desk-finding-waiver"]').textContent()).toContain('Paid in cash at the office this morning')
    await page.locator('[data-testid="timeline-item"][data-kind="waiver"]').waitFor()
    expect(await page.locator('[data-testid="desk-action"][data-kind="waiver"]').count()).toBe(1)
    expect(await noSideScroll(page)).toBe(true)
    await screenshot(page, 'desk-desk')

    await page.setViewportSize({ width: 390, height: 844 })
    await gotoApp(page, baseUrl, deskPath())
    await badge(page, 'caution').waitFor()
    expect(await noSideScroll(page)).toBe(true)
    await screenshot(page, 'desk-phone')
  })

  it('the audit log filtered by the entry lists the hold, the release and the waiver', async () => {
    const page = await signedIn(w.director.email, `/competitions/${w.competitionId}/audit`)
    await page.getByRole('heading', { name: 'Audit log', level: 1 }).waitFor()
    await page.getByTestId('audit-row').first().waitFor()
    await page.getByLabel('Entry').selectOption({ label: 'DX — Erin Entrant' })
    await page.waitForURL(url => url.searchParams.get('entryId') === entryId)
    // Once the filtered page is in, every row is about that entry (the unfiltered log also
    // holds the day's opening, which names no entry).
    await page.waitForFunction(() => {
      const cells = [...document.querySelectorAll('[data-testid="audit-row"] td:nth-child(4)')]
      return cells.length > 0 && cells.every(c => c.textContent?.trim() === 'DX')
    })
    const actions = await page.getByTestId('audit-row').evaluateAll(rows => rows.map(r => r.getAttribute('data-action')))
    expect(actions).toEqual(expect.arrayContaining(['director.hold', 'director.release', 'director.waiver', 'grid-check.recorded']))
    expect(actions).not.toContain('day.opened')
    const hold = page.locator('[data-testid="audit-row"][data-action="director.hold"]')
    expect(await hold.locator('td').nth(2).textContent()).toContain('Held')
    expect(await hold.getByTestId('audit-details').textContent()).toContain('Canopy crack seen at the wing run')
    expect(await page.locator('[data-testid="audit-row"][data-action="director.waiver"]').getByTestId('audit-details').textContent()).toContain('entry.paid')
    expect(await hold.getByRole('link', { name: 'DX' }).getAttribute('href')).toBe(deskPath())

    // The action filter narrows further and is kept in the address.
    await page.getByLabel('Action').selectOption({ label: 'Released' })
    await page.waitForURL(url => url.searchParams.get('action') === 'director.release' && url.searchParams.get('entryId') === entryId)
    await page.waitForFunction(() => [...document.querySelectorAll('[data-testid="audit-row"]')].every(r => r.getAttribute('data-action') === 'director.release'))
    expect(await page.getByTestId('audit-row').count()).toBe(1)
    await page.getByTestId('audit-clear').click()
    await page.waitForURL(url => !url.searchParams.has('entryId'))
    expect(await page.getByTestId('audit-export-readiness').getAttribute('href')).toBe(`/api/competitions/${w.competitionId}/board/export.csv?day=${todayIn()}`)
    await page.getByLabel('Entry').selectOption({ label: 'DX — Erin Entrant' })
    await page.locator('[data-testid="audit-row"][data-action="director.waiver"]').waitFor()
    expect(await noSideScroll(page)).toBe(true)
    await screenshot(page, 'audit')
    // On a phone the rows are cards.
    await page.setViewportSize({ width: 360, height: 740 })
    await page.locator('[data-testid="audit-card"][data-action="director.hold"]').waitFor()
    expect(await page.getByTestId('audit-table').isVisible()).toBe(false)
    expect(await noSideScroll(page)).toBe(true)
    await screenshot(page, 'audit-phone')
  })

  it('the entrant reads the same timeline on their dossier', async () => {
    const page = await signedIn(w.entrant.email, `/competitions/${w.competitionId}/entries/${entryId}`, 'phone')
    await page.getByTestId('entry-timeline').waitFor()
    const kinds = await page.getByTestId('timeline-item').evaluateAll(rows => rows.map(r => r.getAttribute('data-kind')))
    expect(kinds[0]).toBe('waiver')
    expect(kinds).toEqual(expect.arrayContaining(['hold', 'release', 'grid-check', 'findings']))
    // The waiver itself, in words: the check, the day, by whom and why.
    const waiver = page.locator('[data-testid="entry-waiver"][data-state="active"]')
    expect(await waiver.textContent()).toContain('The entry fee is paid before the first contest day.')
    expect(await waiver.textContent()).toContain('Paid in cash at the office this morning')
    expect(await waiver.textContent()).toContain('By Dana Director')
    expect(await page.locator('[data-testid="timeline-item"][data-kind="hold"]').textContent()).toContain('Canopy crack seen at the wing run')
    // The desk is for staff: no way there from the entrant's page.
    expect(await page.getByTestId('dossier-desk-link').count()).toBe(0)
    expect(await noSideScroll(page)).toBe(true)
  })

  it('a scrutineer reads the desk without the director’s actions', async () => {
    const page = await signedIn(w.scrutineer.email, deskPath(), 'phone')
    await page.locator('[data-testid="desk"][data-can-direct="false"]').waitFor()
    await badge(page, 'caution').waitFor()
    await page.getByTestId('desk-read-only').waitFor()
    expect(await page.getByTestId('desk-hold-open').count()).toBe(0)
    expect(await page.getByTestId('desk-release-open').count()).toBe(0)
    expect(await page.getByTestId('desk-waive').count()).toBe(0)
    expect(await page.getByTestId('desk-withdraw').count()).toBe(0)
    expect(await page.locator('[data-testid="timeline-item"][data-kind="waiver"]').count()).toBe(1)
    // The other entry is on the board too, unchecked.
    await gotoApp(page, baseUrl, `/competitions/${w.competitionId}/board/${otherId}`)
    await badge(page, 'unchecked').waitFor()
    expect(await page.getByTestId('desk-back').getAttribute('href')).toBe(`/competitions/${w.competitionId}/board`)

    // The open page keeps itself current: the director's hold arrives without a reload.
    const held = await w.director.client.post(`${w.base}/entries/${otherId}/hold`, { reason: 'Wing tape missing' })
    expect(held.status).toBe(201)
    await badge(page, 'held').waitFor({ timeout: 30_000 })
    expect(await page.getByTestId('desk-hold-info').textContent()).toContain('Wing tape missing')
  })

  it('a desk left before it has loaded (Back on a slow signal) leaves the board as it was', async () => {
    const page = await signedIn(w.director.email, `/competitions/${w.competitionId}/board`)
    const tile = page.locator(`[data-testid="board-tile"][data-entry-id="${entryId}"]`)
    await tile.waitFor()
    // The desk's read is held back, so its page is still loading when Back is pressed.
    const held: { continue: () => Promise<void> }[] = []
    await page.route('**/board/entries/**', (route) => { held.push(route) })
    await tile.click()
    await expect.poll(() => held.length).toBeGreaterThan(0)
    await page.goBack()
    await page.waitForURL(url => url.pathname === `/competitions/${w.competitionId}/board`)
    for (const r of held.splice(0)) await r.continue()
    await page.unroute('**/board/entries/**')
    await page.locator('[data-testid="board"][data-loaded="true"]').waitFor()
    await tile.waitFor()
    expect(await page.getByText('Not found').count()).toBe(0)
    expect(await page.getByText('This entry could not be loaded').count()).toBe(0)
    await page.close()
  })

  it('the director withdraws the waiver with a reason: held again; the entrant sees it withdrawn', async () => {
    const page = await signedIn(w.director.email, deskPath())
    await page.locator('[data-testid="desk"][data-can-direct="true"]').waitFor()
    await badge(page, 'caution').waitFor()
    const action = page.locator('[data-testid="desk-action"][data-kind="waiver"]')
    await action.getByTestId('desk-withdraw').click()
    const form = action.getByTestId('desk-withdraw-form')
    await form.getByRole('button', { name: 'Withdraw the waiver' }).click()
    await form.locator('.field-error').first().waitFor()
    expect(await form.locator('.field-error').first().textContent()).toContain('Give a reason')
    await form.getByLabel('Why is it withdrawn?').fill('The office found no cash payment')
    await form.getByRole('button', { name: 'Withdraw the waiver' }).click()
    await action.getByTestId('desk-action-withdrawn').waitFor()
    expect(await action.getByTestId('desk-action-withdrawn').textContent()).toContain('The office found no cash payment')
    await badge(page, 'held').waitFor()
    expect(await page.locator('[data-testid="desk-finding"][data-check-id="entry.paid"]').getAttribute('data-waived')).toBe('false')
    expect(await page.getByTestId('desk-withdraw').count()).toBe(0)

    const entrant = await signedIn(w.entrant.email, `/competitions/${w.competitionId}/entries/${entryId}`, 'phone')
    const gone = entrant.locator('[data-testid="entry-waiver"][data-state="withdrawn"]')
    await gone.waitFor()
    expect(await gone.textContent()).toContain('Withdrawn by Dana Director')
    expect(await gone.textContent()).toContain('The office found no cash payment')
    expect(await entrant.getByTestId('entry-waivers-none-active').count()).toBe(1)
    expect(await noSideScroll(entrant)).toBe(true)
  })

  it('the director closes the day after confirming; the desk then offers no action', async () => {
    const today = todayIn()
    const page = await signedIn(w.director.email, `/competitions/${w.competitionId}/days`, 'phone')
    await page.getByTestId('days-close').click()
    await page.getByTestId('days-close-yes').click()
    await page.getByTestId('days-notice').waitFor()
    expect(await page.getByTestId('days-notice').textContent()).toContain('is closed')
    const card = page.locator(`[data-testid="days-opened-card"][data-day="${today}"]`)
    expect(await card.textContent()).toContain('Closed: Dana Director')
    // A day closed by mistake can be opened again; opening today is offered too.
    expect(await card.getByTestId('days-reopen').count()).toBe(1)
    const listed = await w.director.client.get(`${w.base}/days`)
    expect(listed.body.openDay).toBeNull()

    await gotoApp(page, baseUrl, deskPath())
    await page.locator('[data-testid="desk"][data-can-direct="false"]').waitFor()
    expect(await page.getByTestId('desk-day-status').getAttribute('data-status')).toBe('closed')
    await page.getByTestId('desk-no-open-day').waitFor()
    expect(await page.getByTestId('desk-hold-open').count()).toBe(0)
    expect(await page.getByTestId('desk-waive').count()).toBe(0)
  })
})
