// The weight and the scores of five pages, for `npm run bench`: a throwaway PostgreSQL cluster
// with the demo seed and its day played (scripts/lib/demo-day.ts), the built server, and
// Debian's Chromium.
//
//   weight      Each page opened cold (a new browser context) with the flags of the browser
//               tests: every script it loads until the network is idle, gzipped and summed
//               (tests/support/js-weight.ts). Budgets: grid and grid check 150 KB, board
//               120 KB, landing 100 KB.
//   lighthouse  Lighthouse (mobile, its default simulated throttling) against a Chromium
//               started here with a debugging port. Before each run the browser's cookies are
//               replaced by the page's own (the session cookie of the one who opens it, or
//               none): an extra Cookie header would be overridden by any cookie a page set
//               earlier (the sunlight preference), and the signed-in pages would be scored as
//               the sign-in page they redirect to. Two runs per page, the better score of each kept.
//               Targets: performance ≥ 90, accessibility 100.
//
// Pages: landing `/` (signed out), grid and grid check (the demo's scrutineer), board (its
// director), entry (its first entrant's own entry page). Everything started is removed in every
// case, Ctrl-C included.
import { spawn, type ChildProcess } from 'node:child_process'
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import knex from 'knex'
import lighthouse from 'lighthouse'
import { chromium } from 'playwright-core'
import { createKnexConfig } from '../../knexfile'
import { DEMO_COMPETITION, DEMO_PASSWORD } from '../../seeds/demo-data'
import { newFilesKey } from '../../server/domain/files/file-crypt'
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../../tests/support/browser'
import { JS_BUDGET_KB, measurePageJs } from '../../tests/support/js-weight'
import { freePort, startServer } from '../../tests/support/server'
import { ensureBrowser } from './browser'
import { startBenchDatabase, tearDownBench, type BenchParts } from './bench-services'
import { ensureBuild } from './build'
import { interrupts, ScriptError, step } from './common'
import { seed } from './db'
import { playDemoDay } from './demo-day'
import { randomSessionPassword } from './secrets'

const PAGES_DATABASE = 'gridmark_bench_pages'
const LIGHTHOUSE_RUNS = 2
/** Where the better run of each page's Lighthouse report is kept. */
const LIGHTHOUSE_REPORTS = join('artifacts', 'lighthouse')

export const PAGE_TARGETS = { lighthousePerf: 90, lighthouseA11y: 100 } as const

type PageName = 'landing' | 'grid' | 'grid_check' | 'board' | 'entry'
interface BenchPage {
  name: PageName
  path: string
  /** The session cookie (`name=value`) of the one who opens it; empty when signed out. */
  cookie: string
}

export interface PagesBenchResult {
  lines: string[]
  notes: string[]
}

const signals = interrupts('stopping the page bench')
const checkInterrupted = signals.check
const timed = signals.timed

async function signIn(baseUrl: string, email: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'accept': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  const cookie = res.headers.getSetCookie().find(c => c.startsWith('gridmark-session='))
  if (res.status !== 200 || !cookie) throw new ScriptError(`Signing in ${email} answered ${res.status}: ${await res.text()}`)
  return cookie.split(';')[0]!
}

/** The demo's competition and its first entrant's accepted entry (read from the database). */
async function demoIds(url: string): Promise<{ competitionId: string, entryId: string }> {
  const db = knex(createKnexConfig(url))
  try {
    const competition = await db('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
    const entry = await db('entries')
      .join('users', 'users.id', 'entries.entrant_user_id')
      .where({ 'entries.competition_id': competition?.id, 'entries.status': 'accepted', 'users.email': 'entrant@gridmark.example' })
      .first('entries.id')
    if (!competition || !entry) throw new ScriptError('The demo seed has no competition or no accepted entry of its first entrant.')
    return { competitionId: competition.id, entryId: entry.id }
  }
  finally {
    await db.destroy()
  }
}

async function weighPages(baseUrl: string, pages: BenchPage[]): Promise<Map<PageName, number>> {
  const weights = new Map<PageName, number>()
  const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS })
  try {
    for (const p of pages) {
      checkInterrupted()
      const context = await browser.newContext({ viewport: { width: 390, height: 844 }, locale: 'en-GB' })
      try {
        if (p.cookie) {
          const [name, ...value] = p.cookie.split('=')
          await context.addCookies([{ name: name!, value: value.join('='), url: baseUrl }])
        }
        const page = await context.newPage()
        const weight = await measurePageJs(page, baseUrl + p.path)
        weights.set(p.name, weight.gzKb)
        const top = weight.scripts.slice(0, 3).map(s => `${new URL(s.url).pathname.split('/').pop()} ${(s.gzBytes / 1024).toFixed(1)}`).join(', ')
        console.log(`  ✓ ${p.name}: ${weight.scripts.length} scripts, ${weight.gzKb.toFixed(1)} KB gzipped (${weight.rawKb.toFixed(1)} KB raw); largest ${top}`)
      }
      finally {
        await context.close()
      }
    }
  }
  finally {
    await browser.close()
  }
  return weights
}

