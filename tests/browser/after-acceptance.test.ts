// After acceptance, the pilot keeps the dossier current: K7's case — a firmware that expires
// during the contest — put right by the pilot on a phone; the finding leaves the entry page, the
// board and the desk (pushed live), and the office sees "changed since acceptance". A pilot whose
// document waits for review reads "waiting for review", not a fault of theirs.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, testDb } from '../support/db'
import { launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { postForm, tinyPdf } from '../support/files'
import { checkBody, gridEntry, gridWorld, type GridWorld } from '../support/grid'
import { openToday } from '../support/board'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
const browsers: Browser[] = []
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Browser After Acceptance Cup')
  entryId = await gridEntry(w, { compId: 'K7' })
  await testDb()('units').where({ entry_id: entryId, kind: 'collision-warning' }).update({ firmware_version: '7.20', firmware_expires_on: '2027-05-03' })
  await openToday(w)
  expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(entryId))).status).toBe(201)
})
afterAll(async () => {
  for (const b of browsers) await b.close()
  await closeTestDb()
})

describe('K7’s pilot updates the firmware after acceptance', () => {
  it('the blocking finding leaves the entry, the board and the desk, and the office sees the change', async () => {
    const director = await launchBrowser()
    browsers.push(director)
    const board = await openPage(director.context, baseUrl, '/sign-in', 'wall')
    await signInThroughForm(board, baseUrl, w.director.email, GOOD_PASSWORD, `/competitions/${w.competitionId}/board`)
    const tile = board.locator(`[data-testid="board-tile"][data-entry-id="${entryId}"]`)
    await tile.waitFor()
    expect(await tile.getAttribute('data-readiness')).toBe('held')
    const desk = await director.context.newPage()
    await desk.setViewportSize({ width: 1280, height: 900 })
    await desk.goto(`${baseUrl}/competitions/${w.competitionId}/board/${entryId}`)
    await desk.getByTestId('desk-cid').waitFor()

    const pilot = await launchBrowser()
    browsers.push(pilot)
    const page = await openPage(pilot.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, w.entrant.email, GOOD_PASSWORD, `/competitions/${w.competitionId}/entries/${entryId}`)
    const finding = page.locator('[data-testid="finding"][data-check-id="firmware.valid-through-contest"]')
    await finding.waitFor()
    expect(await page.getByText('The entry is accepted, but 1 finding keeps the glider from flying').count()).toBe(1)

    const unit = await testDb()('units').where({ entry_id: entryId, kind: 'collision-warning' }).first('id')
    await page.getByRole('button', { name: /Change unit/ }).first().click()
    await page.locator(`#unit-${unit.id}-firmwareVersion`).fill('7.24')
    await page.locator(`#unit-${unit.id}-firmwareExpiresOn`).fill('2029-01-31')
    await page.getByRole('button', { name: 'Save the unit' }).click()
    await finding.waitFor({ state: 'detached' })
    await screenshot(page, 'after-acceptance-pilot')

    // Pushed to the wall board and the desk without a reload.
    await board.locator(`[data-testid="board-tile"][data-entry-id="${entryId}"][data-readiness="ready"]`).waitFor()
    await desk.getByTestId('changed-since-acceptance').waitFor()
    await desk.locator('[data-testid="desk-readiness"]').getByText('Ready').waitFor()
    expect(await desk.locator('[data-check-id="firmware.valid-through-contest"]').count()).toBe(0)

    // The office's entries table marks the entry.
    const office = await launchBrowser()
    browsers.push(office)
    const table = await openPage(office.context, baseUrl, '/sign-in', 'desk')
    await signInThroughForm(table, baseUrl, w.organiser.email, GOOD_PASSWORD, `/competitions/${w.competitionId}/entries`)
    await table.getByTestId('changed-since-acceptance').first().waitFor()
    await screenshot(table, 'after-acceptance-office')
  })
})

describe('a document waiting for review', () => {
  it('reads to the pilot as waiting for review, not blocking, and mails no held e-mail', async () => {
    await testDb()('competitions').where({ id: w.competitionId }).update({ settings: { requiredDocumentKinds: ['insurance'] } })
    const id = await gridEntry(w, { compId: 'R8' })
    const upload = await postForm(w.entrant.client, `${w.base}/entries/${id}/documents`, { kind: 'insurance', expiresOn: '2028-12-31' }, { name: 'insurance.pdf', data: tinyPdf(), type: 'application/pdf' })
    expect(upload.status).toBe(201)
    expect((await w.scrutineer.client.post(`${w.base}/grid-checks`, checkBody(id))).status).toBe(201)

    const pilot = await launchBrowser()
    browsers.push(pilot)
    const page = await openPage(pilot.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, w.entrant.email, GOOD_PASSWORD, `/competitions/${w.competitionId}/entries/${id}`)
    const inReview = page.locator('[data-testid="finding"][data-check-id="documents.required"]')
    await inReview.waitFor()
    expect(await inReview.getAttribute('data-group')).toBe('review')
    expect(await page.locator('[data-group="review"] h3').first().textContent()).toContain('Waiting for review')
    expect(await page.getByTestId('count-in-review').textContent()).toContain('1 in review')
    expect(await page.getByText('nothing for you to do there').count()).toBeGreaterThan(0)
    await screenshot(page, 'after-acceptance-in-review')
    expect(await testDb()('mail_outbox').where({ entry_id: id, template: 'board-held' })).toHaveLength(0)
    await testDb()('competitions').where({ id: w.competitionId }).update({ settings: { requiredDocumentKinds: [] } })
  })
})
