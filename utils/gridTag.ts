import { TAG_TOKEN_PATTERN, normaliseShortCode } from '#shared/utils/short-code'
import type { GridPack, GridPackEntry } from '#shared/types/api-grid'

// Reading what the camera decoded or the scrutineer typed, and finding the entry in the day's
// pack without the network (the pack carries each tag's short code and the SHA-256 of its token).

/**
 * The tag token in a decoded text: a URL whose path is /t/<token> (on any origin, so a tag
 * printed behind another address still scans), or a bare token. Null for anything else.
 */
export function tagTokenOf(text: string): string | null {
  const t = text.trim()
  if (TAG_TOKEN_PATTERN.test(t)) return t
  let url: URL
  try {
    url = new URL(t)
  }
  catch {
    return null
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') return null
  const m = /^\/t\/([\w-]{43})\/?$/.exec(url.pathname)
  return m ? m[1]! : null
}

/** SHA-256 of the token as lowercase hex, as the pack's tag.tokenHash holds it. */
export async function tokenHash(token: string): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', new TextEncoder().encode(token))
  return [...new Uint8Array(digest)].map(b => b.toString(16).padStart(2, '0')).join('')
}

export async function packEntryByToken(pack: GridPack, token: string): Promise<GridPackEntry | undefined> {
  const hash = await tokenHash(token)
  return pack.entries.find(e => e.tag?.tokenHash === hash)
}

export function packEntryByCode(pack: GridPack, code: string): GridPackEntry | undefined {
  const c = normaliseShortCode(code)
  return pack.entries.find(e => e.tag?.shortCode === c)
}

/** XXXX-XXXX as printed on the tag. */
export function formatShortCode(code: string): string {
  const c = normaliseShortCode(code)
  return c.length > 4 ? `${c.slice(0, 4)}-${c.slice(4)}` : c
}
