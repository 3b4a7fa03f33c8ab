// Money travels in integer minor units (cents); screens, e-mails and exports all format it here.

/** An amount in minor units for a person, e.g. 30000 EUR → "€300.00". */
export function formatMoney(minor: number, currency: string, locale = 'en-GB'): string {
  try {
    return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(minor / 100)
  }
  catch {
    return `${fromMinorUnits(minor)} ${currency}`
  }
}

/** Major units with a dot and two decimals, as forms show them and CSV files carry them: 32050 → "320.50". */
export function fromMinorUnits(minor: number): string {
  return (minor / 100).toFixed(2)
}

/** "320", "320.5", "320,50" → 32050; anything else → NaN, which the shared schema words as an error. */
export function toMinorUnits(text: string): number {
  const t = text.trim().replace(',', '.')
  if (t === '') return 0
  if (!/^\d+(\.\d{1,2})?$/.test(t)) return Number.NaN
  return Math.round(Number(t) * 100)
}
