import { z } from 'zod'
import { entryParamsSchema } from './params'
import { APPROVAL_LEVELS, MOTOR_GLIDER_KINDS } from '../constants/entries'
import { isoDate } from './competition'
import { MESSAGES } from '../constants/messages'

const text = (label: string, max = 120) =>
  z.string({ error: `Enter the ${label}.` }).trim().min(1, { error: `Enter the ${label}.` }).max(max, { error: `Keep the ${label} under ${max} characters.` })
const optionalText = (max = 120) =>
  z.string().trim().max(max, { error: `Keep it under ${max} characters.` }).optional().transform(v => (v ? v : undefined))
const positive = (label: string, max: number) =>
  z.number({ error: `Enter the ${label} as a number.` }).positive({ error: `The ${label} must be more than 0.` }).max(max, { error: `The ${label} looks too large.` })

const motorGlider = z.enum(MOTOR_GLIDER_KINDS, { error: 'Choose whether the glider has an engine: none, self-launching, sustainer or electric.' })
/** A lever arm from the flight manual: metres from the datum, aft positive. */
const arm = (label: string) => z.number({ error: `Enter the ${label} as a number of metres.` }).min(-5, { error: `The ${label} is between -5 and 5 m from the datum.` }).max(5, { error: `The ${label} is between -5 and 5 m from the datum.` })
const clearableArmOf = (label: string) => z.union([z.null(), z.literal(''), arm(label)], { error: `Enter the ${label} as a number of metres.` })
  .optional()
  .transform(v => (v === '' ? null : v))

/**
 * The IGC recorder ID as the A record writes it: the manufacturer's three-character code and the
 * recorder's three-character serial id ("XXX-ABC", kept as "XXXABC"), or the serial id alone.
 */
export const igcRecorderIdSchema = z
  .string({ error: 'Enter the IGC recorder ID.' })
  .trim()
  .toUpperCase()
  .transform(s => s.replace(/[\s-]/g, ''))
  .refine(s => /^[A-Z0-9]{3}([A-Z0-9]{3})?$/.test(s), { error: 'An IGC recorder ID is the three-character manufacturer code and three-character serial id from the file’s first line, e.g. XXX-ABC (or the serial id alone).' })

/** A person's mass with parachute, weighed at registration. */
const occupantMass = (label: string) => z.union([
  z.null(),
  z.number({ error: `Enter the ${label} in kg.` }).min(30, { error: `The ${label} is at least 30 kg.` }).max(200, { error: `The ${label} is at most 200 kg.` }),
], { error: `Enter the ${label} in kg, or null to clear it.` })

/** Staff record the pilot's and co-pilot's weighed mass with parachute (registration weighing). */
export const occupantMassesSchema = z.object({
  pilotMassKg: occupantMass('pilot’s mass with parachute').optional(),
  copilotMassKg: occupantMass('co-pilot’s mass with parachute').optional(),
}, { error: 'Send the masses as a JSON object.' }).strict()
  .refine(b => b.pilotMassKg !== undefined || b.copilotMassKg !== undefined, { error: 'Send the pilot’s or the co-pilot’s mass.' })
export type OccupantMasses = z.infer<typeof occupantMassesSchema>

/** The competition ID painted on the glider: 1–3 letters or digits, kept in upper case. */
export const compIdSchema = z
  .string({ error: 'Enter the competition ID.' })
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9]{1,3}$/, { error: 'A competition ID is 1 to 3 letters or digits.' })

/** A radio ID: the 24-bit address as six hex digits (ICAO Annex 10 Vol III ch. 9). */
export const radioIdSchema = z
  .string({ error: 'Enter the radio ID.' })
  .trim()
  .toUpperCase()
  .regex(/^[0-9A-F]{6}$/, { error: 'A radio ID is six hexadecimal digits, e.g. 3D2F1A.' })