/** Starts Debian's Chromium with a debugging port for Lighthouse; resolves once it listens. */
async function debuggableChromium(): Promise<{ port: number, stop: () => Promise<void> }> {
  const port = await freePort()
  const profile = mkdtempSync(join(tmpdir(), 'gridmark-lighthouse-'))
  // In a process group of its own, so that stopping it stops its helper processes too.
  const child: ChildProcess = spawn(CHROMIUM_PATH, [...CHROMIUM_ARGS, `--remote-debugging-port=${port}`, `--user-data-dir=${profile}`, 'about:blank'], { stdio: 'ignore', detached: true })
  const signalGroup = (signal: NodeJS.Signals) => {
    try { process.kill(-child.pid!, signal) }
    catch { /* the group has ended */ }
  }
  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      const exited = new Promise(resolve => child.once('exit', resolve))
      signalGroup('SIGTERM')
      await Promise.race([exited, new Promise(resolve => setTimeout(resolve, 5000))])
    }
    signalGroup('SIGKILL')
    // A helper may still be writing into the profile for a moment: a profile left behind in the
    // temporary folder is not worth failing the figures for.
    try {
      rmSync(profile, { recursive: true, force: true, maxRetries: 10, retryDelay: 200 })
    }
    catch (error) {
      console.warn(`  ! could not remove Chromium's profile ${profile}: ${(error as Error).message}`)
    }
  }
  const deadline = Date.now() + 30_000
  for (;;) {
    try {
      const res = await fetch(`http://127.0.0.1:${port}/json/version`)
      if (res.ok) return { port, stop }
    }
    catch { /* not listening yet */ }
    if (child.exitCode !== null || Date.now() > deadline) {
      await stop()
      throw new ScriptError('Chromium with a debugging port did not start in 30 s.')
    }
    await new Promise(resolve => setTimeout(resolve, 200))
  }
}

/** Replaces every cookie of the browser Lighthouse drives by `cookie` (`name=value`), or by none. */
async function setBrowserCookie(port: number, baseUrl: string, cookie: string): Promise<void> {
  const browser = await chromium.connectOverCDP(`http://127.0.0.1:${port}`)
  try {
    const context = browser.contexts()[0]
    if (!context) throw new ScriptError('The Chromium driven by Lighthouse has no browser context.')
    await context.clearCookies()
    if (cookie) {
      const [name, ...value] = cookie.split('=')
      await context.addCookies([{ name: name!, value: value.join('='), url: baseUrl }])
    }
  }
  finally {
    // Only this connection is closed; the browser started by debuggableChromium goes on.
    await browser.close()
  }
}

async function scorePages(baseUrl: string, pages: BenchPage[]): Promise<Map<PageName, { perf: number, a11y: number }>> {
  const scores = new Map<PageName, { perf: number, a11y: number }>()
  const chrome = await debuggableChromium()
  try {
    for (const p of pages) {
      const runs: string[] = []
      let best = { perf: 0, a11y: 0 }
      for (let run = 0; run < LIGHTHOUSE_RUNS; run++) {
        checkInterrupted()
        // Lighthouse now and then fails to record a load's trace (NO_NAVSTART) and asks to be
        // run again: a run is tried up to three times before the bench gives up.
        let lhr: NonNullable<Awaited<ReturnType<typeof lighthouse>>>['lhr'] | undefined
        for (let attempt = 1; ; attempt++) {
          await setBrowserCookie(chrome.port, baseUrl, p.cookie)
          const result = await lighthouse(baseUrl + p.path, {
            port: chrome.port,
            logLevel: 'error',
            output: 'json',
            onlyCategories: ['performance', 'accessibility'],
          })
          lhr = result?.lhr
          if (lhr && !lhr.runtimeError) break
          if (attempt === 3) throw new ScriptError(`Lighthouse could not score ${p.name}: ${lhr?.runtimeError?.message ?? 'no result'}`)
          console.warn(`  ! Lighthouse could not score ${p.name} (${lhr?.runtimeError?.code ?? 'no result'}); running it again`)
        }
        if (new URL(lhr.finalDisplayedUrl).pathname !== new URL(baseUrl + p.path).pathname) {
          throw new ScriptError(`Lighthouse was sent from ${p.name} (${p.path}) to ${lhr.finalDisplayedUrl}; it would score the wrong page.`)
        }
        const perf = Math.round((lhr.categories.performance?.score ?? 0) * 100)
        const a11y = Math.round((lhr.categories.accessibility?.score ?? 0) * 100)
        const lcp = lhr.audits['largest-contentful-paint']?.displayValue ?? '?'
        const tbt = lhr.audits['total-blocking-time']?.displayValue ?? '?'
        runs.push(`perf ${perf} (LCP ${lcp}, TBT ${tbt}), a11y ${a11y}`)
        // The better run's full report, for finding what costs the score (open it in the viewer
        // Lighthouse itself offers, or read its audits).
        if (perf >= best.perf) {
          mkdirSync(LIGHTHOUSE_REPORTS, { recursive: true })
          writeFileSync(join(LIGHTHOUSE_REPORTS, `${p.name}.json`), JSON.stringify(lhr))
        }
        best = { perf: Math.max(best.perf, perf), a11y: Math.max(best.a11y, a11y) }
      }
      scores.set(p.name, best)
      console.log(`  ✓ ${p.name}: ${runs.join('; ')}`)
    }
  }
  finally {
    await chrome.stop()
  }
  return scores
}

