import { z } from 'zod'
import { APPROVAL_LEVELS, DOCUMENT_KINDS } from '../constants/entries'

/** A calendar date as the competition's office writes it: YYYY-MM-DD. */
export const isoDate = z
  .string({ error: 'Enter a date as YYYY-MM-DD.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Enter a date as YYYY-MM-DD.' })
  .refine(s => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), {
    error: 'That date does not exist.',
  })

/** The rule settings a competition stores in competitions.settings. */
export const competitionRulesSchema = z.object({
  /** Days the firmware must stay valid after the last contest day (common practice: 0). */
  firmwareMarginDays: z.number().int().min(0).max(365).default(0),
  /** Advise when firmware expires within this many days after the last contest day. */
  firmwareWarningDays: z.number().int().min(0).max(365).default(30),
  /** An IGC file counts as recent when dated within this many days before the first contest day. */
  igcRecencyDays: z.number().int().min(1).max(3650).default(365),
  requiredDocumentKinds: z.array(z.enum(DOCUMENT_KINDS)).default(['airworthiness', 'insurance', 'licence', 'medical']),
  recordersRequired: z.union([z.literal(1), z.literal(2)]).default(1),
  acceptedApprovalLevels: z.array(z.enum(APPROVAL_LEVELS)).min(1).default(['all-flights', 'badges-up-to-diamonds']),
})
export type CompetitionRules = z.infer<typeof competitionRulesSchema>

export const DEFAULT_RULES: CompetitionRules = competitionRulesSchema.parse({})
