import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody, setResponseStatus, type H3Event } from 'h3'
import { flushPromises } from '@vue/test-utils'
import DeskHoldForm from '~/components/desk/DeskHoldForm.vue'

const C = '22222222-2222-4222-8222-222222222222'
const E = '33333333-3333-4333-8333-333333333333'
const base = `/api/competitions/${C}/entries/${E}`

function nitroError(event: H3Event, statusCode: number, message: string) {
  setResponseStatus(event, statusCode)
  return { statusCode, message }
}
const action = (kind: 'hold' | 'release', reason: string) => ({
  action: { id: 'a1', kind, day: '2026-12-02', scope: null, checkId: null, unitId: null, subject: null, reason, finding: null, actor: { id: 'u', name: 'Dana Director' }, at: '2026-12-02T10:00:00.000Z' },
  tile: null,
})

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

async function mountForm(mode: 'hold' | 'release') {
  const form = await mountSuspended(DeskHoldForm, { props: { competitionId: C, entryId: E, mode, compId: 'KM7' }, attachTo: document.body })
  cleanups.push(() => form.unmount())
  return form
}

describe('DeskHoldForm', () => {
  it('asks for a reason before holding, and sends nothing without one', async () => {
    let calls = 0
    cleanups.push(registerEndpoint(`${base}/hold`, { method: 'POST', handler: () => { calls++; return action('hold', 'x') } }))
    const form = await mountForm('hold')
    expect(form.get('label[for="desk-hold-reason"]').text()).toBe('Why is it held?')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(calls).toBe(0)
    expect(form.get('#desk-hold-reason-error').text()).toContain('Give a reason')
    expect(form.get('#desk-hold-reason').attributes('aria-invalid')).toBe('true')
    // Two letters are not a reason either.
    await form.get('#desk-hold-reason').setValue('ok')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(calls).toBe(0)
    expect(form.get('#desk-hold-reason-error').text()).toContain('a few words')
    expect(form.emitted('done')).toBeUndefined()
  })

  it('holds with the reason typed and reports the action', async () => {
    let sent: unknown
    cleanups.push(registerEndpoint(`${base}/hold`, { method: 'POST', handler: async (event) => { sent = await readBody(event); return action('hold', 'Canopy crack') } }))
    const form = await mountForm('hold')
    await form.get('#desk-hold-reason').setValue('  Canopy crack ')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.emitted('done')).toBeTruthy())
    expect(sent).toEqual({ reason: 'Canopy crack' })
    expect((form.emitted('done')![0]![0] as { action: { kind: string } }).action.kind).toBe('hold')
  })

  it('shows the server’s refusal in its own words when no day is open', async () => {
    cleanups.push(registerEndpoint(`${base}/hold`, { method: 'POST', handler: event => nitroError(event, 409, 'No contest day is open. The director opens the day first.') }))
    const form = await mountForm('hold')
    await form.get('#desk-hold-reason').setValue('Canopy crack')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.get('[data-testid="error-summary"]').text()).toContain('No contest day is open.'))
    expect(form.get('[data-testid="error-summary"]').text()).toContain('The glider was not held')
    expect(form.emitted('done')).toBeUndefined()
  })

  it('releases through its own route, and shows a 409 when the glider is not held', async () => {
    let calls = 0
    cleanups.push(registerEndpoint(`${base}/release`, {
      method: 'POST',
      handler: (event) => {
        calls++
        return nitroError(event, 409, 'That glider is not held by the director today, so there is nothing to release. A blocking finding needs a waiver instead.')
      },
    }))
    const form = await mountForm('release')
    expect(form.get('button[type="submit"]').text()).toBe('Release')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(calls).toBe(0)
    expect(form.get('#desk-release-reason-error').text()).toContain('Give a reason')
    await form.get('#desk-release-reason').setValue('Crack taped and inspected')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.get('[data-testid="error-summary"]').text()).toContain('A blocking finding needs a waiver instead.'))
    expect(calls).toBe(1)
  })
})
