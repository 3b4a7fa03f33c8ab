import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody, setResponseStatus, type H3Event } from 'h3'
import { flushPromises } from '@vue/test-utils'
import PeopleInviteForm from '~/components/people/PeopleInviteForm.vue'

const COMPETITION = '11111111-1111-4111-8111-111111111111'
const PATH = `/api/competitions/${COMPETITION}/invitations`

function nitroError(event: H3Event, statusCode: number, message: string) {
  setResponseStatus(event, statusCode)
  return { statusCode, message }
}

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

async function mountForm() {
  const form = await mountSuspended(PeopleInviteForm, { props: { competitionId: COMPETITION }, attachTo: document.body })
  cleanups.push(() => form.unmount())
  return form
}

describe('PeopleInviteForm', () => {
  it('labels the address and the role, and offers only the roles an organiser can invite', async () => {
    const form = await mountForm()
    expect(form.get('label[for="invite-email"]').text()).toBe('E-mail address')
    expect(form.get('label[for="invite-role"]').text()).toBe('Role')
    expect(form.findAll('#invite-role option').map(o => o.text())).toEqual(['Scrutineer', 'Contest director', 'Organiser'])
  })

  it('checks the address before sending anything', async () => {
    let calls = 0
    cleanups.push(registerEndpoint(PATH, { method: 'POST', handler: () => { calls++; return {} } }))
    const form = await mountForm()
    await form.get('#invite-email').setValue('nobody')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(calls).toBe(0)
    expect(form.get('#invite-email-error').text()).toContain('Enter an e-mail address like name@example.org.')
  })

  it('sends the address and role, confirms, and clears the field', async () => {
    let sent: unknown
    cleanups.push(registerEndpoint(PATH, { method: 'POST', handler: async (event) => { sent = await readBody(event); return { invitation: {} } } }))
    const form = await mountForm()
    await form.get('#invite-email').setValue('Someone@Example.org ')
    await form.get('#invite-role').setValue('director')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.find('[data-testid="invite-sent"]').exists()).toBe(true))
    expect(sent).toEqual({ email: 'someone@example.org', role: 'director' })
    expect(form.get('[data-testid="invite-sent"]').text()).toBe('Invitation sent to someone@example.org.')
    expect((form.get('#invite-email').element as HTMLInputElement).value).toBe('')
    expect(form.emitted('invited')).toEqual([['someone@example.org']])
  })

  it('puts a refusal of the server on the address field', async () => {
    cleanups.push(registerEndpoint(PATH, { method: 'POST', handler: event => nitroError(event, 409, 'That person already holds this role in this competition.') }))
    const form = await mountForm()
    await form.get('#invite-email').setValue('held@example.org')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.find('#invite-email-error').exists()).toBe(true))
    expect(form.get('#invite-email-error').text()).toContain('already holds this role')
    expect(form.find('[data-testid="invite-sent"]').exists()).toBe(false)
  })
})
