// The organiser's set-up page and the firmware catalogue, in a competition of the test's own.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { closeTestDb, createClass, testDb } from '../support/db'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { competitionWithRoles, type RoleClients } from '../support/setup'

const baseUrl = inject('baseUrl')

let browser: Browser
let t: RoleClients
let organiserEmail: string
beforeAll(async () => {
  browser = await launchBrowser()
  t = await competitionWithRoles(baseUrl, 'Browser Setup Cup')
  organiserEmail = (await testDb()('users').where({ id: t.ids.organiser }).first('email')).email
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('set-up page', () => {
  it('lets the organiser change the set-up, see a refusal beside the field, and add an FAI and a custom class', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    try {
      await signInThroughForm(page, baseUrl, organiserEmail, GOOD_PASSWORD, `/competitions/${t.competitionId}/setup`)
      await page.getByRole('heading', { name: 'Set-up', level: 1 }).waitFor()

      // A bad ICAO indicator is refused by the shared schema, beside its field.
      await page.getByLabel('ICAO location indicator').fill('K1')
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await page.getByText('An ICAO location indicator is four letters, e.g. EDKM.').first().waitFor()
      await screenshot(page, 'setup-error-desk')

      await page.getByLabel('ICAO location indicator').fill('edbm')
      await page.getByLabel('Sat 1 May').check()
      await page.getByLabel('Sun 2 May').check()
      await page.getByLabel('Late fee (EUR)').fill('45')
      await page.getByLabel('Two flight recorders').check()
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await page.getByTestId('setup-saved').waitFor()
      const row = await testDb()('competitions').where({ id: t.competitionId }).first()
      expect(row.airfield_icao).toBe('EDBM')
      expect(row.late_fee_minor).toBe(4500)
      expect(row.settings.recordersRequired).toBe(2)
      const days = await testDb()('competition_days').where({ competition_id: t.competitionId }).select(testDb().raw(`to_char(day, 'YYYY-MM-DD') as day`), 'kind').orderBy('day')
      expect(days).toEqual([{ day: '2027-05-01', kind: 'contest' }, { day: '2027-05-02', kind: 'contest' }])

      // Add an FAI class: its default limits show before adding (Annex A, from memory).
      await page.getByLabel('FAI class or custom').selectOption('standard')
      await expect.poll(() => page.getByTestId('class-add-defaults').textContent()).toContain('span ≤ 15 m · MTOM ≤ 525 kg')
      await page.getByRole('button', { name: 'Add class' }).click()
      await page.getByRole('heading', { name: 'Standard', level: 3 }).waitFor()

      await page.getByLabel('FAI class or custom').selectOption('custom')
      await page.getByLabel('Name of the custom class').fill('Vintage')
      await page.getByRole('button', { name: 'Add class' }).click()
      await page.getByRole('heading', { name: 'Vintage', level: 3 }).waitFor()

      const vintage = page.getByRole('form', { name: 'Class Vintage' })
      await vintage.getByLabel('Entry fee (EUR)').fill('180')
      await vintage.getByRole('button', { name: 'Save class' }).click()
      await expect.poll(async () => (await testDb()('classes').where({ competition_id: t.competitionId, name: 'Vintage' }).first())?.entry_fee_minor).toBe(18000)
      await screenshot(page, 'setup-classes-desk')
      const classes = await testDb()('classes').where({ competition_id: t.competitionId }).orderBy('sort_order')
      expect(classes.map(c => [c.name, c.code, c.max_span_m, c.max_mtom_kg])).toEqual([['Standard', 'standard', '15.00', '525.0'], ['Vintage', 'custom', null, null]])
    }
    finally {
      await page.close()
    }
  })

  it('saves the reminder schedule, and shows a clear error beside the field for a bad one', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    try {
      await signInThroughForm(page, baseUrl, organiserEmail, GOOD_PASSWORD, `/competitions/${t.competitionId}/setup`)
      const field = page.getByLabel('Send reminders (days before the first contest day)')
      await expect.poll(() => field.inputValue()).toBe('30, 14, 3')
      await expect.poll(() => page.getByTestId('setup-reminder-schedule').textContent()).toContain('30, 14 and 3 days before the first contest day')

      await field.fill('30, 14, 14')
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await page.locator('#setup-reminderDays-error').getByText('A reminder day is listed twice.').waitFor()
      expect(await field.getAttribute('aria-describedby')).toContain('setup-reminderDays-error')
      await field.fill('21, soon')
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await page.locator('#setup-reminderDays-error').getByText('Enter each reminder as a whole number of days, e.g. 30, 14, 3.').waitFor()
      await screenshot(page, 'setup-reminders-error-desk')
      expect((await testDb()('competitions').where({ id: t.competitionId }).first()).settings.reminderDays).not.toEqual([21, 7])

      await field.fill('7 21')
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await page.getByTestId('setup-saved').waitFor()
      await expect.poll(async () => (await testDb()('competitions').where({ id: t.competitionId }).first()).settings.reminderDays).toEqual([21, 7])
      await expect.poll(() => field.inputValue()).toBe('21, 7')
      await expect.poll(() => page.getByTestId('setup-reminder-schedule').textContent()).toContain('21 and 7 days before the first contest day')
    }
    finally {
      await page.close()
    }
  })

  it('keeps medical and licence files as many days after the last contest day as the organiser says', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    try {
      await signInThroughForm(page, baseUrl, organiserEmail, GOOD_PASSWORD, `/competitions/${t.competitionId}/setup`)
      const field = page.getByLabel('Keep medical and licence files (days)')
      await expect.poll(() => field.inputValue()).toBe('30')
      await page.getByText('Pilots’ medical and licence files are deleted this many days after the last contest day').waitFor()

      await field.fill('0')
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await page.locator('#setup-rules').getByText('The medical and licence retention is at least 1 day.').waitFor()
      await field.fill('45')
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await page.getByTestId('setup-saved').waitFor()
      await expect.poll(async () => (await testDb()('competitions').where({ id: t.competitionId }).first()).settings.medicalRetentionDays).toBe(45)
    }
    finally {
      await page.close()
    }
  })

  it('fits a phone without sideways scrolling', async () => {
    const page = await openPage(browser.context, baseUrl, `/competitions/${t.competitionId}/setup`, 'phone')
    try {
      await page.getByRole('heading', { name: 'Set-up', level: 1 }).waitFor()
      const { scrollWidth, innerWidth } = await page.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth }))
      expect(scrollWidth).toBeLessThanOrEqual(innerWidth)
      await screenshot(page, 'setup-phone')
    }
    finally {
      await page.close()
    }
  })

  it('imports a firmware catalogue CSV and reports bad lines by number', async () => {
    const page = await openPage(browser.context, baseUrl, `/competitions/${t.competitionId}/firmware`, 'desk')
    try {
      await page.getByRole('heading', { name: 'Firmware catalogue', level: 1 }).waitFor()
      const input = page.getByLabel('CSV file', { exact: true })
      await input.setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('unit_family,version,expires_on\nUnit A,1.0,2028-01-01\nUnit A,,2028-01-01\n') })
      await page.getByRole('button', { name: 'Import' }).click()
      await page.getByTestId('firmware-import-errors').getByText('Line 3: version: Enter the firmware version.').waitFor()
      await input.setInputFiles({ name: 'good.csv', mimeType: 'text/csv', buffer: Buffer.from('unit_family,version,expires_on\nUnit A,1.0,2028-01-01\nUnit B,2.4,2028-06-30\n') })
      await page.getByRole('button', { name: 'Import' }).click()
      await expect.poll(() => page.getByTestId('firmware-import-result').textContent()).toContain('2 added, 0 updated')
      await page.getByTestId('firmware-table').getByText('Unit B').waitFor()
      await screenshot(page, 'firmware-organiser-desk')
      await page.setViewportSize({ width: 390, height: 844 })
      await page.getByTestId('firmware-cards').getByText('Unit B').waitFor()
      await expect.poll(() => page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true)
      await screenshot(page, 'firmware-organiser-phone')
    }
    finally {
      await page.close()
    }
  })

  it('shows scrutineers the catalogue read-only', async () => {
    await browser.context.clearCookies()
    const email = (await testDb()('users').where({ id: t.ids.scrutineer }).first('email')).email
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD, `/competitions/${t.competitionId}/firmware`)
      await page.getByTestId('firmware-read-only').waitFor()
      expect(await page.getByRole('button', { name: /Delete/ }).count()).toBe(0)
      expect(await page.getByLabel('CSV file', { exact: true }).count()).toBe(0)
      await screenshot(page, 'firmware-scrutineer-phone')
      // The set-up page is the organiser's.
      await gotoApp(page, baseUrl, `/competitions/${t.competitionId}/setup`)
      await page.getByText(/organiser/i).first().waitFor()
      expect(await page.getByRole('button', { name: 'Save set-up' }).count()).toBe(0)
    }
    finally {
      await page.close()
    }
  })

  it('lets a site administrator create a competition with its first organiser, then opens its set-up', async () => {
    await browser.context.clearCookies()
    const adminEmail = (await testDb()('users').where({ id: t.ids.admin }).first('email')).email
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, adminEmail, GOOD_PASSWORD)
      await page.getByTestId('new-competition').click()
      await page.getByRole('heading', { name: 'New competition' }).waitFor()
      await page.getByLabel('Name of the competition').fill('Browser Created Trophy')
      await page.getByLabel('Airfield').fill('Fenwick Down')
      await page.getByLabel('Time zone').fill('Europe/Nowhere')
      await page.getByLabel('First contest day').fill('2027-08-02')
      await page.getByLabel('Last contest day').fill('2027-08-09')
      await page.getByLabel('First organiser’s e-mail address').fill(organiserEmail)
      await page.getByRole('button', { name: 'Create competition' }).click()
      await page.getByText('That is not a known IANA time zone; use a name like Europe/Berlin.').first().waitFor()
      await screenshot(page, 'new-competition-error-phone')
      await page.getByLabel('Time zone').fill('Europe/London')
      await Promise.all([
        page.waitForURL(/\/competitions\/[0-9a-f-]{36}\/setup$/),
        page.getByRole('button', { name: 'Create competition' }).click(),
      ])
      await page.getByRole('heading', { name: 'Set-up', level: 1 }).waitFor()
      const created = await testDb()('competitions').where({ name: 'Browser Created Trophy' }).first('id')
      const members = await testDb()('memberships').where({ competition_id: created.id })
      expect(members.map(m => [m.user_id, m.role])).toEqual([[t.ids.organiser, 'organiser']])
    }
    finally {
      await page.close()
    }
  })
})

