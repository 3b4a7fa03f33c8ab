import { z } from 'zod'
import { APPROVAL_LEVELS, DOCUMENT_KINDS } from '../constants/entries'
import { DEFAULT_CHECKLIST } from '../constants/grid'
import { MAX_REMINDER_DAYS, MAX_REMINDER_DAYS_BEFORE } from '../utils/reminder-schedule'
import { MESSAGES } from '../constants/messages'

/** A calendar date as the competition's office writes it: YYYY-MM-DD. */
export const isoDate = z
  .string({ error: 'Enter a date as YYYY-MM-DD.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Enter a date as YYYY-MM-DD.', abort: true })
  .refine(s => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), {
    error: 'That date does not exist.',
  })

const days = (label: string, min: number, max: number) =>
  z.number({ error: `Enter the ${label} as a whole number of days.` })
    .int({ error: `Enter the ${label} as a whole number of days.` })
    .min(min, { error: `The ${label} is at least ${min} day${min === 1 ? '' : 's'}.` })
    .max(max, { error: `The ${label} is at most ${max} days.` })

/** One checklist item of the competition's grid checklist (organiser set-up); the grid checks answer it. */
export const checklistItemSchema = z.object({
  id: z.string({ error: 'Give the item an identifier.' }).regex(/^[a-z0-9][a-z0-9-]{0,39}$/, { error: 'An item identifier is lower-case letters, digits and dashes, up to 40.' }),
  label: z.string({ error: 'Enter what the scrutineer checks.' }).trim().min(1, { error: 'Enter what the scrutineer checks.' }).max(120, { error: 'Keep the item under 120 characters.' }),
  hint: z.string().trim().max(200, { error: 'Keep the hint under 200 characters.' }).optional(),
}, { error: 'Each checklist item is an object with an id and a label.' })

export const checklistSchema = z.array(checklistItemSchema)
  .min(1, { error: 'The checklist needs at least one item.' })
  .max(20, { error: 'Keep the checklist to 20 items or fewer.' })
  .refine(items => new Set(items.map(i => i.id)).size === items.length, { error: 'Two checklist items share an identifier.' })

/** Each rule setting without its default, so a change of one rule leaves the others alone. */
const ruleFields = {
  /** Days the firmware must stay valid after the last contest day (common practice: 0). */
  firmwareMarginDays: days('firmware margin', 0, 365),
  /** Advise when firmware expires within this many days after the last contest day. */
  firmwareWarningDays: days('firmware warning', 0, 365),
  /** An IGC file counts as recent when dated within this many days before the first contest day. */
  igcRecencyDays: days('IGC file recency', 1, 3650),
  requiredDocumentKinds: z.array(z.enum(DOCUMENT_KINDS, { error: 'Choose document kinds from the list.' })),
  recordersRequired: z.union([z.literal(1), z.literal(2)], { error: 'Require one or two flight recorders.' }),
  acceptedApprovalLevels: z.array(z.enum(APPROVAL_LEVELS, { error: 'Choose approval levels from the list.' })).min(1, { error: 'Accept at least one recorder approval level.' }),
  /** The day's checklist on the launch grid. */
  gridChecklist: checklistSchema,
  /** Every glider carries a collision-warning unit (check collision-warning.present). */
  collisionWarningRequired: z.boolean({ error: 'Say whether a collision-warning unit is required (true or false).' }),
  /** Pilots' medical and licence files are deleted this many days after the last contest day. */
  medicalRetentionDays: days('medical and licence retention', 1, 3650),
}

/** The rule settings a competition stores in competitions.settings. */
export const competitionRulesSchema = z.object({
  firmwareMarginDays: ruleFields.firmwareMarginDays.default(0),
  firmwareWarningDays: ruleFields.firmwareWarningDays.default(30),
  igcRecencyDays: ruleFields.igcRecencyDays.default(365),
  requiredDocumentKinds: ruleFields.requiredDocumentKinds.default(['airworthiness', 'insurance', 'licence', 'medical']),
  recordersRequired: ruleFields.recordersRequired.default(1),
  acceptedApprovalLevels: ruleFields.acceptedApprovalLevels.default(['all-flights', 'badges-up-to-diamonds']),
  gridChecklist: ruleFields.gridChecklist.default(() => DEFAULT_CHECKLIST.map(i => ({ ...i }))),
  collisionWarningRequired: ruleFields.collisionWarningRequired.default(true),
  medicalRetentionDays: ruleFields.medicalRetentionDays.default(30),
})
/** A change to some rules (PATCH): what is left out keeps its stored value. */
export const competitionRulesPatchSchema = z.object(ruleFields, { error: 'Send the rules as an object.' }).partial().strict()
export type CompetitionRules = z.infer<typeof competitionRulesSchema>

export const DEFAULT_RULES: CompetitionRules = competitionRulesSchema.parse({})

// ——— Competition set-up (organiser) ———————————————————————————————————————————————

const trimmed = (label: string, max = 120) =>
  z.string({ error: `Enter the ${label}.` }).trim().min(1, { error: `Enter the ${label}.` }).max(max, { error: `Keep the ${label} under ${max} characters.` })

