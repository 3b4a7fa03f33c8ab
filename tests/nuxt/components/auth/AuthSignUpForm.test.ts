import { afterEach, describe, expect, it } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { setResponseStatus } from 'h3'
import { flushPromises } from '@vue/test-utils'
import AuthSignUpForm from '~/components/auth/AuthSignUpForm.vue'

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

async function fill(form: Awaited<ReturnType<typeof mountSuspended>>, values: { name: string, email: string, password: string }) {
  await form.get('#sign-up-name').setValue(values.name)
  await form.get('#sign-up-email').setValue(values.email)
  await form.get('#sign-up-password').setValue(values.password)
  await form.get('form').trigger('submit')
  await flushPromises()
}

describe('AuthSignUpForm', () => {
  it('ties the password hint to the field and adds the error after a short password', async () => {
    const form = await mountSuspended(AuthSignUpForm)
    cleanups.push(() => form.unmount())
    expect(form.get('#sign-up-password').attributes('aria-describedby')).toBe('sign-up-password-hint')

    await fill(form, { name: 'Rosa Pilot', email: 'rosa@example.org', password: 'short' })
    const password = form.get('#sign-up-password')
    expect(password.attributes('aria-invalid')).toBe('true')
    expect(password.attributes('aria-describedby')).toBe('sign-up-password-hint sign-up-password-error')
    expect(form.get('#sign-up-password-error').text()).toContain('Use at least 10 characters.')
  })

  it('puts a taken e-mail address (409) on the e-mail field', async () => {
    cleanups.push(registerEndpoint('/api/auth/signup', {
      method: 'POST',
      handler: (event) => {
        setResponseStatus(event, 409)
        return { statusCode: 409, message: 'An account with this e-mail address already exists.' }
      },
    }))
    const form = await mountSuspended(AuthSignUpForm)
    cleanups.push(() => form.unmount())
    await fill(form, { name: 'Rosa Pilot', email: 'rosa@example.org', password: 'a long enough password' })

    expect(form.get('#sign-up-email').attributes('aria-invalid')).toBe('true')
    expect(form.get('#sign-up-email-error').text()).toContain('already exists')
    expect(form.get('[role="alert"] a[href="#sign-up-email"]').text()).toContain('already exists')
  })
})
