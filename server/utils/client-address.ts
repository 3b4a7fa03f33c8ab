import type { H3Event } from 'h3'

/**
 * The client's address. X-Forwarded-For is believed only when the operator says a trusted
 * reverse proxy sets it (NUXT_TRUST_PROXY=true); otherwise anyone could forge it.
 */
export function clientAddress(event: H3Event): string {
  const trustProxy = String(useRuntimeConfig(event).trustProxy) === 'true'
  return getRequestIP(event, { xForwardedFor: trustProxy }) ?? 'unknown'
}