/** An IANA time zone name the runtime knows (e.g. Europe/Berlin), checked with Intl. */
export function isKnownTimeZone(zone: string): boolean {
  if (!/^[A-Za-z][A-Za-z0-9_+\-/]*$/.test(zone)) return false
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone })
    return true
  }
  catch {
    return false
  }
}

export const timeZoneSchema = z
  .string({ error: 'Enter the time zone, e.g. Europe/Berlin.' })
  .trim()
  .min(1, { error: 'Enter the time zone, e.g. Europe/Berlin.' })
  .max(64, { error: 'That is not a time zone name.' })
  .refine(isKnownTimeZone, { error: 'That is not a known IANA time zone; use a name like Europe/Berlin.' })

/** ICAO location indicator: four letters (ICAO Doc 7910), kept in upper case. Optional. */
export const icaoSchema = z
  .string()
  .trim()
  .toUpperCase()
  .refine(s => s === '' || /^[A-Z]{4}$/.test(s), { error: 'An ICAO location indicator is four letters, e.g. EDKM.' })
  .transform(s => (s === '' ? null : s))
  .nullable()
  .optional()

/** A currency as ISO 4217 writes it: three letters (EUR, GBP, CHF …). */
export const currencySchema = z
  .string({ error: 'Enter the currency as three letters, e.g. EUR.' })
  .trim()
  .toUpperCase()
  .regex(/^[A-Z]{3}$/, { error: 'Enter the currency as three letters, e.g. EUR.' })
  .refine((code) => {
    const known = (Intl as { supportedValuesOf?: (key: string) => string[] }).supportedValuesOf?.('currency')
    return !known || known.includes(code)
  }, { error: 'That is not an ISO 4217 currency code.' })

/**
 * The pre-event reminder schedule: whole days before the first contest day, each at most once,
 * kept largest first. An empty list sends no reminders (shared/utils/reminder-schedule.ts).
 */
export const reminderDaysSchema = z
  .array(
    z.number({ error: MESSAGES.reminderDayWhole })
      .int({ error: MESSAGES.reminderDayWhole })
      .min(1, { error: MESSAGES.reminderDayTooSoon })
      .max(MAX_REMINDER_DAYS_BEFORE, { error: MESSAGES.reminderDayTooEarly(MAX_REMINDER_DAYS_BEFORE) }),
    { error: MESSAGES.reminderDaysList },
  )
  .max(MAX_REMINDER_DAYS, { error: MESSAGES.reminderDaysTooMany(MAX_REMINDER_DAYS) })
  .refine(list => new Set(list).size === list.length, { error: MESSAGES.reminderDayTwice })
  .transform(list => [...list].sort((a, b) => b - a))

const optionalDate = isoDate.nullable().optional()

/**
 * Where people write about their personal data in this competition (its privacy notice names
 * it); optional, an empty value clears it and the notice names the organisers instead.
 */
export const privacyContactSchema = z
  .string({ error: MESSAGES.privacyContactEmail })
  .trim()
  .toLowerCase()
  .max(254, { error: MESSAGES.privacyContactEmail })
  .pipe(z.union([z.literal(''), z.email({ error: MESSAGES.privacyContactEmail })], { error: MESSAGES.privacyContactEmail }))
  .transform(v => (v === '' ? null : v))
  .nullable()
  .optional()
const minorUnits = (label: string) =>
  z.number({ error: `Enter the ${label} as a number.` }).int({ error: `Enter the ${label} in whole cents.` }).min(0, { error: `The ${label} cannot be negative.` }).max(100_000_000, { error: `The ${label} looks too large.` })

const setupFields = {
  name: trimmed('competition’s name'),
  airfieldName: trimmed('airfield’s name'),
  airfieldIcao: icaoSchema,
  timeZone: timeZoneSchema,
  currency: currencySchema,
  firstContestDay: isoDate,
  lastContestDay: isoDate,
  practiceDays: z.array(isoDate).max(30, { error: 'List at most 30 practice days.' }),
  contestDays: z.array(isoDate).max(60, { error: 'List at most 60 contest days.' }),
  registrationOpensOn: optionalDate,
  registrationClosesOn: optionalDate,
  lateFeeAfter: optionalDate,
  lateFeeMinor: minorUnits('late fee'),
  reminderDays: reminderDaysSchema,
  privacyContactEmail: privacyContactSchema,
  rules: competitionRulesSchema,
}

type SetupShape = {
  firstContestDay?: string
  lastContestDay?: string
  practiceDays?: string[]
  contestDays?: string[]
  registrationOpensOn?: string | null
  registrationClosesOn?: string | null
  lateFeeAfter?: string | null
}