export async function benchPages(): Promise<PagesBenchResult> {
  signals.listen()
  const parts: BenchParts = {}
  try {
    step('Pages: the demo on a throwaway database and the built server, weighed and scored in Chromium')
    const url = await startBenchDatabase(parts, 'gridmark-bench-pages-', PAGES_DATABASE, timed)
    const sessionSecret = randomSessionPassword()
    const filesKey = newFilesKey()
    await timed('demo data', () => seed(url, false, sessionSecret, filesKey))
    await timed('Chromium', ensureBrowser)
    await timed('build', ensureBuild)

    const server = parts.server = await timed('bench server started', () => {
      process.env.DATABASE_URL = url
      return startServer({ NUXT_SESSION_PASSWORD: sessionSecret, NUXT_FILES_KEY: filesKey, NUXT_UPLOADS_DIR: join(parts.tempDir!, 'uploads') })
    })
    const baseUrl = server.url
    await timed('the demo day played', () => playDemoDay(baseUrl, url))
    const { competitionId, entryId } = await demoIds(url)
    const [scrutineer, director, entrant] = await timed('3 sign-ins', () => Promise.all(
      ['scrutineer@gridmark.example', 'director@gridmark.example', 'entrant@gridmark.example'].map(e => signIn(baseUrl, e)),
    ))
    const c = `/competitions/${competitionId}`
    const pages: BenchPage[] = [
      { name: 'landing', path: '/', cookie: '' },
      { name: 'grid', path: `${c}/grid`, cookie: scrutineer! },
      { name: 'grid_check', path: `${c}/grid/${entryId}`, cookie: scrutineer! },
      { name: 'board', path: `${c}/board`, cookie: director! },
      { name: 'entry', path: `${c}/entries/${entryId}`, cookie: entrant! },
    ]

    step('Weighing the JavaScript of each page (cold, until the network is idle)')
    const weights = await weighPages(baseUrl, pages)
    step(`Lighthouse, mobile: ${LIGHTHOUSE_RUNS} runs per page, the better kept`)
    const scores = await scorePages(baseUrl, pages)

    const lines: string[] = []
    const notes: string[] = []
    for (const p of pages) {
      const kb = weights.get(p.name)!
      lines.push(`js_gz_kb_${p.name}: ${kb.toFixed(1)} KB`)
      const budget = (JS_BUDGET_KB as Record<string, number>)[p.name]
      if (budget !== undefined && kb > budget) notes.push(`  note: js_gz_kb_${p.name} is over its budget of ${budget} KB`)
    }
    for (const p of pages) {
      const s = scores.get(p.name)!
      lines.push(`lighthouse_perf_${p.name}: ${s.perf}`, `lighthouse_a11y_${p.name}: ${s.a11y}`)
      if (s.perf < PAGE_TARGETS.lighthousePerf) notes.push(`  note: lighthouse_perf_${p.name} is under its target of ${PAGE_TARGETS.lighthousePerf}`)
      if (s.a11y < PAGE_TARGETS.lighthouseA11y) notes.push(`  note: lighthouse_a11y_${p.name} is under its target of ${PAGE_TARGETS.lighthouseA11y}`)
    }
    return { lines, notes }
  }
  finally {
    await tearDownBench(parts)
    signals.release()
  }
}

/** Whether the page bench was stopped by a signal. */
export function pagesBenchInterrupted(): NodeJS.Signals | undefined {
  return signals.signal
}
