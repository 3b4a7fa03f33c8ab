// Every page of the demo, as each role sees it, under the app's Content-Security-Policy: no
// page breaks a rule of it (a securitypolicyviolation event) and no page logs an error or
// throws. Included: the scanner with a camera (Chromium's fake one, showing a demo tag, so the
// grid check opens from the scan), the live board with its socket connected, the document
// review with an uploaded PDF in its frame, a glider's tag page, an invitation page.
// The only console lines let through are the browser's own notes of an expected 4xx answer
// (a signed-out page asking who is signed in, the missing page) — never a refused resource.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { ConsoleMessage, Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../seeds/demo-data'
import { ApiClient } from '../support/api'
import { gotoApp, launchBrowser, openPage, signInThroughForm, type Browser } from '../support/browser'
import { closeTestDb, testDb } from '../support/db'
import { fakeCameraArgs } from '../support/fake-camera'

const baseUrl = inject('baseUrl')

let browser: Browser
let competitionId: string
let entrantEntryId: string
let tagUrl: string

/** Problems seen on a page: CSP violations, console errors, uncaught exceptions. */
interface Watch { problems: string[] }

/** Reports each CSP violation to the console, where the watch below hears it. */
const REPORT_VIOLATIONS = `document.addEventListener('securitypolicyviolation', (e) => {
  console.error('CSP violation: ' + e.violatedDirective + ' blocked ' + (e.blockedURI || 'inline') + ' at ' + e.sourceFile + ':' + e.lineNumber)
})`

// The browser's own line for an answer with an error status: expected where a page asks
// something the server refuses by design. A CSP refusal never reads like this.
const EXPECTED_STATUS = /^Failed to load resource: the server responded with a status of (401|403|404)\b/

function watch(page: Page): Watch {
  const w: Watch = { problems: [] }
  page.on('console', (msg: ConsoleMessage) => {
    if (msg.type() !== 'error') return
    const text = msg.text()
    if (EXPECTED_STATUS.test(text)) return
    w.problems.push(`${page.url()}: console error: ${text}`)
  })
  page.on('pageerror', error => w.problems.push(`${page.url()}: uncaught: ${error.message}`))
  return w
}

