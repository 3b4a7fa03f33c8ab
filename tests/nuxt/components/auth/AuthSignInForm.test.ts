import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { createError, setResponseHeader, setResponseStatus, type H3Event } from 'h3'
import { flushPromises } from '@vue/test-utils'
import AuthSignInForm from '~/components/auth/AuthSignInForm.vue'

// Nitro's error JSON carries `message`; plain h3 (used by registerEndpoint) leaves it out.
function nitroError(event: H3Event, statusCode: number, message: string) {
  setResponseStatus(event, statusCode)
  return { statusCode, message }
}

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

async function mountForm() {
  const form = await mountSuspended(AuthSignInForm, { attachTo: document.body })
  cleanups.push(() => form.unmount())
  return form
}

async function fillAndSubmit(form: Awaited<ReturnType<typeof mountForm>>, email: string, password: string) {
  await form.get('#sign-in-email').setValue(email)
  await form.get('#sign-in-password').setValue(password)
  await form.get('form').trigger('submit')
  await flushPromises()
}

describe('AuthSignInForm', () => {
  it('labels each field', async () => {
    const form = await mountForm()
    expect(form.get('label[for="sign-in-email"]').text()).toBe('E-mail address')
    expect(form.get('label[for="sign-in-password"]').text()).toBe('Password')
    expect(form.get('#sign-in-email').attributes('aria-invalid')).toBe('false')
  })

  it('checks the fields with the shared schema before sending anything', async () => {
    let calls = 0
    cleanups.push(registerEndpoint('/api/auth/login', { method: 'POST', handler: () => { calls++; return {} } }))
    const form = await mountForm()
    await fillAndSubmit(form, 'not-an-address', '')

    expect(calls).toBe(0)
    const email = form.get('#sign-in-email')
    expect(email.attributes('aria-invalid')).toBe('true')
    expect(email.attributes('aria-describedby')).toBe('sign-in-email-error')
    expect(form.get('#sign-in-email-error').text()).toContain('Enter an e-mail address like name@example.org.')
    expect(form.get('#sign-in-password-error').text()).toContain('Enter your password.')

    const summary = form.get('[role="alert"]')
    expect(summary.text()).toContain('Enter your password.')
    expect(summary.find('a[href="#sign-in-email"]').exists()).toBe(true)
    expect(document.activeElement).toBe(summary.element)
  })

  it('puts the API’s field errors on the fields they belong to', async () => {
    cleanups.push(registerEndpoint('/api/auth/login', {
      method: 'POST',
      handler: () => {
        throw createError({
          statusCode: 400,
          message: 'Invalid input',
          data: { fieldErrors: { email: ['This address is not accepted here.'] }, formErrors: [] },
        })
      },
    }))
    const form = await mountForm()
    await fillAndSubmit(form, 'pilot@example.org', 'long enough password')

    expect(form.get('#sign-in-email').attributes('aria-invalid')).toBe('true')
    expect(form.get('#sign-in-email-error').text()).toContain('This address is not accepted here.')
    expect(form.get('#sign-in-password').attributes('aria-invalid')).toBe('false')
  })

  it('shows the server’s message for wrong credentials and clears the password', async () => {
    cleanups.push(registerEndpoint('/api/auth/login', {
      method: 'POST',
      handler: event => nitroError(event, 401, 'E-mail or password is wrong.'),
    }))
    const form = await mountForm()
    await fillAndSubmit(form, 'pilot@example.org', 'wrong password')

    expect(form.get('[role="alert"]').text()).toContain('E-mail or password is wrong.')
    expect((form.get('#sign-in-password').element as HTMLInputElement).value).toBe('')
  })

  it('tells how many minutes to wait when sign-ins are throttled', async () => {
    cleanups.push(registerEndpoint('/api/auth/login', {
      method: 'POST',
      handler: (event) => {
        setResponseHeader(event, 'Retry-After', 840)
        return nitroError(event, 429, 'Too many attempts.')
      },
    }))
    const form = await mountForm()
    await fillAndSubmit(form, 'pilot@example.org', 'some password')

    expect(form.get('[role="alert"]').text()).toContain('Try again in 14 minutes.')
  })

  it('marks the button busy while the request is out', async () => {
    let release: (() => void) | undefined
    cleanups.push(registerEndpoint('/api/auth/login', {
      method: 'POST',
      handler: () => new Promise((resolve) => { release = () => resolve({ user: null }) }),
    }))
    cleanups.push(registerEndpoint('/api/me', () => { throw createError({ statusCode: 401 }) }))
    const form = await mountForm()
    await form.get('#sign-in-email').setValue('pilot@example.org')
    await form.get('#sign-in-password').setValue('some password')
    await form.get('form').trigger('submit')
    // The request has reached the server, which holds it.
    await vi.waitFor(() => expect(release).toBeDefined())

    const button = form.get('button[type="submit"]')
    expect(button.attributes('aria-busy')).toBe('true')
    expect(button.text()).toContain('Signing in…')
    release!()
    await vi.waitFor(() => expect(form.get('button[type="submit"]').attributes('aria-busy')).toBeUndefined())
    expect(form.get('button[type="submit"]').text()).not.toContain('Signing in…')
  })
})
