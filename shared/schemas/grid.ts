import { z } from 'zod'
import { CHECK_RESULTS, FOUND_BY } from '../constants/grid'
import { isoDate } from './competition'
import { collisionWarningUnitSchema } from './entry'
import { uuid } from './params'

export { checklistItemSchema, checklistSchema } from './competition'

export const checklistAnswerSchema = z.object({
  itemId: z.string({ error: 'Name the checklist item.' }).min(1).max(40),
  result: z.enum(CHECK_RESULTS, { error: 'Answer pass, fail or not checked.' }),
  note: z.string().trim().max(500, { error: 'Keep a note under 500 characters.' }).optional(),
}, { error: 'Each answer is an object with an item and a result.' })

const reading = z.object({
  point: z.enum(['main-wheel', 'tail-wheel', 'tail-skid', 'nose-wheel'], { error: 'Choose the reaction point (main wheel, tail wheel, tail skid or nose wheel).' }),
  weight: z.number({ error: 'Enter the scale reading as a number.' }).positive({ error: 'A scale reading is more than zero.' }).max(2000, { error: 'A scale reading above 2,000 is not a glider’s.' }),
  arm: z.number({ error: 'Enter the lever arm as a number.' }).min(-200, { error: 'That lever arm is out of range.' }).max(600, { error: 'That lever arm is out of range.' }),
}, { error: 'Each reading has a point, a weight and an arm.' })

/** Scale readings taken on the grid: kg with arms in m, or lb with arms in inches. */
export const weighInInputSchema = z.object({
  units: z.enum(['kg-m', 'lb-in'], { error: 'Choose kg and metres, or lb and inches.' }),
  readings: z.array(reading).min(1, { error: 'Enter at least one scale reading.' }).max(4, { error: 'Enter at most four scale readings.' }),
  /** Water ballast declared but not in the tanks on the scales (weighed dry), kg; 0 or left out when the tanks are as flown. */
  declaredBallastKg: z.number({ error: 'Enter the declared water ballast in kg.' }).min(0, { error: 'Declared water ballast cannot be negative.' }).max(400, { error: 'Declared water ballast above 400 kg is not a glider’s.' }).optional(),
}, { error: 'Send the weigh-in as an object.' })
export type WeighInInput = z.infer<typeof weighInInputSchema>

/**
 * "The unit shows another version": what a collision-warning unit's own display showed on the
 * grid where it differs from the dossier. The check corrects the unit in the dossier (the same
 * audited change as the unit form) and the checks run on what the unit showed.
 */
export const unitShownSchema = collisionWarningUnitSchema.pick({ firmwareVersion: true, firmwareExpiresOn: true }).extend({
  unitId: uuid,
}).strict()
export type UnitShown = z.infer<typeof unitShownSchema>

/** One grid check as the phone sends it (queued offline under its own idempotency key). */
export const gridCheckBodySchema = z.object({
  idempotencyKey: uuid,
  entryId: uuid,
  day: isoDate,
  /** When the scrutineer submitted it on the phone (ISO 8601 with offset). */
  checkedAt: z.iso.datetime({ offset: true, error: 'Send the time of the check as an ISO date and time.' }),
  answers: z.array(checklistAnswerSchema).max(20, { error: 'Too many answers.' }),
  weighIn: weighInInputSchema.nullable().optional(),
  notes: z.string().trim().max(2000, { error: 'Keep the notes under 2,000 characters.' }).optional(),
  foundBy: z.enum(FOUND_BY).optional(),
  unitsShown: z.array(unitShownSchema).max(4, { error: 'A glider carries at most four collision-warning units.' }).optional(),
}, { error: 'Send the grid check as an object.' }).strict().refine(
  b => new Set((b.unitsShown ?? []).map(u => u.unitId)).size === (b.unitsShown ?? []).length,
  { error: 'Each unit’s shown version is sent once.', path: ['unitsShown'] },
)
export type GridCheckBody = z.infer<typeof gridCheckBodySchema>

export const gridDayQuerySchema = z.object({ day: isoDate })
/** The day's pack for the phone: the day is optional (today in the competition's time zone). */
export const gridPackQuerySchema = z.object({ day: isoDate.optional() })