describe('set-up page keeps every change', () => {
  it('saves a changed class fee with "Save set-up", so it survives a reload, and asks before unsaved changes are left', async () => {
    const own = await competitionWithRoles(baseUrl, 'Browser Fee Cup')
    const classId = await createClass(own.competitionId, 'Club', 20000)
    const email = (await testDb()('users').where({ id: own.ids.organiser }).first('email')).email
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    const dialogs: string[] = []
    try {
      const path = `/competitions/${own.competitionId}/setup`
      await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD, path)
      const club = page.getByRole('form', { name: 'Class Club' })
      await club.getByLabel('Entry fee (EUR)').fill('210')
      await club.getByTestId('setup-class-unsaved').waitFor()
      // The page's own save takes the class change with it.
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await expect.poll(() => page.getByTestId('setup-saved').textContent()).toContain('with 1 class')
      expect((await testDb()('classes').where({ id: classId }).first()).entry_fee_minor).toBe(21000)
      await gotoApp(page, baseUrl, path)
      expect(await page.getByRole('form', { name: 'Class Club' }).getByLabel('Entry fee (EUR)').inputValue()).toBe('210.00')
      await screenshot(page, 'setup-saved-with-class-desk')

      // A change not saved: leaving asks first; staying keeps it, leaving then goes.
      await page.getByRole('form', { name: 'Class Club' }).getByLabel('Entry fee (EUR)').fill('999')
      page.once('dialog', (d) => {
        dialogs.push(`${d.type()}: ${d.message()}`)
        void d.dismiss()
      })
      await page.locator('main').getByRole('link', { name: 'Firmware catalogue' }).click()
      await expect.poll(() => dialogs.length).toBe(1)
      expect(dialogs[0]).toBe('confirm: You have changes that are not saved. Leave this page and lose them?')
      expect(new URL(page.url()).pathname).toBe(path)
      expect(await page.getByRole('form', { name: 'Class Club' }).getByLabel('Entry fee (EUR)').inputValue()).toBe('999')

      // Closing the tab gets the browser's own warning.
      page.once('dialog', (d) => {
        dialogs.push(d.type())
        void d.dismiss()
      })
      await page.close({ runBeforeUnload: true })
      await expect.poll(() => dialogs.length).toBe(2)
      expect(dialogs[1]).toBe('beforeunload')
      expect(page.isClosed()).toBe(false)

      page.once('dialog', d => void d.accept())
      await page.locator('main').getByRole('link', { name: 'Firmware catalogue' }).click()
      await page.waitForURL(url => url.pathname === `/competitions/${own.competitionId}/firmware`)
      expect((await testDb()('classes').where({ id: classId }).first()).entry_fee_minor).toBe(21000)
    }
    finally {
      if (!page.isClosed()) await page.close()
    }
  })
})
