// Where links that leave the app point — e-mails, glider tags, the payment service's way back:
// the configured public address (NUXT_SITE_URL), else the address the request came in on,
// else this server's own.
import { getRequestURL, type H3Event } from 'h3'

export function siteUrl(event?: H3Event): string {
  const configured = useRuntimeConfig().siteUrl
  if (configured) return String(configured).replace(/\/+$/, '')
  if (event) return getRequestURL(event).origin
  const host = process.env.NITRO_HOST || process.env.HOST || '127.0.0.1'
  const port = process.env.NITRO_PORT || process.env.PORT || '3000'
  return `http://${host === '0.0.0.0' ? '127.0.0.1' : host}:${port}`
}
