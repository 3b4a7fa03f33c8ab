// The organiser's glider tags in Chromium: issue tags for a class, open the print preview of
// the sheet (screenshot at desk size), reissue one tag; and the grid checklist in the set-up.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD, signedUpClient } from '../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../support/db'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'

const baseUrl = inject('baseUrl')

let browser: Browser
let competitionId: string
let organiserEmail: string
let standard: string
let club: string
const entries: Record<string, string> = {}
beforeAll(async () => {
  browser = await launchBrowser()
  const [organiser, entrant] = await Promise.all([signedUpClient(baseUrl, 'Tess Tagger'), signedUpClient(baseUrl, 'Pia Pilot')])
  organiserEmail = organiser.email
  competitionId = await createCompetition('Browser Tags Cup', [{ userId: organiser.user.id, role: 'organiser' }])
  standard = await createClass(competitionId, 'Standard')
  club = await createClass(competitionId, 'Club')
  for (const [compId, classId, status] of [['A1', standard, 'accepted'], ['A2', standard, 'accepted'], ['A3', standard, 'submitted'], ['C4', club, 'accepted']] as const) {
    entries[compId] = await createEntry({ competitionId, classId, entrantUserId: entrant.user.id, compId, status })
  }
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

const currentCode = async (entryId: string) =>
  (await testDb()('tags').where({ entry_id: entryId }).whereNull('revoked_at').first('short_code'))?.short_code as string | undefined

describe('glider tags page', () => {
  it('issues tags for a class, previews the sheet for printing, and reissues one tag', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'desk')
    try {
      await signInThroughForm(page, baseUrl, organiserEmail, GOOD_PASSWORD, `/competitions/${competitionId}/tags`)
      await page.getByRole('heading', { name: 'Glider tags', level: 1 }).waitFor()
      // Only accepted entries are listed, each without a tag yet.
      await expect.poll(() => page.getByText('No tag yet').count()).toBe(3)
      expect(await page.getByTestId('tag-entry-A3').count()).toBe(0)

      await page.getByTestId(`tag-class-${standard}`).getByLabel('Select the class').check()
      await page.getByTestId('tags-issue-selected').click()
      await expect.poll(() => page.getByTestId('tags-status').textContent()).toContain('Issued 2 tags')
      const a1Code = await currentCode(entries.A1!)
      expect(a1Code).toMatch(/^[34679ACDEFGHJKMNPRTWXY]{8}$/)
      expect(await currentCode(entries.A2!)).toBeTruthy()
      expect(await currentCode(entries.C4!)).toBeUndefined()
      await expect.poll(() => page.getByTestId('tag-entry-A1').getByTestId('tag-state').textContent()).toContain(`${a1Code!.slice(0, 4)}-${a1Code!.slice(4)}`)

      // The print preview of the selection: two stickers with their QR codes, a PDF link.
      await Promise.all([
        page.waitForURL(url => url.pathname.endsWith('/tags/print')),
        page.getByTestId('tags-print-preview').click(),
      ])
      await page.getByRole('heading', { name: 'Print glider tags', level: 1 }).waitFor()
      await expect.poll(() => page.locator('[data-testid^="tag-print-"] svg').count()).toBe(2)
      await expect.poll(() => page.getByTestId('tag-print-A1').textContent()).toContain(`${a1Code!.slice(0, 4)}-${a1Code!.slice(4)}`)
      const pdfHref = await page.getByTestId('tags-pdf').getAttribute('href')
      expect(pdfHref).toMatch(new RegExp(`/api/competitions/${competitionId}/tags/sheet\\.pdf\\?entryIds=`))
      const pdf = await page.request.get(new URL(pdfHref!, baseUrl).toString())
      expect(pdf.status()).toBe(200)
      expect(pdf.headers()['content-type']).toBe('application/pdf')
      expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-')
      await screenshot(page, 'tags-print')
      // Printed, only the sheet shows: the app's header and the buttons are hidden.
      await page.emulateMedia({ media: 'print' })
      expect(await page.getByTestId('tags-print').isVisible()).toBe(false)
      expect(await page.getByTestId('tag-print-A1').isVisible()).toBe(true)
      await page.emulateMedia({ media: 'screen' })

      // Reissue A1 after confirming: a new short code, the old tag revoked.
      await gotoApp(page, baseUrl, `/competitions/${competitionId}/tags`)
      page.once('dialog', dialog => void dialog.accept())
      await page.getByRole('button', { name: 'Reissue the tag of A1' }).click()
      await expect.poll(() => page.getByTestId('tags-status').textContent()).toContain('A1 has a new tag')
      const fresh = await currentCode(entries.A1!)
      expect(fresh).toBeTruthy()
      expect(fresh).not.toBe(a1Code)
      expect(await testDb()('tags').where({ entry_id: entries.A1!, short_code: a1Code! }).whereNotNull('revoked_at').count('* as n').first()).toMatchObject({ n: '1' })
      await expect.poll(() => page.getByTestId('tag-entry-A1').getByTestId('tag-state').textContent()).toContain(`${fresh!.slice(0, 4)}-${fresh!.slice(4)}`)
    }
    finally {
      await page.close()
    }
  })

  it('fits a 360 px phone without sideways scrolling', async () => {
    const page = await openPage(browser.context, baseUrl, `/competitions/${competitionId}/tags`, 'narrowPhone')
    try {
      await page.getByRole('heading', { name: 'Glider tags', level: 1 }).waitFor()
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360)
      await gotoApp(page, baseUrl, `/competitions/${competitionId}/tags/print`)
      await page.getByRole('heading', { name: 'Print glider tags', level: 1 }).waitFor()
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360)
      await screenshot(page, 'tags-print-phone')
    }
    finally {
      await page.close()
    }
  })
})

describe('grid checklist in the set-up', () => {
  it('adds an item, moves it up, changes a hint, removes one, and saves them with the rules', async () => {
    const page = await openPage(browser.context, baseUrl, `/competitions/${competitionId}/setup`, 'desk')
    try {
      await page.getByRole('heading', { name: 'Set-up', level: 1 }).waitFor()
      const editor = page.getByTestId('checklist-editor')
      await editor.getByLabel('New item').fill('Tail dolly removed')
      await editor.getByLabel('Its hint (optional)').fill('Before the tug arrives.')
      await editor.getByRole('button', { name: 'Add item' }).click()
      await editor.getByTestId('checklist-item-tail-dolly-removed').waitFor()
      await editor.getByRole('button', { name: 'Move “Tail dolly removed” up' }).click()
      await editor.getByRole('button', { name: 'Remove “Ballast as declared”' }).click()
      await page.locator('#checklist-antennas-hint').fill('Plugged in before power-up.')
      await page.getByRole('button', { name: 'Save set-up' }).click()
      await page.getByTestId('setup-saved').waitFor()

      const row = await testDb()('competitions').where({ id: competitionId }).first('settings')
      const ids = row.settings.gridChecklist.map((i: { id: string }) => i.id)
      expect(ids.slice(-2)).toEqual(['tail-dolly-removed', 'tag-readable'])
      expect(ids).not.toContain('ballast')
      expect(row.settings.gridChecklist.find((i: { id: string }) => i.id === 'antennas').hint).toBe('Plugged in before power-up.')
      expect(row.settings.gridChecklist.find((i: { id: string }) => i.id === 'tail-dolly-removed')).toEqual({ id: 'tail-dolly-removed', label: 'Tail dolly removed', hint: 'Before the tug arrives.' })
      await screenshot(page, 'setup-checklist-desk')
    }
    finally {
      await page.close()
    }
  })
})
