import { z } from 'zod'
import { signUpSchema } from './auth'

// The account page's bodies: the same name and password rules as sign-up.
const asObject = { error: 'Send the fields as a JSON object.' }

export const accountNameSchema = z.object({
  name: signUpSchema.shape.name,
}, asObject)
export type AccountNameInput = z.infer<typeof accountNameSchema>

export const accountPasswordSchema = z.object({
  currentPassword: z.string({ error: 'Enter your current password.' })
    .min(1, { error: 'Enter your current password.' })
    .max(200, { error: 'Keep the password under 200 characters.' }),
  newPassword: signUpSchema.shape.password,
}, asObject)
export type AccountPasswordInput = z.infer<typeof accountPasswordSchema>

export const accountDeleteSchema = z.object({
  password: z.string({ error: 'Enter your password.' })
    .min(1, { error: 'Enter your password.' })
    .max(200, { error: 'Keep the password under 200 characters.' }),
  confirm: z.string({ error: 'Type the word delete to confirm.' })
    .trim()
    .toLowerCase()
    .refine(v => v === 'delete', { error: 'Type the word delete to confirm.' }),
}, asObject)
export type AccountDeleteInput = z.infer<typeof accountDeleteSchema>

// Bodies of the account's one-time links: password reset, e-mail confirmation, a changed address.
/** 32 random bytes, base64url: what every one-time account link carries. */
export const accountTokenSchema = z
  .string({ error: 'This link is not valid. Copy the whole link from the e-mail, or ask for a new one.' })
  .regex(/^[\w-]{43}$/, { error: 'This link is not valid. Copy the whole link from the e-mail, or ask for a new one.' })

export const passwordResetRequestSchema = z.object({ email: signUpSchema.shape.email }, asObject)
export type PasswordResetRequestInput = z.infer<typeof passwordResetRequestSchema>

export const passwordResetConfirmSchema = z.object({
  token: accountTokenSchema,
  password: signUpSchema.shape.password,
}, asObject)
export type PasswordResetConfirmInput = z.infer<typeof passwordResetConfirmSchema>

export const verificationConfirmSchema = z.object({ token: accountTokenSchema }, asObject)

export const emailChangeSchema = z.object({
  email: signUpSchema.shape.email,
  password: z.string({ error: 'Enter your current password.' }).min(1, { error: 'Enter your current password.' }).max(200),
}, asObject)
export type EmailChangeInput = z.infer<typeof emailChangeSchema>
