// Walks every page as each demo role sees it, on a phone and on a wall screen: each page has
// exactly one h1 and nothing pushes a phone page sideways. Screenshots go to
// artifacts/screenshots/walk-*.png for a person to look at.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../seeds/demo-data'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, VIEWPORTS, type Browser } from '../support/browser'
import { closeTestDb, testDb } from '../support/db'

const baseUrl = inject('baseUrl')

let browser: Browser
let competitionId: string
let entrantEntryId: string

beforeAll(async () => {
  browser = await launchBrowser()
  const competition = await testDb()('competitions').where({ slug: 'kestrel-moor-2027' }).first('id')
  competitionId = competition.id
  const entry = await testDb()('entries')
    .join('users', 'users.id', 'entries.entrant_user_id')
    .where({ 'users.email': 'entrant@gridmark.example', 'entries.competition_id': competitionId })
    .first('entries.id')
  entrantEntryId = entry.id
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

/** Measures one page at phone and wall size and saves both screenshots. */
async function walk(page: Page, path: string, name: string) {
  for (const size of ['phone', 'wall'] as const) {
    await page.setViewportSize(VIEWPORTS[size])
    await gotoApp(page, baseUrl, path)
    // Data pages fetch on the client after navigation; let them settle before measuring.
    await page.waitForLoadState('networkidle').catch(() => {})
    const facts = await page.evaluate(() => ({
      scrollWidth: document.documentElement.scrollWidth,
      innerWidth: window.innerWidth,
      h1: document.querySelectorAll('h1').length,
    }))
    expect.soft(facts.h1, `${name} at ${size}: one h1`).toBe(1)
    if (size === 'phone') expect.soft(facts.scrollWidth, `${name} at phone: no sideways scroll`).toBeLessThanOrEqual(facts.innerWidth)
    await screenshot(page, `walk-${name}-${size}`)
  }
}

async function asRole(email: string, pages: [path: string, name: string][], after?: (page: Page) => Promise<void>) {
  await browser.context.clearCookies()
  const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
  try {
    await signInThroughForm(page, baseUrl, email, DEMO_PASSWORD)
    for (const [path, name] of pages) await walk(page, path, name)
    await after?.(page)
  }
  finally {
    await page.close()
  }
}

describe('walking every page as each demo role', () => {
  it('signed out: landing, sign-in, sign-up, an unknown invitation and a missing page', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/', 'phone')
    try {
      await walk(page, '/', 'landing')
      await walk(page, '/sign-in', 'sign-in')
      await walk(page, '/sign-up', 'sign-up')
      await walk(page, '/invitations/not-a-real-token', 'invitation-unknown')
      await walk(page, '/no-such-page', 'error-404')
    }
    finally {
      await page.close()
    }
  })

  it('organiser', async () => {
    const c = `/competitions/${competitionId}`
    await asRole('organiser@gridmark.example', [
      ['/', 'home-organiser'],
      [c, 'overview-organiser'],
      [`${c}/setup`, 'setup'],
      [`${c}/people`, 'people'],
      [`${c}/payments`, 'payments'],
      [`${c}/firmware`, 'firmware-organiser'],
      [`${c}/documents`, 'documents-organiser'],
      [`${c}/entries`, 'entries-organiser'],
      ['/competitions/00000000-0000-0000-0000-000000000000', 'error-competition-unknown'],
    ], async (page) => {
      // Sunlight mode, for the office on the airfield: the same pages in high contrast.
      await browser.context.addCookies([{ name: 'gridmark-sunlight', value: 'on', url: baseUrl }])
      await walk(page, c, 'sunlight-overview-organiser')
      await walk(page, `${c}/payments`, 'sunlight-payments')
      await walk(page, `${c}/setup`, 'sunlight-setup')
      await browser.context.addCookies([{ name: 'gridmark-sunlight', value: 'off', url: baseUrl }])
    })
  }, 180_000)

  it('scrutineer', async () => {
    const c = `/competitions/${competitionId}`
    await asRole('scrutineer@gridmark.example', [
      ['/', 'home-scrutineer'],
      [c, 'overview-scrutineer'],
      [`${c}/documents`, 'documents-scrutineer'],
      [`${c}/firmware`, 'firmware-scrutineer'],
      [`${c}/setup`, 'error-403-setup'],
    ], async (page) => {
      // A page of the competition that needs another role leads back to the competition.
      await gotoApp(page, baseUrl, `${c}/setup`)
      await Promise.all([
        page.waitForURL(url => url.pathname === c),
        page.getByRole('button', { name: 'Back to the competition' }).click(),
      ])
      await page.getByRole('heading', { level: 1, name: 'Kestrel Moor Regionals 2027' }).waitFor()
    })
  })

  it('director', async () => {
    const c = `/competitions/${competitionId}`
    await asRole('director@gridmark.example', [
      ['/', 'home-director'],
      [c, 'overview-director'],
      [`${c}/board`, 'board-director'],
      [`${c}/days`, 'days-director'],
      [`${c}/audit`, 'audit-director'],
      [`${c}/board/${entrantEntryId}`, 'desk-director'],
    ])
  })

  it('entrant', async () => {
    const c = `/competitions/${competitionId}`
    await asRole('entrant@gridmark.example', [
      ['/', 'home-entrant'],
      [c, 'overview-entrant'],
      ['/entries', 'my-entries'],
      [`${c}/entries/${entrantEntryId}`, 'dossier-entrant'],
      [`${c}/entries/${entrantEntryId}/payment`, 'payment-entrant'],
    ])
  })

  it('entrant without an entry', async () => {
    const c = `/competitions/${competitionId}`
    await asRole('entrant10@gridmark.example', [
      ['/', 'home-entrant10'],
      ['/entries', 'my-entries-empty'],
      [`${c}/entries/new`, 'entry-new'],
    ])
  })

  it('site administrator', async () => {
    await asRole('admin@gridmark.example', [
      ['/', 'home-admin'],
      ['/competitions/new', 'competition-new'],
    ])
  })
})
