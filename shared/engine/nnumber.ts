// US registrations (N-numbers) and their 24-bit aircraft addresses. The US register assigns
// the addresses A00001 … ADF7C7 to N1 … N99999 in one published sequence: the numbers in
// lexical order, each followed by its letter suffixes. Our own implementation of that
// sequence; the letters I and O never occur.
import { normaliseId } from './normalise'

const LETTERS = 'ABCDEFGHJKLMNPQRSTUVWXYZ'
const BASE = 0xA00001
/** Addresses taken by the letter suffixes after a number of 1–3 digits: none, A…Z, AA…ZZ. */
const SUFFIX_BLOCK = 1 + LETTERS.length * (1 + LETTERS.length)
/** After 4 digits only one letter or a fifth digit may follow. */
const FOUR_DIGIT_BLOCK = 1 + LETTERS.length + 10
/** Addresses under an n-digit number (n = 1 … 5), the number itself included. */
const BLOCK: Record<number, number> = { 5: 1, 4: FOUR_DIGIT_BLOCK }
BLOCK[3] = SUFFIX_BLOCK + 10 * BLOCK[4]!
BLOCK[2] = SUFFIX_BLOCK + 10 * BLOCK[3]!
BLOCK[1] = SUFFIX_BLOCK + 10 * BLOCK[2]!

const N_NUMBER = /^N[1-9]\d{0,4}[A-HJ-NP-Z]{0,2}$/

/** Whether the registration is a well-formed US N-number (after normalising case, spaces, hyphens). */
export function isNNumber(registration: string): boolean {
  const r = normaliseId(registration)
  if (!N_NUMBER.test(r) || r.length > 6) return false
  const digits = /^N(\d+)/.exec(r)![1]!.length
  const letters = r.length - 1 - digits
  return digits + letters <= 5 && !(digits === 5 && letters > 0) && !(digits === 4 && letters > 1)
}

/** The 24-bit address of a US N-number as six hex digits, or null when it is not one. */
export function nNumberToAddress(registration: string): string | null {
  if (!isNNumber(registration)) return null
  const r = normaliseId(registration).slice(1)
  let offset = (Number(r[0]) - 1) * BLOCK[1]!
  let digits = 1
  for (let i = 1; i < r.length; i++) {
    const c = r[i]!
    if (c >= '0' && c <= '9') {
      offset += (digits === 4 ? 1 + LETTERS.length : SUFFIX_BLOCK) + Number(c) * BLOCK[digits + 1]!
      digits++
      continue
    }
    // A letter: the suffix ends the registration.
    const first = LETTERS.indexOf(c)
    if (digits === 4) {
      offset += 1 + first
    }
    else {
      const second = r[i + 1] ? LETTERS.indexOf(r[i + 1]!) : -1
      offset += 1 + first * (1 + LETTERS.length) + (second >= 0 ? 1 + second : 0)
    }
    break
  }
  return (BASE + offset).toString(16).toUpperCase().padStart(6, '0')
}
