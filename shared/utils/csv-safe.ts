/**
 * A cell a spreadsheet would run as a formula (=, +, -, @, or a leading tab or carriage
 * return) gets a leading apostrophe, so an exported name can never execute.
 * Source: OWASP "CSV Injection" guidance.
 */
export function csvSafe(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value
}

/** Every cell of the rows as text, each made safe by `csvSafe`: what a CSV export writes. */
export function csvSafeRows(rows: readonly (readonly unknown[])[]): string[][] {
  return rows.map(r => r.map(v => csvSafe(String(v ?? ''))))
}