beforeAll(async () => {
  const competition = await testDb()('competitions').where({ slug: 'kestrel-moor-2027' }).first('id')
  competitionId = competition.id
  const entry = await testDb()('entries')
    .join('users', 'users.id', 'entries.entrant_user_id')
    .where({ 'users.email': 'entrant@gridmark.example', 'entries.competition_id': competitionId })
    .first('entries.id')
  entrantEntryId = entry.id
  const organiser = new ApiClient(baseUrl)
  const signIn = await organiser.post('/api/auth/login', { email: 'organiser@gridmark.example', password: DEMO_PASSWORD })
  expect(signIn.status).toBe(200)
  const sheet = await organiser.get(`/api/competitions/${competitionId}/tags/sheet?entryIds=${entrantEntryId}`)
  expect(sheet.status, JSON.stringify(sheet.body)).toBe(200)
  tagUrl = sheet.body.tags[0].url
  // The camera shows this entry's tag: scanning on the grid opens its grid check.
  browser = await launchBrowser({ args: await fakeCameraArgs(tagUrl) })
  await browser.context.addInitScript(REPORT_VIOLATIONS)
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

/** Opens each page, lets it settle (client fetches, sockets), and returns the problems seen. */
async function visit(page: Page, w: Watch, paths: string[], settle?: (page: Page, path: string) => Promise<void>) {
  for (const path of paths) {
    await gotoApp(page, baseUrl, path)
    await page.waitForLoadState('networkidle').catch(() => {})
    await settle?.(page, path)
  }
  return w.problems
}

async function asRole(email: string | null, paths: string[], settle?: (page: Page, path: string) => Promise<void>) {
  await browser.context.clearCookies()
  const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
  const w = watch(page)
  try {
    if (email) await signInThroughForm(page, baseUrl, email, DEMO_PASSWORD)
    await visit(page, w, paths, settle)
    expect(w.problems).toEqual([])
  }
  finally {
    await page.close()
  }
}

const c = () => `/competitions/${competitionId}`

describe('the CSP on every page of the demo walk', () => {
  it('signed out: home, sign-in, sign-up, the privacy notices, a tag page, an invitation page, a missing page', async () => {
    await asRole(null, ['/', '/sign-in', '/sign-up', '/password/forgot', '/password/reset', '/verify-email', '/privacy', `${c()}/privacy`, new URL(tagUrl).pathname, '/invitations/not-a-real-token', '/no-such-page'])
  }, 120_000)

  it('organiser: overview, set-up, people, payments, firmware, documents with a PDF in its frame, entries, tags, checks', async () => {
    await asRole('organiser@gridmark.example', [
      '/', c(), `${c()}/setup`, `${c()}/people`, `${c()}/payments`, `${c()}/firmware`, `${c()}/documents`,
      `${c()}/entries`, `${c()}/tags`, `${c()}/tags/print`, `${c()}/checks`, `${c()}/document-views`, '/competitions/00000000-0000-0000-0000-000000000000',
    ], async (page, path) => {
      // The demo's oldest pending document is a PDF: the review shows it in a frame, sandboxed.
      if (path !== `${c()}/documents`) return
      await page.locator('[data-testid="document-view"] iframe').waitFor()
      await expect.poll(() => page.frames().some(f => /\/documents\/[^/]+\/file$/.test(new URL(f.url() || 'about:blank', baseUrl).pathname))).toBe(true)
    })
  }, 180_000)

  it('scrutineer: the launch grid scans the tag with the camera and opens the grid check', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    const w = watch(page)
    try {
      await signInThroughForm(page, baseUrl, 'scrutineer@gridmark.example', DEMO_PASSWORD)
      await visit(page, w, ['/', c(), `${c()}/documents`, `${c()}/firmware`])
      await gotoApp(page, baseUrl, `${c()}/grid`)
      // The camera (and the scanner's library) starts only when asked.
      await page.getByTestId('open-camera').click()
      await page.waitForURL(url => url.pathname === `${c()}/grid/${entrantEntryId}`, { timeout: 60_000 })
      await page.locator('[data-testid="grid-check"][data-ready="true"]').waitFor()
      expect(new URL(page.url()).searchParams.get('foundBy')).toBe('scan')
      // The offline worker registered under the policy.
      await expect.poll(() => page.evaluate(() => navigator.serviceWorker.getRegistration().then(r => Boolean(r?.active))), { timeout: 15_000 }).toBe(true)
      expect(w.problems).toEqual([])
    }
    finally {
      await page.close()
    }
  }, 120_000)

  it('director: the board live on its socket, the desk, days, audit', async () => {
    await asRole('director@gridmark.example', ['/', c(), `${c()}/board`, `${c()}/board/${entrantEntryId}`, `${c()}/days`, `${c()}/audit`], async (page, path) => {
      if (path === `${c()}/board`) await page.locator('[data-testid="board"][data-connection="live"]').waitFor({ timeout: 20_000 })
    })
  }, 120_000)

  it('entrant: home, my entries, the dossier, the payment page, a new entry', async () => {
    await asRole('entrant@gridmark.example', ['/', c(), '/entries', '/account', `${c()}/entries/${entrantEntryId}`, `${c()}/entries/${entrantEntryId}/payment`])
    await asRole('entrant10@gridmark.example', ['/entries', `${c()}/entries/new`])
  }, 120_000)

  it('site administrator: home and a new competition', async () => {
    await asRole('admin@gridmark.example', ['/', '/competitions/new'])
  }, 60_000)

  it('the watch itself hears a violation: an image from another site is refused and reported', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    const w = watch(page)
    try {
      const loaded = await page.evaluate(() => new Promise<boolean>((resolve) => {
        const img = document.createElement('img')
        img.onload = () => resolve(true)
        img.onerror = () => resolve(false)
        img.src = 'http://127.0.0.2:9/pixel.png'
        document.body.appendChild(img)
      }))
      expect(loaded).toBe(false)
      await expect.poll(() => w.problems.join('\n')).toMatch(/CSP violation: img-src blocked http:\/\/127\.0\.0\.2:9/)
    }
    finally {
      await page.close()
    }
  })
})
