// `?next=` comes from the address bar, so only same-site paths are followed: never another
// origin ("//host", "/\host") and never back to the sign-in pages themselves.
export function safeNextPath(value: unknown, fallback = '/'): string {
  const raw = Array.isArray(value) ? value[0] : value
  if (typeof raw !== 'string' || raw.length > 2000) return fallback
  if (!raw.startsWith('/') || raw.startsWith('//') || raw.startsWith('/\\')) return fallback
  if (/^\/sign-(?:in|up)(?:[/?#]|$)/.test(raw)) return fallback
  return raw
}
