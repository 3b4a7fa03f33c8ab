// The whole registration: an entrant joins a competition, fills the entry, adds a
// collision-warning unit (taking the firmware catalogue's suggestion) and a flight recorder,
// uploads a document and an IGC file, pays by card, submits; the organiser accepts.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { GOOD_PASSWORD, signedUpClient } from '../support/api'
import { completeEntry, entryBody } from '../support/entries'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { closeTestDb, createClass, createCompetition, testDb } from '../support/db'
import { igcFixture, tinyPdf } from '../support/files'

const baseUrl = inject('baseUrl')

let browser: Browser
let competitionId: string
let competitionName: string
let entrant: Awaited<ReturnType<typeof signedUpClient>>
let organiser: Awaited<ReturnType<typeof signedUpClient>>

beforeAll(async () => {
  browser = await launchBrowser()
  entrant = await signedUpClient(baseUrl, 'Bea Browser')
  organiser = await signedUpClient(baseUrl, 'Orla Office')
  competitionName = `Moorside Cup ${Math.random().toString(36).slice(2, 6).toUpperCase()}`
  competitionId = await createCompetition(competitionName, [{ userId: organiser.user.id, role: 'organiser' }])
  await createClass(competitionId, 'Standard')
  await createClass(competitionId, 'Club')
  await testDb()('firmware_releases').insert({ competition_id: competitionId, unit_family: 'CW-2', version: '7.22', expires_on: '2028-03-31' })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

async function expectNoSidewaysScroll(page: Page) {
  const { scrollWidth, innerWidth } = await page.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth }))
  expect(scrollWidth).toBeLessThanOrEqual(innerWidth)
}

