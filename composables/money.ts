// Money travels in integer minor units; forms show and take major units ("320.00").

export function formatMoney(minor: number, currency: string): string {
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(minor / 100)
  }
  catch {
    return `${(minor / 100).toFixed(2)} ${currency}`
  }
}

/** "320", "320.5", "320,50" → 32050; anything else → NaN, which the shared schema words as an error. */
export function toMinorUnits(text: string): number {
  const t = text.trim().replace(',', '.')
  if (t === '') return 0
  if (!/^\d+(\.\d{1,2})?$/.test(t)) return Number.NaN
  return Math.round(Number(t) * 100)
}

export function fromMinorUnits(minor: number): string {
  return (minor / 100).toFixed(2)
}
