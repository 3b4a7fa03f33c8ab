import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody, setResponseStatus } from 'h3'
import { flushPromises } from '@vue/test-utils'
import DeskWaiverForm from '~/components/desk/DeskWaiverForm.vue'

const C = '44444444-4444-4444-8444-444444444444'
const E = '55555555-5555-4555-8555-555555555555'
const PATH = `/api/competitions/${C}/entries/${E}/waivers`
const finding = { checkId: 'firmware.expires-soon', unitId: 'unit-1', reason: 'The firmware expires 10 days after the last contest day.' }

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

async function mountForm() {
  const form = await mountSuspended(DeskWaiverForm, { props: { competitionId: C, entryId: E, finding, day: '2026-12-02' }, attachTo: document.body })
  cleanups.push(() => form.unmount())
  return form
}

describe('DeskWaiverForm', () => {
  it('offers this day or the whole competition, and needs a reason before anything is sent', async () => {
    let calls = 0
    cleanups.push(registerEndpoint(PATH, { method: 'POST', handler: () => { calls++; return {} } }))
    const form = await mountForm()
    const scopes = form.findAll('input[type="radio"]')
    expect(scopes.map(r => (r.element as HTMLInputElement).value)).toEqual(['day', 'competition'])
    expect((scopes[0]!.element as HTMLInputElement).checked).toBe(true)
    expect(form.text()).toContain('This day only (Wed 2 Dec)')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(calls).toBe(0)
    const reasonId = form.get('textarea').attributes('id')!
    expect(form.get(`#${reasonId}-error`).text()).toContain('Give a reason')
    expect(form.get('textarea').attributes('aria-invalid')).toBe('true')
  })

  it('sends the finding’s check and unit with the scope chosen and the reason', async () => {
    let sent: unknown
    cleanups.push(registerEndpoint(PATH, { method: 'POST', handler: async (event) => { sent = await readBody(event); return { action: { kind: 'waiver', scope: 'competition' }, tile: null } } }))
    const form = await mountForm()
    await form.findAll('input[type="radio"]')[1]!.setValue(true)
    await form.get('textarea').setValue('Update booked at the annual inspection')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.emitted('done')).toBeTruthy())
    expect(sent).toEqual({ scope: 'competition', checkId: 'firmware.expires-soon', unitId: 'unit-1', reason: 'Update booked at the annual inspection' })
  })

  it('shows the server’s 409 when the finding is no longer open', async () => {
    cleanups.push(registerEndpoint(PATH, {
      method: 'POST',
      handler: (event) => {
        setResponseStatus(event, 409)
        return { statusCode: 409, message: 'That finding is not open on this entry (it may have been fixed or waived already). Reload the entry.' }
      },
    }))
    const form = await mountForm()
    await form.get('textarea').setValue('Accepted for the practice day')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.get('[data-testid="error-summary"]').text()).toContain('That finding is not open on this entry'))
    expect(form.get('[data-testid="error-summary"]').text()).toContain('The finding was not waived')
    expect(form.emitted('done')).toBeUndefined()
  })
})
