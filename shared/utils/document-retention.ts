// When the retention job (server/domain/files/retention.ts) deletes a document's stored file,
// and how the document lists and the entry's timeline say that it went. Pure, so the boundary
// instants are tested without a database.
import { addDays, dateInZone } from '../engine/dates'
import type { IsoDate } from '../engine/types'
import { DOCUMENT_KIND_LABELS, type DocumentKind } from '../constants/entries'
import type { FileDeletionReason } from '../constants/files'
import { PERSONAL_DOCUMENT_KINDS } from './document-access'

/** Documents about the pilot rather than the glider (the need-to-know kinds): kept only for the competition's retention days. */
export const MEDICAL_RETENTION_KINDS = PERSONAL_DOCUMENT_KINDS

/** Days a replaced copy of any kind is kept once a newer copy of it was accepted. */
export const SUPERSEDED_RETENTION_DAYS = 30

const DAY_MS = 86_400_000

/**
 * The first calendar day, in the competition's time zone, on which its medical and licence
 * files are due. They are kept for `days` whole days after the last contest day, so they go at
 * 00:00 local time on day last + days + 1: last day 2027-07-18 with 30 days keeps them through
 * 2027-08-17 and deletes them from 2027-08-18 00:00.
 */
export function medicalFilesDueOn(lastContestDay: IsoDate, days: number): IsoDate {
  return addDays(lastContestDay, days + 1)
}

/** Whether, at `at`, a competition's medical and licence files are due (see medicalFilesDueOn). */
export function medicalFilesDue(at: Date, lastContestDay: IsoDate, days: number, timeZone: string): boolean {
  return dateInZone(at, timeZone) >= medicalFilesDueOn(lastContestDay, days)
}

/**
 * A replaced copy is due once a newer copy in its line of replacements has been accepted for
 * 30 days (30 × 24 hours, an instant: acceptance is a moment, not a contest day). This is the
 * latest acceptance that makes it due at `at`.
 */
export function supersededAcceptedBy(at: Date): Date {
  return new Date(at.getTime() - SUPERSEDED_RETENTION_DAYS * DAY_MS)
}

const daysWord = (n: number) => `${n} day${n === 1 ? '' : 's'}`

/** Why the file was kept as long as it was, in words: "30 days after the competition". */
export function keptFor(reason: FileDeletionReason, keptDays: number): string {
  return reason === 'retention-medical'
    ? `${daysWord(keptDays)} after the competition`
    : `${daysWord(keptDays)} after a newer copy was accepted`
}

/** What a document list shows instead of a link to a deleted file. */
export function fileDeletedNote(reason: FileDeletionReason, deletedOn: IsoDate, keptDays: number): string {
  return `Deleted on ${deletedOn} (kept ${keptFor(reason, keptDays)})`
}

/** The entry timeline's line for a deleted file (audit details: kind, reason, keptDays). */
export function fileDeletedSentence(kind: DocumentKind, reason: FileDeletionReason, keptDays: number): string {
  const what = reason === 'retention-medical' ? `${DOCUMENT_KIND_LABELS[kind]} file` : `Earlier ${DOCUMENT_KIND_LABELS[kind].toLowerCase()} file`
  return `${what} deleted, kept ${keptFor(reason, keptDays)}; its kind, validity and review outcome stay on record`
}
