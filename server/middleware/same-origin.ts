// Every write to /api (POST, PUT, PATCH, DELETE) comes from the app's own pages: a browser
// naming another site (Origin, else Sec-Fetch-Site) is refused with 403, and so is a body a
// plain HTML form could send (URL-encoded, text/plain); a body neither JSON, multipart nor CSV
// is refused with 415 — one check no new route can forget.
// The payment service's webhook is the exception: it comes from elsewhere and is signed.
// Also the headers that depend on the request: HSTS only when it came over https (never on a
// plain-http airfield LAN), and a CSP for API answers (pages get theirs from nuxt-security).
import { defineEventHandler, getRequestHeader, setResponseHeader } from 'h3'
import { MESSAGES } from '#shared/constants/messages'
import { httpError } from '#server/utils/errors'
import { bodyTypeOf, fromAnotherSite, servedOverHttps, type OriginRequest } from '#server/utils/same-origin'

const WRITES = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
const SIGNED_ELSEWHERE = new Set(['/api/payments/webhook'])

/** Half a year, with subdomains: what the site asks browsers to remember of https. */
export const HSTS = 'max-age=15552000; includeSubDomains'

/** An API answer is data, never a page: it runs nothing and sits in no frame. A route may set its own (a file's sandbox). */
export const API_CSP = 'default-src \'none\'; frame-ancestors \'none\''

export default defineEventHandler((event) => {
  const request: OriginRequest = {
    headers: event.node.req.headers,
    encrypted: Boolean((event.node.req.socket as { encrypted?: boolean } | undefined)?.encrypted),
  }
  if (servedOverHttps(request)) setResponseHeader(event, 'strict-transport-security', HSTS)

  const path = event.path.split('?')[0]!
  if (!path.startsWith('/api/') && path !== '/api') return
  setResponseHeader(event, 'content-security-policy', API_CSP)
  if (!WRITES.has(event.method) || SIGNED_ELSEWHERE.has(path)) return

  if (fromAnotherSite(request)) throw httpError(403, MESSAGES.crossSiteRefused)
  const headers = event.node.req.headers
  const hasBody = Number.parseInt(headers['content-length'] ?? '', 10) > 0 || headers['transfer-encoding'] !== undefined
  const type = bodyTypeOf(getRequestHeader(event, 'content-type'), hasBody)
  if (type === 'form') throw httpError(403, MESSAGES.bodyTypeRefused)
  if (type === 'other') throw httpError(415, MESSAGES.bodyTypeUnsupported)
})
