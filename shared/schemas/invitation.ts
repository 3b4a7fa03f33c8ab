import { z } from 'zod'
import { INVITABLE_ROLES } from '../constants/invitations'
import { uuid } from './params'

const asObject = { error: 'Send the fields as a JSON object.' }

export const invitationBodySchema = z.object({
  email: z
    .string({ error: 'Enter the e-mail address to invite.' })
    .trim()
    .toLowerCase()
    .min(1, { error: 'Enter the e-mail address to invite.' })
    .max(254, { error: 'That e-mail address is too long.' })
    .pipe(z.email({ error: 'Enter an e-mail address like name@example.org.' })),
  role: z.enum(INVITABLE_ROLES, { error: 'Choose scrutineer, contest director or organiser.' }),
}, asObject)
export type InvitationInput = z.infer<typeof invitationBodySchema>

/** Two base64url parts: 32 random bytes and their 32-byte signature. */
export const invitationTokenSchema = z
  .string()
  .regex(/^[\w-]{43}\.[\w-]{43}$/, { error: 'This invitation link is not valid.' })

export const invitationTokenParamsSchema = z.object({ token: invitationTokenSchema })

export const invitationParamsSchema = z.object({ competitionId: uuid, invitationId: uuid })

export const membershipParamsSchema = z.object({ competitionId: uuid, membershipId: uuid })

export const reminderRunBodySchema = z.object({
  now: z.iso.datetime({ offset: true, error: 'Give the time as an ISO date-time, e.g. 2027-04-20T08:00:00Z.' }).optional(),
}, asObject)
