// The JavaScript a page loads before anyone touches it: every script response from the start
// of the navigation until the network is idle, each gzipped here (node:zlib) and summed. The
// page's own inline scripts travel in its HTML and are not counted. Used by `npm run bench`
// (scripts/lib/bench-pages.ts) and by tests/browser/js-budget.test.ts.
import { gzipSync } from 'node:zlib'
import type { Page, Response } from 'playwright-core'

/** Gzipped KB allowed before first interaction (issue "On the field", item 1). */
export const JS_BUDGET_KB = { landing: 100, grid: 150, grid_check: 150, board: 120 } as const

export interface JsWeight {
  /** Sum of the gzipped scripts, in KB (1,024 bytes). */
  gzKb: number
  /** Sum of the scripts as served before gzip, in KB. */
  rawKb: number
  scripts: { url: string, gzBytes: number }[]
}

/**
 * Opens `url` in `page` (a fresh context: nothing cached) and weighs the scripts it loads
 * until the network has been idle for half a second.
 */
export async function measurePageJs(page: Page, url: string, timeoutMs = 60_000): Promise<JsWeight> {
  const pending: Promise<{ url: string, raw: number, gzBytes: number } | null>[] = []
  const seen = new Set<string>()
  const onResponse = (response: Response) => {
    const request = response.request()
    if (request.resourceType() !== 'script' || seen.has(request.url())) return
    seen.add(request.url())
    pending.push(response.body()
      .then(body => ({ url: request.url(), raw: body.length, gzBytes: gzipSync(body).length }))
      .catch(() => null))
  }
  page.on('response', onResponse)
  try {
    await page.goto(url, { waitUntil: 'networkidle', timeout: timeoutMs })
  }
  finally {
    page.off('response', onResponse)
  }
  const scripts = (await Promise.all(pending)).filter(s => s !== null)
  const kb = (bytes: number) => Math.round((bytes / 1024) * 10) / 10
  return {
    gzKb: kb(scripts.reduce((n, s) => n + s.gzBytes, 0)),
    rawKb: kb(scripts.reduce((n, s) => n + s.raw, 0)),
    scripts: scripts.map(s => ({ url: s.url, gzBytes: s.gzBytes })).sort((a, b) => b.gzBytes - a.gzBytes),
  }
}
