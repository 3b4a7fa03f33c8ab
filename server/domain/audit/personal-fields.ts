// What the audit log may not keep: personal values. The log is kept for good (append-only), so
// it holds ids, field names and the facts of each change, never what someone typed about a
// person: the erasure of an account could not reach it there.
//
// The rule. A field is personal when it is about a person rather than about the glider, the
// competition or a decision of its staff:
// - personal (recorded as "<field> changed", never its value): the pilot's, co-pilot's and
//   crew's names, the pilot's nationality, licence number, phone and emergency contact, any
//   e-mail address, postal address or date of birth, and free text the pilot writes about
//   themselves (the reason they give for withdrawing: `withdrawal` in entries.ts);
// - kept as values: the glider (type, registration, competition ID, class, span, masses and
//   CG limits, lever arms), its units (models, serials, radio IDs, firmware versions and dates),
//   money, dates, states, and the occupants' weighed masses (a load for the weight-and-balance
//   record, which the entry itself keeps after the account goes);
// - kept too: reasons written by staff (a hold, a waiver, a rejection, a withdrawal by the
//   office, a refund) — they are the decision being recorded, written for the pilot to read,
//   and the same text stands in the decision's own row. Staff are told not to put health
//   details there (see docs).
// Ids are kept: they name rows whose own data is erased or anonymised elsewhere.
//
// `audit()` passes every row's details through `withoutPersonalFields`, so a caller that
// forgets still writes no personal value; callers say so themselves too (`fieldChange`).

/** The detail keys that name personal fields (entry fields by their API names, and addresses). */
export const PERSONAL_FIELDS: ReadonlySet<string> = new Set([
  'pilotName', 'copilotName', 'crewNames', 'pilotNationality', 'pilotLicenceNumber', 'pilotPhone', 'emergencyContact',
  'email', 'invitedEmail', 'acceptedEmail', 'organiserEmail', 'address', 'dateOfBirth',
])

/** Keys named like these are personal wherever they appear (a new field is covered at once). */
const PERSONAL_SUFFIX = /(?:Email|Phone|Contact|Address|LicenceNumber|DateOfBirth|Names?)$/

/** Keys that end like a personal field but are not about a person. */
const NOT_PERSONAL: ReadonlySet<string> = new Set(['airfieldName', 'className', 'competitionName', 'classNames'])

export function isPersonalField(key: string): boolean {
  return PERSONAL_FIELDS.has(key) || (!NOT_PERSONAL.has(key) && PERSONAL_SUFFIX.test(key))
}

/** One changed field as the log keeps it: old and new value, or only that it changed. */
export type FieldChange = { field: string, from: unknown, to: unknown } | { field: string, changed: true }

export function fieldChange(field: string, from: unknown, to: unknown): FieldChange {
  return isPersonalField(field) ? { field, changed: true } : { field, from, to }
}

type Details = Record<string, unknown>

/**
 * The details without personal values: a `{ field, from, to }` change of a personal field
 * keeps only that it changed; a `changes` map does the same per key; any other personal key is
 * left out.
 */
export function withoutPersonalFields(details: Details): Details {
  const out: Details = {}
  for (const [key, value] of Object.entries(details)) {
    if (isPersonalField(key)) continue
    if (key === 'changes' && value && typeof value === 'object' && !Array.isArray(value)) {
      out.changes = Object.fromEntries(Object.entries(value as Details).map(([k, v]) => [k, isPersonalField(k) ? { changed: true } : v]))
      continue
    }
    out[key] = value
  }
  if (typeof out.field === 'string' && isPersonalField(out.field) && ('from' in out || 'to' in out)) {
    delete out.from
    delete out.to
    out.changed = true
  }
  return out
}

/** What stands in the log's text for a personal value quoted there. */
export const WITHHELD = '…'

function escapeRegExp(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
}

/**
 * The value with every quoted occurrence of the given personal values (names, phones…)
 * replaced, in every string inside it, ignoring case. For text the log copies from elsewhere
 * that may quote a person: the engine's finding reasons (the declaration check quotes the
 * pilot's name as the entry and the recorder give it). Values shorter than three characters are
 * left alone: they would match inside ordinary words.
 */
export function withoutPersonalValues<T>(value: T, personal: readonly (string | null | undefined)[], replacement = WITHHELD): T {
  const needles = [...new Set(personal.map(v => v?.trim()).filter((v): v is string => !!v && v.length >= 3))]
    .sort((a, b) => b.length - a.length)
  if (!needles.length) return value
  const pattern = new RegExp(needles.map(escapeRegExp).join('|'), 'gi')
  const walk = (v: unknown): unknown => {
    if (typeof v === 'string') return v.replace(pattern, replacement)
    if (Array.isArray(v)) return v.map(walk)
    if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x)]))
    return v
  }
  return walk(value) as T
}

/** The personal values a dossier holds that the engine may quote: the names of the people aboard. */
export function personalValuesOfDossier(dossier: {
  entry: { pilotName: string, copilotName?: string | null }
  igcFiles: readonly { pilot: string | null, copilot?: string | null }[]
}): string[] {
  return [dossier.entry.pilotName, dossier.entry.copilotName, ...dossier.igcFiles.flatMap(f => [f.pilot, f.copilot])]
    .filter((v): v is string => !!v)
}
