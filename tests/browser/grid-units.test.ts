// The units on the grid phone: the scrutineer reads each collision-warning unit's firmware,
// expiry and radio ID and each recorder's IGC recorder ID and firmware, large, beside the
// unit's own display; "the unit shows another version" takes what the unit shows (its expiry
// from the organiser's catalogue), re-checks at once, and the recorded check corrects the
// dossier. Screenshots in artifacts/screenshots/grid-units-*.png.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb, testDb } from '../support/db'
import { launchBrowser, openGridCheck, screenshot, type Browser } from '../support/browser'
import { gridEntry, gridWorld, type GridWorld } from '../support/grid'

const baseUrl = inject('baseUrl')

let w: GridWorld
let entryId: string
let radioId: string
let browser: Browser
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Browser Grid Units Cup')
  entryId = await gridEntry(w, { compId: 'UN' })
  const db = testDb()
  const cw = await db('units').where({ entry_id: entryId, kind: 'collision-warning' }).first('radio_id')
  radioId = cw.radio_id
  await db('units').where({ entry_id: entryId, kind: 'flight-recorder' }).update({ igc_recorder_id: 'XKM487' })
  // The organiser's catalogue: release 7.08 of this unit family stops working before the last contest day.
  const { last_contest_day: last } = await db('competitions').where({ id: w.competitionId }).first('last_contest_day')
  await db('firmware_releases').insert({ competition_id: w.competitionId, unit_family: 'Example CW-2', version: '7.08', expires_on: '2027-05-01' })
  expect(String(last) > '2027-05-01').toBe(true)
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('the units on the grid phone', () => {
  it('shows the dossier’s unit data large, and records the version the unit shows', async () => {
    const page = await openGridCheck(browser, baseUrl, w.scrutineer.email, w.competitionId, entryId)

    const cw = page.locator('[data-testid="grid-unit"][data-kind="collision-warning"]')
    expect(await cw.getByTestId('grid-unit-firmware').textContent()).toContain('7.20')
    expect(await cw.getByTestId('grid-unit-expiry').textContent()).toContain('2029-01-31')
    expect((await cw.getByTestId('grid-unit-radio-id').textContent())?.trim()).toBe(radioId)
    const recorder = page.locator('[data-testid="grid-unit"][data-kind="flight-recorder"]')
    expect(await recorder.textContent()).toContain('Example Logger 3')
    expect((await recorder.getByTestId('grid-unit-recorder-id').textContent())?.trim()).toBe('XKM-487')
    expect((await recorder.getByTestId('grid-unit-firmware').textContent())?.trim()).toBe('2.1')
    // Large enough to read beside the unit's display at arm's length (30 px at least).
    const size = await cw.getByTestId('grid-unit-firmware').evaluate(el => Number.parseFloat(getComputedStyle(el).fontSize))
    expect(size).toBeGreaterThanOrEqual(30)
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
    await screenshot(page, 'grid-units-phone')

    // The unit shows 7.08: its expiry comes from the catalogue and the checks run on it at once.
    const firmwareItem = page.locator('[data-testid="checklist-item"][data-item-id="cwu-firmware"]')
    await firmwareItem.getByTestId('unit-shows-other').click()
    await firmwareItem.getByTestId('unit-shown-version').fill('7.08')
    expect(await firmwareItem.getByTestId('unit-shown-expiry').inputValue()).toBe('2027-05-01')
    await page.locator('[data-check-id="firmware.valid-through-contest"]').first().waitFor()
    expect(await cw.getByTestId('grid-unit-shown').textContent()).toContain('7.08')
    await firmwareItem.scrollIntoViewIfNeeded()
    await screenshot(page, 'grid-units-shown')

    await page.getByTestId('grid-check-submit').click()
    const outcome = page.getByTestId('grid-check-outcome')
    await outcome.waitFor()
    expect(await outcome.getAttribute('data-readiness')).not.toBe('ready')
    await page.locator('[data-testid="grid-check-outcome"][data-state="recorded"]').waitFor()

    // The dossier says what the unit showed, and the check's note says what it replaced.
    const unit = await testDb()('units').where({ entry_id: entryId, kind: 'collision-warning' }).first()
    expect(unit.firmware_version).toBe('7.08')
    expect(unit.firmware_expires_on).toBe('2027-05-01')
    const check = await testDb()('grid_checks').where({ entry_id: entryId }).orderBy('received_at', 'desc').first('answers')
    const answers = typeof check.answers === 'string' ? JSON.parse(check.answers) : check.answers
    const firmwareAnswer = answers.find((a: { itemId: string }) => a.itemId === 'cwu-firmware')
    expect(firmwareAnswer.result).toBe('pass')
    expect(firmwareAnswer.note).toContain('shows 7.08')
    expect(firmwareAnswer.note).toContain('the dossier had 7.20')
  })
})
