import { z } from 'zod'

export const PASSWORD_MIN_LENGTH = 10

const asObject = { error: 'Send the fields as a JSON object.' }

const email = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, { error: 'That e-mail address is too long.' })
  .pipe(z.email({ error: 'Enter an e-mail address like name@example.org.' }))

export const signUpSchema = z.object({
  email,
  name: z
    .string({ error: 'Enter your name.' })
    .trim()
    .min(1, { error: 'Enter your name.' })
    .max(120, { error: 'Keep your name under 120 characters.' }),
  password: z
    .string({ error: 'Choose a password.' })
    .min(PASSWORD_MIN_LENGTH, { error: `Use at least ${PASSWORD_MIN_LENGTH} characters.` })
    .max(200, { error: 'Keep the password under 200 characters.' }),
  /** Where the confirmation link leads after it signs the person in (a path of this site). */
  next: z.string().max(500).regex(/^\/(?![/\\])/, { error: 'Choose a page of this site.' }).optional(),
}, asObject)
export type SignUpInput = z.infer<typeof signUpSchema>

export const signInSchema = z.object({
  email,
  password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(200),
}, asObject)
export type SignInInput = z.infer<typeof signInSchema>
