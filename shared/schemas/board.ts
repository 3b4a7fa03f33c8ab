// Contest days, the board, the director's actions, the audit log and the exports: every
// body, query and param the board routes read, and what a socket may ask.
import { z } from 'zod'
import { READINESS_STATES } from '../constants/readiness'
import { isoDate } from './competition'
import { competitionParamsSchema, uuid } from './params'

export const DAY_KINDS = ['practice', 'contest'] as const
export type DayKind = (typeof DAY_KINDS)[number]

const reason = z.string({ error: 'Give a reason; it is kept in the audit log and told to the entrant.' })
  .trim()
  .min(3, { error: 'Give a reason of a few words; it is kept in the audit log and told to the entrant.' })
  .max(500, { error: 'Keep the reason under 500 characters.' })

/** POST …/days: open a day (today unless named); its kind comes from the set-up where it is listed there. */
export const dayOpenBodySchema = z.object({
  day: isoDate.optional(),
  kind: z.enum(DAY_KINDS, { error: 'Say whether it is a practice or a contest day.' }).optional(),
}, { error: 'Send the day as an object.' }).strict()
export type DayOpenBody = z.infer<typeof dayOpenBodySchema>

export const dayParamsSchema = competitionParamsSchema.extend({ day: isoDate })

/** The board of one day; the open day (else the latest) when none is named. */
export const boardQuerySchema = z.object({ day: isoDate.optional() })

/** POST …/entries/:entryId/hold — the day defaults to the open day. */
export const holdBodySchema = z.object({
  day: isoDate.optional(),
  reason,
}, { error: 'Send the hold as an object with a reason.' }).strict()
export type HoldBody = z.infer<typeof holdBodySchema>

/** POST …/entries/:entryId/release — a release also needs its reason. */
export const releaseBodySchema = holdBodySchema
export type ReleaseBody = HoldBody

export const WAIVER_SCOPES = ['day', 'competition'] as const
export type WaiverScope = (typeof WAIVER_SCOPES)[number]

/** POST …/entries/:entryId/waivers — one finding (its check, unit or subject), for the day or the competition. */
export const waiverBodySchema = z.object({
  scope: z.enum(WAIVER_SCOPES, { error: 'Waive for the day or for the whole competition.' }),
  day: isoDate.optional(),
  checkId: z.string({ error: 'Name the check whose finding is waived.' }).min(1).max(80),
  unitId: z.string().min(1).max(80).optional(),
  subject: z.string().min(1).max(120).optional(),
  reason,
}, { error: 'Send the waiver as an object with a finding and a reason.' }).strict()
export type WaiverBody = z.infer<typeof waiverBodySchema>

/** POST …/entries/:entryId/waivers/:actionId/withdraw — the waiver counts no more; the reason is kept and told. */
export const waiverWithdrawBodySchema = z.object({
  reason,
}, { error: 'Send the withdrawal as an object with a reason.' }).strict()
export type WaiverWithdrawBody = z.infer<typeof waiverWithdrawBodySchema>

export const waiverParamsSchema = competitionParamsSchema.extend({ entryId: uuid, actionId: uuid })

export const AUDIT_PAGE_SIZE = 50

/**
 * The audit page's cursor: the time (UTC, to the microsecond) and id of the last row shown,
 * as `2026-12-04T09:12:33.123456Z_42`. Rows are ordered by (time, id), newest first.
 */
export const AUDIT_CURSOR_PATTERN = /^(\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(?:\.\d{1,6})?Z)_(\d{1,15})$/
const BAD_CURSOR = 'This page link of the audit log is not valid: start again from the newest rows.'
export const auditCursorSchema = z.string({ error: BAD_CURSOR })
  .regex(AUDIT_CURSOR_PATTERN, { error: BAD_CURSOR })
  // A real instant (zod runs this even after the pattern failed, so it reads defensively).
  .refine((v) => {
    const at = AUDIT_CURSOR_PATTERN.exec(v)?.[1]
    if (at === undefined) return true
    const t = Date.parse(at) // rolls 30 February over: compare back so the database never sees it
    return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 19) === at.slice(0, 19)
  }, { error: BAD_CURSOR })
  .transform((v) => {
    const [, at, id] = AUDIT_CURSOR_PATTERN.exec(v)!
    return { at: at!, id: Number(id) }
  })
export type AuditCursor = z.output<typeof auditCursorSchema>
export const auditCursorOf = (c: AuditCursor) => `${c.at}_${c.id}`

/** GET …/audit — filters combine; `before` pages back from the cursor of the last row shown. */
export const auditQuerySchema = z.object({
  day: isoDate.optional(),
  entryId: uuid.optional(),
  actorId: uuid.optional(),
  action: z.string().trim().min(1).max(60).regex(/^[a-z0-9.-]+$/, { error: 'An action is written like grid-check.recorded.' }).optional(),
  before: auditCursorSchema.optional(),
  limit: z.coerce.number({ error: 'Ask for a number of rows.' }).int().min(1).max(500, { error: 'Ask for at most 500 rows at a time.' }).optional(),
})
export type AuditQuery = z.infer<typeof auditQuerySchema>

/** GET …/grid-checks/export.csv — every day unless one is named. */
export const gridLogExportQuerySchema = z.object({ day: isoDate.optional() })

/** What a socket may send: join or leave one competition's board. */
export const boardJoinSchema = z.object({ competitionId: uuid }, { error: 'Name the competition.' }).strict()

export const readinessFilterSchema = z.enum(READINESS_STATES)
