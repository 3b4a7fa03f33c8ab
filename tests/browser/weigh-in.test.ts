// The grid weigh-in on a phone: the glider on the scales, the water ballast declared when it
// was weighed dry, and the pilot's mass from the registration weighing — each term shown, their
// sum, and the class-limit finding it raises (Standard, 525 kg). Screenshot in
// artifacts/screenshots/grid-weigh-in-terms.png.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, createEntry } from '../support/db'
import { launchBrowser, openGridCheck, screenshot, type Browser } from '../support/browser'
import { entriesWorld, type EntriesWorld } from '../support/entries'

const baseUrl = inject('baseUrl')

let w: EntriesWorld
let entryId: string
let browser: Browser
beforeAll(async () => {
  w = await entriesWorld(baseUrl, 'Browser Weigh-in Cup')
  entryId = await createEntry({ competitionId: w.competitionId, classId: w.classId, entrantUserId: w.entrant.user.id, compId: 'WI', status: 'accepted' })
  expect((await w.scrutineer.client.request('PUT', `/api/competitions/${w.competitionId}/entries/${entryId}/occupant-masses`, { pilotMassKg: 90 })).status).toBe(200)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('the weigh-in at phone size', () => {
  it('shows the scale readings, the declared ballast and the pilot as terms of the take-off mass, and the class-limit finding', async () => {
    const page = await openGridCheck(browser, baseUrl, w.scrutineer.email, w.competitionId, entryId)

    await page.getByTestId('weigh-toggle').click()
    await page.getByTestId('weigh-weight-0').fill('380')
    await page.getByTestId('weigh-arm-0').fill('0.2')
    await page.getByTestId('weigh-weight-1').fill('30')
    await page.getByTestId('weigh-arm-1').fill('4.5')
    // Glider alone: 410 kg + the pilot's 90 kg = 500 kg, under the Standard class's 525 kg.
    expect(await page.getByTestId('weigh-mass').textContent()).toContain('500.0 kg')
    await page.getByTestId('weigh-ballast-dry').click()
    await page.getByTestId('weigh-ballast-kg').fill('40')

    const terms = page.getByTestId('weigh-term')
    await expect.poll(() => terms.count()).toBe(3)
    const rows = await terms.evaluateAll(trs => trs.map(tr => [...tr.querySelectorAll('th, td')].map(c => (c.textContent ?? '').replace(/\s+/g, ' ').trim())))
    expect(rows).toEqual([['Scale readings', '410.0 kg'], ['+Declared water ballast (weighed dry)', '40.0 kg'], ['+Pilot with parachute', '90.0 kg']])
    expect(await page.getByTestId('weigh-mass').textContent()).toContain('540.0 kg')
    const finding = page.locator('[data-testid="weigh-finding"][data-check-id="mass.class-limit"]')
    await finding.waitFor()
    expect(await finding.textContent()).toContain('Take-off mass on')
    expect(await finding.textContent()).toContain('the Standard class allows at most 525.0 kg')
    // The CG needs the flight manual's seat and ballast arms, which this entry does not give.
    expect(await page.getByTestId('weigh-cg-missing').textContent()).toContain('pilot seat')
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
    await page.getByTestId('weigh-result').scrollIntoViewIfNeeded()
    await screenshot(page, 'grid-weigh-in-terms')
  })
})
