// Values as the driver (or a JSON value) hands them over, made plain: numerics arrive as
// text, timestamps as a Date (a column) or as text (inside a JSON value).

/** A numeric column's value as a number; null (or empty) stays null. */
export function num(v: string | number | null | undefined): number | null {
  return v === null || v === undefined || v === '' ? null : Number(v)
}

/** A timestamp as ISO 8601 text; null stays null. */
export function iso(v: Date | string): string
export function iso(v: Date | string | null): string | null
export function iso(v: Date | string | null): string | null {
  if (v === null) return null
  return (v instanceof Date ? v : new Date(v)).toISOString()
}
