// The scrutineers' document queue in a real browser: documents uploaded through the API in the
// set-up, then reviewed in the page (PDF shown in a frame, image as an image), at phone and
// wall sizes.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD, signedUpClient } from '../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../support/db'
import { launchBrowser, openPage, gotoApp, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { postForm, tinyPdf, tinyPng } from '../support/files'

const baseUrl = inject('baseUrl')
let browser: Browser
let competitionId: string
let entryId: string
let scrutineerEmail: string

beforeAll(async () => {
  browser = await launchBrowser()
  const entrant = await signedUpClient(baseUrl, 'Queue Pilot')
  const scrutineer = await signedUpClient(baseUrl, 'Queue Scrutineer')
  scrutineerEmail = scrutineer.email
  competitionId = await createCompetition('Review Desk Open', [
    { userId: entrant.user.id, role: 'entrant' },
    { userId: scrutineer.user.id, role: 'scrutineer' },
  ])
  const classId = await createClass(competitionId)
  entryId = await createEntry({ competitionId, classId, entrantUserId: entrant.user.id, compId: 'RV7' })
  const path = `/api/competitions/${competitionId}/entries/${entryId}/documents`
  const a = await postForm(entrant.client, path, { kind: 'airworthiness', expiresOn: '2027-09-30' }, { name: 'arc.pdf', data: tinyPdf('Airworthiness review RV7') })
  const b = await postForm(entrant.client, path, { kind: 'insurance', expiresOn: '2027-12-31' }, { name: 'insurance.png', data: tinyPng() })
  if (a.status !== 201 || b.status !== 201) throw new Error(`upload failed: ${a.status} ${b.status}`)
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('document review page', () => {
  it('shows the queue, the PDF inline, and records accept and reject with a reason', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, scrutineerEmail, GOOD_PASSWORD)
    await gotoApp(page, baseUrl, `/competitions/${competitionId}/documents`)
    await page.getByRole('heading', { level: 1, name: 'Document review' }).waitFor()
    const items = page.getByTestId('queue-list').getByRole('button')
    await expect.poll(() => items.count()).toBe(2)
    await expect.poll(() => items.first().textContent()).toContain('Airworthiness review')
    // The oldest (the PDF) is selected first and shown in a frame.
    const frame = page.getByTestId('document-view').locator('iframe')
    await frame.waitFor()
    expect(await frame.getAttribute('src')).toContain(`/entries/${entryId}/documents/`)
    await screenshot(page, 'document-review-phone')

    await page.setViewportSize({ width: 1920, height: 1080 })
    await screenshot(page, 'document-review-wall')

    await page.getByRole('button', { name: 'Accept' }).click()
    await page.getByRole('status').getByText('Airworthiness review of RV7 accepted.').waitFor()
    await expect.poll(() => items.count()).toBe(1)

    // The image is shown as an image; rejecting asks for a reason first.
    const img = page.getByTestId('document-view').locator('img')
    await img.waitFor()
    await expect.poll(() => img.evaluate(el => (el as HTMLImageElement).naturalWidth)).toBe(1)
    await page.getByRole('button', { name: 'Reject…' }).click()
    await page.getByRole('button', { name: 'Send rejection' }).click()
    await page.getByTestId('error-summary').getByText('Say why the document is rejected.').waitFor()
    await page.getByLabel('Reason for rejecting (sent to the entrant)').fill('The policy number is unreadable.')
    await screenshot(page, 'document-review-reject-wall')
    await page.getByRole('button', { name: 'Send rejection' }).click()
    await page.getByTestId('queue-empty').waitFor()

    const rows = await testDb()('documents').where({ entry_id: entryId }).orderBy('uploaded_at')
    expect(rows.map(r => [r.kind, r.status, r.review_reason])).toEqual([
      ['airworthiness', 'accepted', null],
      ['insurance', 'rejected', 'The policy number is unreadable.'],
    ])
    expect(await testDb()('mail_outbox').where({ entry_id: entryId, template: 'document-rejected' }).first()).toBeTruthy()
    await screenshot(page, 'document-review-empty-phone')
    await page.close()
  })

  it('refuses the page to someone without the scrutineer or organiser role', async () => {
    await browser.context.clearCookies()
    const entrant = await signedUpClient(baseUrl, 'Curious Pilot')
    await testDb()('memberships').insert({ user_id: entrant.user.id, competition_id: competitionId, role: 'entrant' })
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    await signInThroughForm(page, baseUrl, entrant.email, GOOD_PASSWORD)
    await gotoApp(page, baseUrl, `/competitions/${competitionId}/documents`)
    expect(await page.getByRole('heading', { level: 1, name: 'Document review' }).count()).toBe(0)
    await page.close()
  })
})
