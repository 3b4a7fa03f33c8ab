// Comparing what pilots type with what flight recorders write: registrations, competition
// IDs, class names and people's names, each with the tolerance the trade expects.
import { FAI_CLASSES } from '../constants/classes'

/** Registration or competition ID: case, spaces and hyphens do not count ("D-1234" = "d1234"). */
export function normaliseId(s: string | null | undefined): string {
  return (s ?? '').toUpperCase().replace(/[\s\-_.]/g, '')
}

/** A radio ID in upper case without spaces. */
export function normaliseRadioId(s: string | null | undefined): string {
  return (s ?? '').toUpperCase().replace(/\s/g, '')
}

function stripDiacritics(s: string): string {
  return s.normalize('NFD').replace(/[\u0300-\u036F]/g, '')
}

/** A class name reduced to a key: "18 Metre", "18-Meter" and "18m" all give "18m". */
export function classKey(s: string | null | undefined): string {
  return stripDiacritics(s ?? '')
    .toLowerCase()
    .replace(/\b(metres?|meters?|mtr)\b/g, 'm')
    .replace(/\bclass\b/g, '')
    .replace(/[^a-z0-9.]/g, '')
}

/** Every key under which the class is known: its own name, its code, the FAI name and aliases. */
const classKeysMemo = new Map<string, Set<string>>()

export function classKeys(classCode: string, className: string, extraAliases: readonly string[] = []): Set<string> {
  const memoKey = [classCode, className, ...extraAliases].join('\u0000')
  const hit = classKeysMemo.get(memoKey)
  if (hit) return hit
  const keys = new Set<string>([classKey(className), classKey(classCode)])
  const fai = FAI_CLASSES.find(c => c.code === classCode || classKey(c.name) === classKey(className))
  if (fai) {
    keys.add(classKey(fai.name))
    keys.add(classKey(fai.code))
    for (const a of fai.aliases) keys.add(classKey(a))
  }
  for (const a of extraAliases) keys.add(classKey(a))
  keys.delete('')
  if (classKeysMemo.size > 1000) classKeysMemo.clear()
  classKeysMemo.set(memoKey, keys)
  return keys
}

export function classMatches(declared: string | null | undefined, classCode: string, className: string, extraAliases: readonly string[] = []): boolean {
  const key = classKey(declared)
  return key !== '' && classKeys(classCode, className, extraAliases).has(key)
}

function nameTokens(s: string): string[] {
  return stripDiacritics(s).toLowerCase().replace(/[^a-z0-9]+/g, ' ').trim().split(' ').filter(Boolean)
}

/**
 * People's names compare without case, diacritics, punctuation or word order ("Bloggs Bill"
 * = "Bill Bloggs"); a middle initial present on one side only does not count.
 */
export function namesMatch(a: string | null | undefined, b: string | null | undefined): boolean {
  const ta = nameTokens(a ?? '')
  const tb = nameTokens(b ?? '')
  if (ta.length === 0 || tb.length === 0) return false
  const sa = [...ta].sort().join(' ')
  const sb = [...tb].sort().join(' ')
  if (sa === sb) return true
  const long = (t: string[]) => t.filter(w => w.length > 1).sort().join(' ')
  return long(ta) !== '' && long(ta) === long(tb)
}

/** Glider types compare without case, diacritics, spaces or punctuation; a maker's name in front may be left out. */
export function gliderTypesMatch(a: string | null | undefined, b: string | null | undefined): boolean {
  const compact = (s: string) => stripDiacritics(s).toLowerCase().replace(/[^a-z0-9]/g, '')
  const ca = compact(a ?? '')
  const cb = compact(b ?? '')
  if (ca === '' || cb === '') return false
  if (ca === cb) return true
  // "Maker Type" against "Type": the shorter must be the whole last part of the longer.
  const words = (s: string) => nameTokens(s)
  const [shortS, longS] = ca.length < cb.length ? [a ?? '', b ?? ''] : [b ?? '', a ?? '']
  const longWords = words(longS)
  const shortCompact = compact(shortS)
  for (let i = 1; i < longWords.length; i++) {
    if (longWords.slice(i).join('') === shortCompact) return true
  }
  return false
}
