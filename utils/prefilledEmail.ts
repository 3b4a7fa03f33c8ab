// `?email=` fills in the sign-in and sign-up forms (an invitation's page sends its address
// along). It comes from the address bar: a plain string of sensible length, else nothing.
export function prefilledEmail(value: unknown): string | undefined {
  const raw = Array.isArray(value) ? value[0] : value
  if (typeof raw !== 'string') return undefined
  const email = raw.trim()
  return email && email.length <= 254 && /^[^\s@]+@[^\s@]+$/.test(email) ? email : undefined
}
