// Who may change anything: a request from the app's own pages, or from no browser at all.
// A browser names the page a request comes from on every cross-site write (Origin, or at
// least Sec-Fetch-Site), so a write naming another site is refused; a client that names
// none (a script, curl, the tests' fetch) is not a browser carrying a victim's cookie. The
// page's own origin is the address the request came in on (behind trusted proxies, the
// scheme and host they forwarded) or NUXT_SITE_URL. Used by server/middleware/same-origin.ts
// for /api and by the board's socket handshake (server/plugins/socket-io.ts).
import type { IncomingHttpHeaders } from 'node:http'
import { trustedHops } from './client-address'

/** What the origin check needs of a request: its headers and whether it came over TLS itself. */
export interface OriginRequest {
  headers: IncomingHttpHeaders
  encrypted: boolean
}

function header(headers: IncomingHttpHeaders, name: string): string | undefined {
  const value = headers[name]
  return (Array.isArray(value) ? value[0] : value)?.trim() || undefined
}

/** The first value of a forwarded header, as the outermost trusted proxy wrote it. */
function forwarded(headers: IncomingHttpHeaders, name: string): string | undefined {
  return header(headers, name)?.split(',')[0]?.trim() || undefined
}

function behindTrustedProxy(): boolean {
  const config = useRuntimeConfig()
  return trustedHops(config.trustedProxyHops, config.trustProxy) > 0
}

/**
 * Whether the request reached the site over https: its own TLS connection, or, behind
 * trusted proxies only, X-Forwarded-Proto saying so. A forged header from a client with no
 * trusted proxy in front is never believed.
 */
export function servedOverHttps(request: OriginRequest): boolean {
  if (request.encrypted) return true
  return behindTrustedProxy() && forwarded(request.headers, 'x-forwarded-proto')?.toLowerCase() === 'https'
}

/** The origins the app's own pages have: where this request came in, and NUXT_SITE_URL. */
export function ownOrigins(request: OriginRequest): string[] {
  const origins: string[] = []
  const trusted = behindTrustedProxy()
  const host = (trusted && forwarded(request.headers, 'x-forwarded-host')) || header(request.headers, 'host')
  if (host) origins.push(normalOrigin(`${servedOverHttps(request) ? 'https' : 'http'}://${host}`))
  const site = String(useRuntimeConfig().siteUrl ?? '')
  if (site) origins.push(normalOrigin(site))
  // A malformed host or NUXT_SITE_URL names no origin ("null"), and "null" is never ours.
  return origins.filter(o => o !== 'null')
}

/** The page a browser says the request comes from is another site's. */
export function fromAnotherSite(request: OriginRequest): boolean {
  const origin = header(request.headers, 'origin')
  if (origin) return !ownOrigins(request).includes(normalOrigin(origin))
  const site = header(request.headers, 'sec-fetch-site')?.toLowerCase()
  // same-origin, or none (typed in the address bar, a bookmark); same-site is a neighbour.
  if (site) return site !== 'same-origin' && site !== 'none'
  return false
}

/** An origin as URL.origin spells it (default ports dropped, lower case); "null" when it names none. */
function normalOrigin(origin: string): string {
  try {
    const url = new URL(origin)
    return url.origin === 'null' ? 'null' : url.origin.toLowerCase()
  }
  catch {
    return 'null'
  }
}

/**
 * The body types a write may carry: JSON, a multipart form (uploads), a CSV file. 'form' for
 * what a plain HTML form (or a script without asking first) can send from any site —
 * URL-encoded, text/plain, a body with no type; 'other' for any other type. A write with no
 * body at all (sign-out, a button's action) needs no type.
 */
export function bodyTypeOf(contentType: string | undefined, hasBody: boolean): 'accepted' | 'form' | 'other' {
  const type = (contentType ?? '').split(';')[0]!.trim().toLowerCase()
  if (!type) return hasBody ? 'form' : 'accepted'
  if (type === 'application/json' || type === 'multipart/form-data' || type === 'text/csv') return 'accepted'
  return type === 'application/x-www-form-urlencoded' || type === 'text/plain' ? 'form' : 'other'
}