/** The rules that tie the dates together; ISO dates compare correctly as strings. */
function checkDates(v: SetupShape, ctx: z.RefinementCtx) {
  const first = v.firstContestDay
  const last = v.lastContestDay
  if (first && last && first > last) {
    ctx.addIssue({ code: 'custom', path: ['lastContestDay'], message: 'The last contest day cannot be before the first.' })
    return
  }
  const contest = v.contestDays ?? []
  const practice = v.practiceDays ?? []
  if (first && last) {
    const outside = contest.filter(d => d < first || d > last)
    if (outside.length) {
      ctx.addIssue({ code: 'custom', path: ['contestDays'], message: `Contest days must lie between the first and last contest day (${outside.join(', ')} does not).` })
    }
  }
  if (new Set(contest).size !== contest.length) {
    ctx.addIssue({ code: 'custom', path: ['contestDays'], message: 'A contest day is listed twice.' })
  }
  if (new Set(practice).size !== practice.length) {
    ctx.addIssue({ code: 'custom', path: ['practiceDays'], message: 'A practice day is listed twice.' })
  }
  if (first) {
    const late = practice.filter(d => d >= first)
    if (late.length) {
      ctx.addIssue({ code: 'custom', path: ['practiceDays'], message: `Practice days must come before the first contest day (${late.join(', ')} does not).` })
    }
  }
  const opens = v.registrationOpensOn
  const closes = v.registrationClosesOn
  if (opens && closes && opens > closes) {
    ctx.addIssue({ code: 'custom', path: ['registrationClosesOn'], message: 'Registration cannot close before it opens.' })
  }
  if (closes && last && closes > last) {
    ctx.addIssue({ code: 'custom', path: ['registrationClosesOn'], message: 'Registration must close by the last contest day.' })
  }
  if (v.lateFeeAfter && closes && v.lateFeeAfter > closes) {
    ctx.addIssue({ code: 'custom', path: ['lateFeeAfter'], message: 'The late fee must start by the day registration closes.' })
  }
  if (v.lateFeeAfter && opens && v.lateFeeAfter < opens) {
    ctx.addIssue({ code: 'custom', path: ['lateFeeAfter'], message: 'The late fee cannot start before registration opens.' })
  }
}

const asObject = { error: 'Send the fields as a JSON object.' }

/** Every set-up field at once: what the set-up form sends and what the server stores. */
export const competitionSetupSchema = z.object(setupFields, asObject).superRefine(checkDates)
export type CompetitionSetup = z.output<typeof competitionSetupSchema>
export type CompetitionSetupInput = z.input<typeof competitionSetupSchema>

/** PATCH body: any subset of the set-up fields; the server merges it with what is stored and checks the whole. */
export const competitionSetupPatchSchema = z.object({ ...setupFields, rules: competitionRulesPatchSchema }, asObject).partial().strict()
export type CompetitionSetupPatch = z.output<typeof competitionSetupPatchSchema>

/** What a site administrator fills in to create a competition. */
export const competitionCreateSchema = z.object({
  name: setupFields.name,
  airfieldName: setupFields.airfieldName,
  airfieldIcao: icaoSchema,
  timeZone: timeZoneSchema,
  currency: currencySchema.default('EUR'),
  firstContestDay: isoDate,
  lastContestDay: isoDate,
  organiserEmail: z
    .string({ error: 'Enter the first organiser’s e-mail address.' })
    .trim()
    .toLowerCase()
    .max(254, { error: 'That e-mail address is too long.' })
    .pipe(z.email({ error: 'Enter an e-mail address like name@example.org.' })),
}, asObject).superRefine(checkDates)
export type CompetitionCreateInput = z.input<typeof competitionCreateSchema>

// ——— Classes ———————————————————————————————————————————————————————————————————————

const limit = (label: string, max: number) =>
  z.number({ error: `Enter the ${label} as a number.` }).positive({ error: `The ${label} must be more than 0.` }).max(max, { error: `The ${label} looks too large.` }).nullable()

const classFields = {
  name: trimmed('class name', 60),
  maxSpanM: limit('maximum span', 40),
  maxMtomKg: limit('maximum take-off mass', 1500),
  waterBallast: z.boolean({ error: 'Say whether water ballast is allowed.' }),
  entryFeeMinor: minorUnits('entry fee'),
  sortOrder: z.number().int().min(0).max(1000),
}

/**
 * A new class: `code` names an FAI class (its defaults fill what is left out) or is 'custom'
 * (then a name is needed). Sources of the defaults: shared/constants/classes.ts.
 */
export const classCreateSchema = z.object({
  code: z.string({ error: 'Choose an FAI class or a custom class.' }).trim().min(1, { error: 'Choose an FAI class or a custom class.' }).max(40),
  name: classFields.name.optional(),
  maxSpanM: classFields.maxSpanM.optional(),
  maxMtomKg: classFields.maxMtomKg.optional(),
  waterBallast: classFields.waterBallast.optional(),
  entryFeeMinor: classFields.entryFeeMinor.optional(),
  sortOrder: classFields.sortOrder.optional(),
}, asObject).strict()
export type ClassCreateInput = z.input<typeof classCreateSchema>

export const classPatchSchema = z.object(classFields, asObject).partial().strict()
export type ClassPatchInput = z.input<typeof classPatchSchema>

/** The class form on the set-up page (all fields present). */
export const classFormSchema = z.object(classFields, asObject)

export const classParamsSchema = z.object({
  competitionId: z.uuid(),
  classId: z.uuid(),
})
