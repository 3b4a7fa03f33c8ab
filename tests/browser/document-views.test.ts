// Who opened the pilot's medical certificate, in a real browser: a scrutineer opens it from the
// entry page, the pilot then sees the scrutineer's name and "medical" on their entry; the
// director reads the certificate's state and validity but is offered no link to it; the office
// reads the competition's record with the scrutineer's address.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD, signedUpClient } from '../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../support/db'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { postForm, tinyPdf } from '../support/files'

const baseUrl = inject('baseUrl')
let browser: Browser
let competitionId: string
let entryId: string
let medicalId: string
const email = { pilot: '', scrutineer: '', director: '', organiser: '' }

beforeAll(async () => {
  browser = await launchBrowser()
  const pilot = await signedUpClient(baseUrl, 'Mira Moorfield')
  const scrutineer = await signedUpClient(baseUrl, 'Sten Scrutton')
  const director = await signedUpClient(baseUrl, 'Dirk Daybook')
  const organiser = await signedUpClient(baseUrl, 'Olive Officer')
  email.pilot = pilot.email
  email.scrutineer = scrutineer.email
  email.director = director.email
  email.organiser = organiser.email
  competitionId = await createCompetition('Need To Know Cup', [
    { userId: pilot.user.id, role: 'entrant' },
    { userId: scrutineer.user.id, role: 'scrutineer' },
    { userId: director.user.id, role: 'director' },
    { userId: organiser.user.id, role: 'organiser' },
  ])
  const classId = await createClass(competitionId)
  entryId = await createEntry({ competitionId, classId, entrantUserId: pilot.user.id, compId: 'MM4' })
  const res = await postForm(pilot.client, `/api/competitions/${competitionId}/entries/${entryId}/documents`, { kind: 'medical', expiresOn: '2028-04-30' }, { name: 'medical.pdf', data: tinyPdf('Medical certificate MM4') })
  if (res.status !== 201) throw new Error(`upload failed: ${res.status}`)
  medicalId = res.body.document.id
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

const entryPath = () => `/competitions/${competitionId}/entries/${entryId}`

async function signedIn(who: keyof typeof email, path = entryPath()) {
  await browser.context.clearCookies()
  const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
  await signInThroughForm(page, baseUrl, email[who], GOOD_PASSWORD)
  await gotoApp(page, baseUrl, path)
  return page
}

describe('who opened the medical certificate', () => {
  it('shows the pilot the scrutineer who opened it', async () => {
    const desk = await signedIn('scrutineer')
    const medical = desk.getByTestId('document-panel').locator('[data-kind="medical"]')
    // Staff other than organisers do not read the record of openings.
    expect(await desk.getByTestId('document-views').count()).toBe(0)
    const [opened] = await Promise.all([
      browser.context.waitForEvent('page'),
      medical.getByRole('link', { name: /View medical/ }).click(),
    ])
    await expect.poll(async () => (await testDb()('document_views').where({ document_id: medicalId })).length).toBe(1)
    await opened.close()
    await desk.close()

    const own = await signedIn('pilot')
    const item = own.getByTestId('document-views').getByTestId('document-view-item')
    await item.first().waitFor()
    expect(await item.count()).toBe(1)
    const text = (await item.first().textContent()) ?? ''
    expect(text).toContain('Sten Scrutton')
    expect(text).toContain('Scrutineer')
    expect(text.toLowerCase()).toContain('medical')
    await own.getByTestId('document-views').scrollIntoViewIfNeeded()
    await screenshot(own, 'document-views-pilot-phone')
    await own.close()
  })

  it('shows the director the certificate’s state and validity, with the rule instead of a link', async () => {
    const page = await signedIn('director')
    const medical = page.getByTestId('document-panel').locator('[data-kind="medical"]')
    await medical.getByText('2028-04-30').waitFor()
    expect(await medical.getByRole('link').count()).toBe(0)
    expect(await medical.getByTestId('need-to-know').textContent()).toContain('Only the pilot, scrutineers and organisers open medical and licence files.')
    await screenshot(page, 'document-views-director-phone')
    await page.close()
  })

  it('shows the office every opening in the competition, with the address it came from', async () => {
    const [row] = await testDb()('document_views').where({ document_id: medicalId })
    const page = await signedIn('organiser', `/competitions/${competitionId}/document-views`)
    await page.getByRole('heading', { level: 1, name: 'Medical and licence file openings' }).waitFor()
    const card = page.getByTestId('document-views-cards').locator('li').first()
    await card.waitFor()
    const text = (await card.textContent()) ?? ''
    for (const part of ['Medical', 'MM4', 'Sten Scrutton', 'scrutineer', row.client_address]) expect(text).toContain(part)
    await screenshot(page, 'document-views-office-phone')
    await page.setViewportSize({ width: 1366, height: 900 })
    const cells = page.getByTestId('document-views-row').first().locator('td')
    await expect.poll(() => cells.count()).toBe(6)
    expect(await cells.nth(5).textContent()).toContain(row.client_address)
    await screenshot(page, 'document-views-office-desk')
    await page.close()
  })
})
