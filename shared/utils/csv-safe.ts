/**
 * A cell a spreadsheet would run as a formula (=, +, -, @, or a leading tab or carriage
 * return) gets a leading apostrophe, so an exported name can never execute.
 * Source: OWASP "CSV Injection" guidance.
 */
export function csvSafe(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value
}
