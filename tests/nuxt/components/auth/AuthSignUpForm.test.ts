import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody, setResponseStatus } from 'h3'
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

  it('hands on where the confirmation link went, with the page to return to', async () => {
    let received: unknown
    cleanups.push(registerEndpoint('/api/auth/signup', {
      method: 'POST',
      handler: async (event) => {
        received = await readBody(event)
        setResponseStatus(event, 202)
        return { message: 'Check your e-mail: we sent a link to rosa@example.org.' }
      },
    }))
    const form = await mountSuspended(AuthSignUpForm, { props: { next: '/invitations/abc' } })
    cleanups.push(() => form.unmount())
    await fill(form, { name: 'Rosa Pilot', email: 'Rosa@Example.org', password: 'a long enough password' })

    expect(received).toEqual({ name: 'Rosa Pilot', email: 'rosa@example.org', password: 'a long enough password', next: '/invitations/abc' })
    await vi.waitFor(() => expect(form.emitted('signedUp')).toEqual([['Check your e-mail: we sent a link to rosa@example.org.', 'rosa@example.org']]))
  })

  it('shows the server\'s refusal beside the field it names', async () => {
    cleanups.push(registerEndpoint('/api/auth/signup', {
      method: 'POST',
      handler: (event) => {
        setResponseStatus(event, 400)
        return { statusCode: 400, message: 'Some fields need attention.', data: { fieldErrors: { email: ['Enter an e-mail address like name@example.org.'] }, formErrors: [] } }
      },
    }))
    const form = await mountSuspended(AuthSignUpForm)
    cleanups.push(() => form.unmount())
    await fill(form, { name: 'Rosa Pilot', email: 'rosa@example.org', password: 'a long enough password' })

    expect(form.get('#sign-up-email').attributes('aria-invalid')).toBe('true')
    expect(form.get('#sign-up-email-error').text()).toContain('like name@example.org')
  })
})
