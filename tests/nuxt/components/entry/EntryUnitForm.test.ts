import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { getQuery, setResponseStatus } from 'h3'
import { flushPromises } from '@vue/test-utils'
import EntryUnitForm from '~/components/entry/EntryUnitForm.vue'

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})
const competitionId = '44444444-4444-4444-8444-444444444444'

describe('EntryUnitForm', () => {
  it('offers the firmware catalogue’s expiry for the typed model and version, and fills it in one click', async () => {
    cleanups.push(registerEndpoint(`/api/competitions/${competitionId}/firmware/suggest`, {
      method: 'GET',
      handler: (event) => {
        const q = getQuery(event)
        return q.version === '7.22' ? { expiresOn: '2028-03-31', unitFamily: 'CW-2', version: '7.22' } : { expiresOn: null, unitFamily: null, version: null }
      },
    }))
    const form = await mountSuspended(EntryUnitForm, { props: { competitionId, kind: 'collision-warning', action: async () => {} } })
    cleanups.push(() => form.unmount())
    expect(form.find('[data-testid="firmware-caution"]').exists()).toBe(true)
    await form.get('#unit-new-collision-warning-model').setValue('Example CW-2 Pro')
    await form.get('#unit-new-collision-warning-firmwareVersion').setValue('7.22')
    // Asked a moment after typing stops: wait for the offer to appear.
    await vi.waitFor(() => expect(form.find('[data-testid="firmware-suggestion"]').exists()).toBe(true))
    const offer = form.get('[data-testid="firmware-suggestion"]')
    expect(offer.text()).toContain('31 March 2028')
    await offer.get('button').trigger('click')
    expect((form.get('#unit-new-collision-warning-firmwareExpiresOn').element as HTMLInputElement).value).toBe('2028-03-31')
    expect(form.find('[data-testid="firmware-suggestion"]').exists()).toBe(false)
  })

  it('puts a radio ID clash (409) on the radio ID field', async () => {
    cleanups.push(registerEndpoint('/api/test/units', {
      method: 'POST',
      handler: (event) => {
        setResponseStatus(event, 409)
        return { statusCode: 409, message: 'Radio ID 3D2F1A is already used by entry KT — Erin Entrant (G-KTST).' }
      },
    }))
    const form = await mountSuspended(EntryUnitForm, {
      props: { competitionId, kind: 'collision-warning', action: async (body: unknown) => { await $fetch('/api/test/units', { method: 'POST', body: body as Record<string, unknown> }) } },
    })
    cleanups.push(() => form.unmount())
    const p = '#unit-new-collision-warning'
    await form.get(`${p}-model`).setValue('Example CW-2')
    await form.get(`${p}-serial`).setValue('CW-1')
    await form.get(`${p}-radioId`).setValue('3d2f1a')
    await form.get(`${p}-firmwareVersion`).setValue('7.20')
    await form.get(`${p}-firmwareExpiresOn`).setValue('2027-10-31')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(form.get(`${p}-radioId`).attributes('aria-invalid')).toBe('true')
    expect(form.get(`${p}-radioId-error`).text()).toContain('already used by entry KT')
  })
})
