import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { signInSchema, signUpSchema } from '#shared/schemas/auth'

describe('signUpSchema', () => {
  it('normalises the e-mail address to trimmed lower case', () => {
    const r = signUpSchema.parse({ email: '  Pilot@Example.ORG ', name: ' Ada ', password: '0123456789' })
    expect(r).toEqual({ email: 'pilot@example.org', name: 'Ada', password: '0123456789' })
  })

  it('refuses a password shorter than 10 characters with a message per field', () => {
    const r = signUpSchema.safeParse({ email: 'not-an-address', name: '', password: '123456789' })
    expect(r.success).toBe(false)
    expect(z.flattenError(r.error!).fieldErrors).toEqual({
      email: ['Enter an e-mail address like name@example.org.'],
      name: ['Enter your name.'],
      password: ['Use at least 10 characters.'],
    })
  })

  it('explains a body that is not an object', () => {
    const r = signUpSchema.safeParse([1, 2])
    expect(z.flattenError(r.error!).formErrors).toEqual(['Send the fields as a JSON object.'])
  })
})

describe('signInSchema', () => {
  it('asks for the missing password', () => {
    const r = signInSchema.safeParse({ email: 'a@b.org' })
    expect(z.flattenError(r.error!).fieldErrors.password).toEqual(['Enter your password.'])
  })
})
