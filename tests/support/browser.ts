// Playwright (playwright-core) driving Debian's Chromium, exactly as STACK.md records: a
// persistent context in a fresh temporary profile, never a downloaded browser.
import type { CuttableLink } from './cuttable-link'
import { mkdir, mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { expect } from 'vitest'
import { GOOD_PASSWORD } from './api'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
  }
}

export const CHROMIUM_PATH = '/usr/bin/chromium'
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
]

export const VIEWPORTS = {
  phone: { width: 390, height: 844 },
  narrowPhone: { width: 360, height: 740 },
  desk: { width: 1366, height: 900 },
  wall: { width: 1920, height: 1080 },
} as const
export type ViewportName = keyof typeof VIEWPORTS

export interface Browser {
  context: BrowserContext
  close: () => Promise<void>
}

/**
 * A documentation-range address (TEST-NET-2) for this browser. The test server trusts the proxy
 * header, so each browser gets its own sign-in budget instead of sharing 127.0.0.1's with every
 * other test of the run.
 */
function browserClientAddress(): string {
  return `198.51.100.${1 + Math.floor(Math.random() * 254)}`
}

export async function launchBrowser(options: { args?: string[], clientAddress?: string } = {}): Promise<Browser> {
  // --user-data-dir in args is refused; the profile folder is the first argument instead.
  const profile = await mkdtemp(join(tmpdir(), 'gridmark-chromium-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM_PATH,
    args: [...CHROMIUM_ARGS, ...(options.args ?? [])],
    viewport: VIEWPORTS.phone,
    locale: 'en-GB',
    timezoneId: 'Europe/Berlin',
    extraHTTPHeaders: { 'x-forwarded-for': options.clientAddress ?? browserClientAddress() },
  })
  context.setDefaultTimeout(15_000)
  return {
    context,
    close: async () => {
      await context.close().catch(() => {})
      await rm(profile, { recursive: true, force: true })
    },
  }
}

/** Opens `path` of the app in a new tab at a named viewport and waits for hydration. */
export async function openPage(context: BrowserContext, baseUrl: string, path = '/', viewport: ViewportName = 'phone'): Promise<Page> {
  const page = await context.newPage()
  await page.setViewportSize(VIEWPORTS[viewport])
  await gotoApp(page, baseUrl, path)
  return page
}

export async function gotoApp(page: Page, baseUrl: string, path: string): Promise<void> {
  await page.goto(new URL(path, baseUrl).toString(), { waitUntil: 'load' })
  await waitForHydration(page)
}

/** Waits until Nuxt has taken over the server's HTML (clicks before that would be lost). */
export async function waitForHydration(page: Page): Promise<void> {
  await page.waitForFunction(() => {
    const root = document.getElementById('__nuxt') as (HTMLElement & { __vue_app__?: { $nuxt?: { isHydrating?: boolean } } }) | null
    const nuxtApp = root?.__vue_app__?.$nuxt
    return nuxtApp !== undefined && nuxtApp.isHydrating === false
  })
}

export function artifactsDir(): string {
  return resolve(process.env.GRIDMARK_ARTIFACTS ?? 'artifacts')
}

/** Saves a full-page PNG to <artifacts>/screenshots/<name>.png and returns its path. */
export async function screenshot(page: Page, name: string): Promise<string> {
  const dir = join(artifactsDir(), 'screenshots')
  await mkdir(dir, { recursive: true })
  const file = join(dir, `${name.replace(/[^\w.-]+/g, '-')}.png`)
  // Fonts are bundled, but wait for them so screenshots never show the fallback face.
  await page.evaluate(() => document.fonts.ready.then(() => undefined))
  await page.screenshot({ path: file, fullPage: true })
  return file
}

/** Signs in through the form, as a person would, and waits for the page it lands on. */
export async function signInThroughForm(page: Page, baseUrl: string, email: string, password: string, next?: string): Promise<void> {
  await gotoApp(page, baseUrl, next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in')
  await page.getByLabel('E-mail address').fill(email)
  await page.getByLabel('Password').fill(password)
  await Promise.all([
    page.waitForURL(url => !url.pathname.startsWith('/sign-in')),
    page.getByRole('button', { name: 'Sign in' }).click(),
  ])
}

/**
 * A scrutineer's phone on a glider's grid check screen: signed in on the launch grid (which
 * keeps the day's pack on the phone), then the glider's check, ready to answer.
 */
export async function openGridCheck(browser: Browser, baseUrl: string, email: string, competitionId: string, entryId: string): Promise<Page> {
  const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
  const gridPath = `/competitions/${competitionId}/grid`
  await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD, gridPath)
  await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
  await page.goto(`${baseUrl}${gridPath}/${entryId}`)
  await page.locator('[data-testid="grid-check"][data-ready="true"]').waitFor()
  return page
}

/**
 * A scrutineer's phone on the launch grid, online: signed in, the day's pack kept, the offline
 * worker in control and the grid page in its cache. Returns the page and the pack's day.
 */
/**
 * No signal: the link to the server cut (nothing the phone sends arrives) and the browser told
 * it is offline (navigator.onLine, the offline event).
 */
export async function loseSignal(browser: Browser, link: CuttableLink): Promise<void> {
  link.cut()
  await browser.context.setOffline(true)
}

/** The signal back: the link restored and the browser told it is online again. */
export async function regainSignal(browser: Browser, link: CuttableLink): Promise<void> {
  link.restore()
  await browser.context.setOffline(false)
}

export async function openLaunchGridForOffline(browser: Browser, baseUrl: string, email: string, competitionId: string): Promise<{ page: Page, day: string }> {
  const gridPath = `/competitions/${competitionId}/grid`
  const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
  await signInThroughForm(page, baseUrl, email, GOOD_PASSWORD, gridPath)
  await page.locator('[data-testid="grid-scanner"][data-ready="true"]').waitFor()
  await page.waitForFunction(() => navigator.serviceWorker?.controller != null, undefined, { timeout: 30_000 })
  const day = await page.getByTestId('grid-scanner').getAttribute('data-pack-day') ?? ''
  // Polled from here: waitForFunction would take the predicate's promise itself for a yes.
  await expect.poll(() => page.evaluate(async () => (await (await caches.open('gridmark-grid-pages')).match(location.href)) !== undefined)).toBe(true)
  return { page, day }
}
