import type { H3Event } from 'h3'

/**
 * The client's address. Behind N trusted reverse proxies (NUXT_TRUSTED_PROXY_HOPS=N), each
 * proxy appends the address it received the request from to X-Forwarded-For, so the client is
 * the address N hops from our end of the chain (the socket's peer counts as the first hop).
 * Anything further left was written by the client itself and could be forged: it is never
 * believed. With no trusted hop (the default) the header is ignored and the socket's peer is
 * the client. NUXT_TRUST_PROXY=true, the older switch, means one hop.
 */
export function clientAddress(event: H3Event): string {
  const config = useRuntimeConfig(event)
  const socket = event.node.req.socket?.remoteAddress ?? 'unknown'
  const hops = trustedHops(config.trustedProxyHops, config.trustProxy)
  if (hops === 0) return socket
  return addressBehindProxies(getRequestHeader(event, 'x-forwarded-for'), socket, hops)
}

export function trustedHops(hops: unknown, trustProxy: unknown): number {
  const n = Number(hops)
  if (Number.isInteger(n) && n > 0) return n
  return String(trustProxy) === 'true' ? 1 : 0
}

/**
 * The chain is the forwarded addresses, left to right, then the socket's peer. Walking from
 * the right past `hops` trusted proxies gives the client; a shorter chain (a request that came
 * past fewer proxies than configured) gives its leftmost address.
 */
export function addressBehindProxies(forwardedFor: string | undefined, socket: string, hops: number): string {
  const chain = [...(forwardedFor ?? '').split(',').map(a => a.trim()).filter(Boolean), socket]
  return chain[Math.max(0, chain.length - 1 - hops)]!
}
