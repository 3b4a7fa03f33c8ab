// Row types of the files area's tables, written by hand to match migrations/.
import type { DocumentKind } from '../constants/entries'
import type { DocumentStatus, FileDeletionReason } from '../constants/files'

export interface DocumentRow {
  id: string
  entry_id: string
  competition_id: string
  kind: DocumentKind
  original_filename: string
  media_type: string
  size_bytes: number
  sha256: string
  /** Where the file is stored; null once the file was deleted (file_deleted_at says when). */
  storage_key: string | null
  /** The key the stored file is sealed under (16 hex digits); null for a plain file stored before encryption. */
  file_key_id: string | null
  /** YYYY-MM-DD (a `date` column, read as its text by the type parser in knexfile.ts) */
  expires_on: string
  status: DocumentStatus
  review_reason: string | null
  reviewed_by: string | null
  reviewed_at: Date | null
  uploaded_by: string
  uploaded_at: Date
  /** The upload that replaced this one; null while it is the current document of its kind. */
  replaced_by: string | null
  superseded: boolean
  /** When the stored file was deleted on the retention schedule; the row stays. */
  file_deleted_at: Date | null
  file_deleted_reason: FileDeletionReason | null
  /** Days the file had been kept after its reference day (last contest day, or the replacement's acceptance). */
  file_kept_days: number | null
}

export interface IgcFileRow {
  id: string
  entry_id: string
  competition_id: string
  unit_id: string | null
  original_filename: string
  storage_key: string
  /** The key the stored file is sealed under (16 hex digits); null for a plain file stored before encryption. */
  file_key_id: string | null
  sha256: string
  size_bytes: number
  /** YYYY-MM-DD from HFDTE */
  flight_date: string | null
  pilot: string | null
  copilot: string | null
  glider_type: string | null
  glider_id: string | null
  declared_comp_id: string | null
  declared_class: string | null
  recorder_type: string | null
  firmware_version: string | null
  recorder_id: string | null
  extensions: string[]
  has_g_record: boolean
  parse_errors: { line: number, message: string }[]
  uploaded_by: string
  uploaded_at: Date
  replaced_by: string | null
  superseded: boolean
}