describe('entrant registration in the browser', () => {
  let dossierPath: string

  it('joins, fills the entry, adds both units with the catalogue suggestion, and submits', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, entrant.email, GOOD_PASSWORD, '/entries')
      await page.getByRole('heading', { name: 'My entries' }).waitFor()
      await page.getByRole('link', { name: `Enter ${competitionName}` }).click()
      await page.waitForURL(/\/entries\/new$/)
      await page.getByRole('heading', { name: `Enter ${competitionName}` }).waitFor()

      // A bad competition ID is refused on its field before anything is sent.
      await page.getByLabel('Pilot in command').fill('Bea Browser')
      await page.getByLabel('Competition ID').fill('TOOLONG')
      await page.getByRole('button', { name: 'Save the draft entry' }).click()
      await page.getByTestId('error-summary').getByText('A competition ID is 1 to 3 letters or digits.').waitFor()

      await page.getByLabel('Nationality').fill('GB')
      await page.getByLabel('Licence number').fill('GBR.FCL.77')
      await page.getByLabel('Phone').fill('+44 7700 900321')
      await page.getByLabel('Emergency contact').fill('Ben Browser, +44 7700 900654')
      await page.getByLabel('Crew (optional)').fill('Rita Retrieve')
      await page.getByLabel('Class').selectOption({ label: 'Standard' })
      await expect(page.getByTestId('class-limits').textContent()).resolves.toContain('MTOM limit: 525 kg')
      await page.getByLabel('Glider type').fill('Moorhen 15')
      await page.getByLabel('Registration').fill('G-MOOR')
      await page.getByLabel('Competition ID').fill('mh')
      await page.getByLabel('Span (m)').fill('15')
      await page.getByLabel('MTOM (kg)').fill('525')
      await page.getByLabel('Empty mass (kg)').fill('262,5')
      await page.getByLabel('Privacy notice').check()
      await screenshot(page, 'entry-new-phone')
      await expectNoSidewaysScroll(page)
      await page.getByRole('button', { name: 'Save the draft entry' }).click()
      await page.waitForURL(/\/entries\/[0-9a-f-]{36}$/)
      dossierPath = new URL(page.url()).pathname
      await expect(page.getByTestId('entry-status').textContent()).resolves.toContain('Draft')
      await expect(page.getByTestId('missing-list').textContent()).resolves.toContain('Add the collision-warning unit.')
      // Each missing item leads to where it is put right.
      expect(await page.getByTestId('missing-list').getByRole('link', { name: 'Add the collision-warning unit.' }).getAttribute('href')).toBe('#units-title')

      // Collision-warning unit, with the catalogue's expiry one click away.
      await page.getByRole('button', { name: 'Add a collision-warning unit' }).click()
      await page.getByLabel('Model').fill('Example CW-2 Pro')
      await page.getByLabel('Serial number').fill('CW-55501')
      await page.getByLabel('Radio ID').fill('4a7c21')
      await page.getByLabel('Firmware version', { exact: true }).fill('7.22')
      await page.getByTestId('firmware-caution').waitFor()
      const suggestion = page.getByTestId('firmware-suggestion')
      await suggestion.waitFor()
      await expect(suggestion.textContent()).resolves.toContain('31 March 2028')
      await screenshot(page, 'entry-unit-suggestion-phone')
      await suggestion.getByRole('button', { name: 'Use 31 March 2028' }).click()
      await expect(page.getByLabel('Firmware expiry date').inputValue()).resolves.toBe('2028-03-31')
      await page.getByRole('button', { name: 'Add the collision-warning unit' }).click()
      await page.getByTestId('units-collision-warning').getByText('4A7C21').waitFor()

      // Flight recorder.
      await page.getByRole('button', { name: 'Add a flight recorder' }).click()
      await page.getByLabel('Model').fill('Example Logger 3')
      await page.getByLabel('Serial number').fill('FR-88')
      await page.getByLabel('IGC approval level').selectOption({ label: 'All flights, including records' })
      await page.getByRole('button', { name: 'Add the flight recorder' }).click()
      await page.getByTestId('units-flight-recorder').getByText('Example Logger 3').waitFor()
      await expectNoSidewaysScroll(page)

      // A document: the insurance certificate, checked by content on the server.
      const documents = page.getByTestId('document-panel')
      await documents.getByLabel('Kind of document').selectOption({ label: 'Insurance' })
      await documents.getByLabel('Valid until').fill('2027-12-31')
      await documents.getByLabel('File').setInputFiles({ name: 'insurance.pdf', mimeType: 'application/pdf', buffer: tinyPdf('Insurance certificate') })
      await documents.getByRole('button', { name: 'Upload document' }).click()
      await documents.getByRole('link', { name: /View insurance/ }).waitFor()

      // An IGC file from the flight recorder: its declaration is shown as parsed.
      const igc = page.getByTestId('igc-panel')
      await igc.getByLabel('IGC file').setInputFiles({ name: 'recent.igc', mimeType: 'text/plain', buffer: igcFixture('valid-declaration.igc') })
      await igc.getByRole('button', { name: 'Upload IGC file' }).click()
      await igc.getByText('D-KMOR').waitFor()
      await screenshot(page, 'entry-dossier-files-phone')

      // The entry fee, by card on the payment service's page, back to "payment received".
      await page.getByRole('link', { name: 'Pay the entry fee', exact: true }).click()
      await page.getByTestId('pay-by-card').click()
      await page.waitForURL(url => url.pathname.startsWith('/pay/'))
      await page.getByLabel('Card number').fill('4242 4242 4242 4242')
      await page.getByRole('button', { name: /^Pay/ }).click()
      await page.getByTestId('payment-received').waitFor()
      await gotoApp(page, baseUrl, dossierPath)
      await expect(page.getByTestId('payment-status').textContent()).resolves.toContain('Paid')

      await page.getByRole('button', { name: 'Submit the entry' }).click()
      await page.getByTestId('entry-status').getByText('Submitted').waitFor()
      await expect(page.getByTestId('next-step').textContent()).resolves.toContain('Wait for the organiser to accept the entry.')
      await screenshot(page, 'entry-dossier-submitted-phone')

      const row = await testDb()('entries').where({ competition_id: competitionId }).first()
      expect(row).toMatchObject({ status: 'submitted', comp_id: 'MH', empty_mass_kg: '262.5', crew_names: ['Rita Retrieve'] })
      const units = await testDb()('units').where({ entry_id: row.id }).orderBy('kind')
      expect(units.map(u => [u.kind, u.radio_id])).toEqual([['collision-warning', '4A7C21'], ['flight-recorder', null]])
      expect(row.payment_status).toBe('paid')
      expect(await testDb()('documents').where({ entry_id: row.id, kind: 'insurance', status: 'pending' }).count('* as n').first()).toEqual({ n: '1' })
      const igcRow = await testDb()('igc_files').where({ entry_id: row.id }).first()
      expect(igcRow).toMatchObject({ unit_id: units[1]!.id, glider_id: 'D-KMOR', has_g_record: true })

      // My entries shows it with its next step.
      await gotoApp(page, baseUrl, '/entries')
      const card = page.getByTestId('my-entry').filter({ hasText: 'G-MOOR' })
      await expect(card.textContent()).resolves.toContain('Wait for the organiser to accept the entry.')
      await screenshot(page, 'my-entries-phone')

      // Sunlight mode on the grid: the dossier still fits the phone.
      await browser.context.addCookies([{ name: 'gridmark-sunlight', value: 'on', url: baseUrl }])
      await gotoApp(page, baseUrl, dossierPath)
      await page.getByTestId('status-banner').waitFor()
      await expectNoSidewaysScroll(page)
      await screenshot(page, 'entry-dossier-sunlight-phone')
      await browser.context.addCookies([{ name: 'gridmark-sunlight', value: 'off', url: baseUrl }])
    }
    finally {
      await page.close()
    }
  })

  it('lets the organiser open the dossier on a wall screen and accept it', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'wall')
    try {
      await signInThroughForm(page, baseUrl, organiser.email, GOOD_PASSWORD, dossierPath)
      await page.getByTestId('status-banner').waitFor()
      await expect(page.getByTestId('edit-note').textContent()).resolves.toContain('As the organiser')
      await screenshot(page, 'entry-dossier-organiser-wall')
      await page.getByRole('button', { name: 'Accept the entry' }).click()
      await page.getByTestId('entry-status').getByText('Accepted').waitFor()
      // The organiser sees the entry's e-mail: the submission notice at least, once sent.
      await page.getByTestId('entry-mail-item').first().waitFor()
      expect(await page.getByTestId('entry-mail').textContent()).toContain(`To ${entrant.email}`)
      await screenshot(page, 'entry-dossier-accepted-wall')
      const row = await testDb()('entries').where({ competition_id: competitionId }).first()
      expect(row.status).toBe('accepted')
      const mail = await testDb()('mail_outbox').where({ entry_id: row.id, template: 'entry-accepted' }).first()
      expect(mail.to_address).toBe(entrant.email)
    }
    finally {
      await page.close()
    }
  })

  it('lets the organiser reject with a reason, and the entrant change the entry and withdraw it', async () => {
    const classId = (await testDb()('classes').where({ competition_id: competitionId, name: 'Club' }).first()).id
    const id = await completeEntry(entrant.client, competitionId, entryBody(classId, { compId: 'RJ', registration: 'G-REJX', copilotName: 'Cleo Copilot' }), '5B6C7D')
    expect((await entrant.client.post(`/api/competitions/${competitionId}/entries/${id}/submit`)).status).toBe(200)
    const path = `/competitions/${competitionId}/entries/${id}`

    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, organiser.email, GOOD_PASSWORD, path)
      await page.getByRole('button', { name: 'Reject with a reason…' }).click()
      await page.getByRole('button', { name: 'Reject the entry' }).click()
      await page.locator('#reject-reason-error').getByText('Give the entrant a reason.').waitFor()
      await page.getByLabel('Reason for the entrant').fill('The registration does not match the insurance.')
      await page.getByRole('button', { name: 'Reject the entry' }).click()
      await page.getByTestId('entry-status').getByText('Rejected').waitFor()
      await screenshot(page, 'entry-dossier-rejected-phone')

      await browser.context.clearCookies()
      await signInThroughForm(page, baseUrl, entrant.email, GOOD_PASSWORD, path)
      await expect(page.getByTestId('next-step').textContent()).resolves.toContain('The registration does not match the insurance.')
      await page.getByRole('button', { name: 'Change the entry' }).click()
      await page.getByLabel('Co-pilot (optional)').fill('')
      await page.getByRole('button', { name: 'Save the changes' }).click()
      await page.getByRole('heading', { name: 'Pilot and crew' }).waitFor()
      expect((await testDb()('entries').where({ id }).first()).copilot_name).toBeNull()

      await page.getByRole('button', { name: 'Withdraw the entry…' }).click()
      await page.getByRole('button', { name: 'Yes, withdraw' }).click()
      await page.getByTestId('entry-status').getByText('Withdrawn').waitFor()
      await expect(page.getByTestId('next-step').textContent()).resolves.toBe('This entry is withdrawn. Nothing more to do.')
      expect(await page.getByRole('button', { name: 'Change the entry' }).count()).toBe(0)
    }
    finally {
      await page.close()
    }
  })

  it('lets the organiser withdraw an entry for the pilot: a reason, a confirmation, and the pilot is told why', async () => {
    const classId = (await testDb()('classes').where({ competition_id: competitionId, name: 'Standard' }).first()).id
    const id = await completeEntry(entrant.client, competitionId, entryBody(classId, { compId: 'WP', registration: 'G-WDRW', pilotName: 'Bea Browser' }), '6C7D8E')
    expect((await entrant.client.post(`/api/competitions/${competitionId}/entries/${id}/submit`)).status).toBe(200)
    expect((await organiser.client.post(`/api/competitions/${competitionId}/entries/${id}/accept`)).status).toBe(200)

    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    try {
      await signInThroughForm(page, baseUrl, organiser.email, GOOD_PASSWORD, `/competitions/${competitionId}/entries/${id}`)
      // The entrant's own button is not the office's.
      expect(await page.getByRole('button', { name: 'Withdraw the entry…' }).count()).toBe(0)
      await page.getByRole('button', { name: 'Withdraw for the pilot…' }).click()
      const form = page.getByTestId('withdraw-for-pilot-form')
      await form.getByRole('button', { name: 'Withdraw for the pilot…' }).click()
      await page.locator('#withdraw-reason-error').getByText('Say why the office withdraws this entry: the pilot is told the reason.').waitFor()
      await form.getByLabel('Why does the office withdraw it?').fill('The pilot phoned: the trailer broke down on the way.')
      await form.getByRole('button', { name: 'Withdraw for the pilot…' }).click()
      // A confirmation first: nothing is withdrawn yet.
      await form.getByTestId('withdraw-confirm').getByText('Withdraw WP for good?').waitFor()
      expect((await testDb()('entries').where({ id }).first()).status).toBe('accepted')
      await screenshot(page, 'entry-withdraw-for-pilot-desk')
      await form.getByRole('button', { name: 'Yes, withdraw for the pilot' }).click()
      await page.getByTestId('entry-status').getByText('Withdrawn').waitFor()
      expect(await page.getByRole('button', { name: 'Withdraw for the pilot…' }).count()).toBe(0)

      const audit = await testDb()('audit_log').where({ subject_id: id, action: 'entry.withdrawn' }).first()
      expect(audit.actor_user_id).toBe(organiser.user.id)
      expect(audit.details).toMatchObject({ by: 'office', reason: 'The pilot phoned: the trailer broke down on the way.' })
      const told = await testDb()('mail_outbox').where({ entry_id: id, template: 'entry-withdrawn' }).first()
      expect(told.to_address).toBe(entrant.email)
      expect(told.text_body).toContain('Their reason: The pilot phoned: the trailer broke down on the way.')
    }
    finally {
      await page.close()
    }
  })
})