export const entryBodySchema = z.object({
  classId: z.uuid({ error: 'Choose a class.' }),
  pilotName: text('pilot’s name'),
  pilotNationality: z.string().trim().toUpperCase().regex(/^[A-Z]{2,3}$/, { error: 'Use a two- or three-letter country code.' }).optional(),
  pilotLicenceNumber: optionalText(60),
  pilotPhone: optionalText(40),
  emergencyContact: optionalText(160),
  copilotName: optionalText(),
  crewNames: z.array(z.string().trim().min(1).max(120)).max(10, { error: 'List at most 10 crew.' }).default([]),
  gliderType: text('glider type', 60),
  registration: text('registration', 20),
  compId: compIdSchema,
  spanM: positive('span', 40).optional(),
  mtomKg: positive('maximum take-off mass', 1500).optional(),
  emptyMassKg: positive('empty mass', 1500).optional(),
  cgForwardLimitM: z.number().min(-5).max(5).optional(),
  cgAftLimitM: z.number().min(-5).max(5).optional(),
  datumDescription: optionalText(300),
  motorGlider: motorGlider.default('none'),
  pilotArmM: arm('pilot seat’s lever arm').optional(),
  copilotArmM: arm('co-pilot seat’s lever arm').optional(),
  ballastArmM: arm('water ballast’s lever arm').optional(),
  /** The pilot confirms the competition's privacy notice (GET …/privacy-notice); the entry records it. */
  privacyNoticeAccepted: z.literal(true, { error: MESSAGES.privacyNoticeNotAccepted }),
}, { error: 'Send the fields as a JSON object.' }).refine(
  e => e.cgForwardLimitM === undefined || e.cgAftLimitM === undefined || e.cgForwardLimitM < e.cgAftLimitM,
  { error: 'The forward CG limit must lie ahead of the aft limit.', path: ['cgAftLimitM'] },
)
export type EntryBody = z.infer<typeof entryBodySchema>

export const collisionWarningUnitSchema = z.object({
  kind: z.literal('collision-warning'),
  model: text('model', 80),
  serial: text('serial number', 40),
  radioId: radioIdSchema,
  firmwareVersion: text('firmware version', 40),
  firmwareExpiresOn: isoDate,
  firmwareUpdatedOn: isoDate.optional(),
  obstacleDbVersion: optionalText(40),
  obstacleDbExpiresOn: isoDate.optional(),
})

export const flightRecorderUnitSchema = z.object({
  kind: z.literal('flight-recorder'),
  model: text('model', 80),
  serial: text('serial number', 40),
  firmwareVersion: optionalText(40),
  approvalLevel: z.enum(APPROVAL_LEVELS, { error: 'Choose the recorder’s IGC approval level.' }),
  igcRecorderId: z.union([z.literal(''), igcRecorderIdSchema]).optional().transform(v => (v ? v : undefined)),
})

export const unitBodySchema = z.discriminatedUnion('kind', [collisionWarningUnitSchema, flightRecorderUnitSchema], {
  error: 'Choose whether this is a collision-warning unit or a flight recorder.',
})
export type UnitBody = z.infer<typeof unitBodySchema>

// ---------------------------------------------------------------------------------------
// Changing an entry (PATCH): every field may be left out (unchanged). Optional text and
// number fields may also be sent as null or '' to clear them; required ones may not.

const clearableText = (max = 120) =>
  z.union([z.null(), z.string().trim().max(max, { error: `Keep it under ${max} characters.` })], { error: 'Send text, or null to clear it.' })
    .optional()
    .transform(v => (v === '' ? null : v))
const clearableNumber = (label: string, max: number) =>
  z.union([z.null(), z.literal(''), positive(label, max)], { error: `Enter the ${label} as a number.` })
    .optional()
    .transform(v => (v === '' ? null : v))
const clearableArm = z.union([z.null(), z.literal(''), z.number({ error: 'Enter the limit as a number of metres.' }).min(-5).max(5)], { error: 'Enter the limit as a number of metres.' })
  .optional()
  .transform(v => (v === '' ? null : v))

export const entryPatchSchema = z.object({
  classId: z.uuid({ error: 'Choose a class.' }).optional(),
  pilotName: text('pilot’s name').optional(),
  pilotNationality: z.union([
    z.null(),
    z.literal(''),
    z.string().trim().toUpperCase().regex(/^[A-Z]{2,3}$/, { error: 'Use a two- or three-letter country code.' }),
  ], { error: 'Use a two- or three-letter country code.' }).optional().transform(v => (v === '' ? null : v)),
  pilotLicenceNumber: clearableText(60),
  pilotPhone: clearableText(40),
  emergencyContact: clearableText(160),
  copilotName: clearableText(),
  crewNames: z.array(z.string().trim().min(1).max(120)).max(10, { error: 'List at most 10 crew.' }).optional(),
  gliderType: text('glider type', 60).optional(),
  registration: text('registration', 20).optional(),
  compId: compIdSchema.optional(),
  spanM: clearableNumber('span', 40),
  mtomKg: clearableNumber('maximum take-off mass', 1500),
  emptyMassKg: clearableNumber('empty mass', 1500),
  cgForwardLimitM: clearableArm,
  cgAftLimitM: clearableArm,
  datumDescription: clearableText(300),
  motorGlider: motorGlider.optional(),
  pilotArmM: clearableArmOf('pilot seat’s lever arm'),
  copilotArmM: clearableArmOf('co-pilot seat’s lever arm'),
  ballastArmM: clearableArmOf('water ballast’s lever arm'),
}, { error: 'Send the fields as a JSON object.' })
export type EntryPatch = z.infer<typeof entryPatchSchema>

/** The organiser's reason for rejecting an entry; the entrant reads it in the e-mail. */
export const entryRejectSchema = z.object({
  reason: z.string({ error: 'Give the entrant a reason.' }).trim()
    .min(3, { error: 'Give the entrant a reason.' })
    .max(1000, { error: 'Keep the reason under 1000 characters.' }),
}, { error: 'Send the reason as a JSON object.' })

/**
 * POST …/withdraw: nothing from the entrant (a reason is optional); the organiser withdrawing
 * for the pilot must give one (the domain checks that, as it knows who is calling).
 */
export const entryWithdrawSchema = z.object({
  reason: z.string({ error: MESSAGES.withdrawReasonRequired }).trim()
    .max(1000, { error: MESSAGES.withdrawReasonTooLong })
    .optional()
    .transform(r => (r ? r : undefined)),
}, { error: 'Send the reason as a JSON object.' })
export type EntryWithdrawBody = z.output<typeof entryWithdrawSchema>

/** The organiser's form withdrawing an entry for the pilot: the reason is required. */
export const entryWithdrawForPilotSchema = z.object({
  reason: z.string({ error: MESSAGES.withdrawReasonRequired }).trim()
    .min(3, { error: MESSAGES.withdrawReasonRequired })
    .max(1000, { error: MESSAGES.withdrawReasonTooLong }),
}, { error: 'Send the reason as a JSON object.' })

export { entryParamsSchema }

export const unitParamsSchema = entryParamsSchema.extend({ unitId: z.uuid() })

/** ?family=&version= for the firmware catalogue's suggestion. */
export const firmwareSuggestQuerySchema = z.object({
  family: z.string({ error: 'Give the unit family or model.' }).trim().min(1, { error: 'Give the unit family or model.' }).max(80),
  version: z.string({ error: 'Give the firmware version.' }).trim().min(1, { error: 'Give the firmware version.' }).max(40),
})

/** A message between the entrant and the office about the entry. */
export const entryMessageSchema = z.object({
  body: z.string({ error: 'Write the message.' }).trim()
    .min(3, { error: 'Write the message.' })
    .max(2000, { error: 'Keep the message under 2,000 characters.' }),
}, { error: 'Send the message as a JSON object.' }).strict()
export type EntryMessageBody = z.infer<typeof entryMessageSchema>
