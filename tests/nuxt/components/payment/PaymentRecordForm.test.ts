import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody } from 'h3'
import { flushPromises } from '@vue/test-utils'
import PaymentRecordForm from '~/components/payment/PaymentRecordForm.vue'

const C = '44444444-4444-4444-8444-444444444444'
const E = '55555555-5555-4555-8555-555555555555'
const PATH = `/api/competitions/${C}/entries/${E}/payments`

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

async function mountForm() {
  const form = await mountSuspended(PaymentRecordForm, { props: { competitionId: C, entryId: E, currency: 'EUR', today: '2027-03-03', owedMinor: 32050 }, attachTo: document.body })
  cleanups.push(() => form.unmount())
  return form
}

describe('PaymentRecordForm', () => {
  it('starts with a bank transfer of what is owed, dated today, and needs its reference before sending', async () => {
    let calls = 0
    cleanups.push(registerEndpoint(PATH, { method: 'POST', handler: () => { calls++; return {} } }))
    const form = await mountForm()
    expect((form.get('select').element as HTMLSelectElement).value).toBe('bank-transfer')
    const amount = form.get('input[inputmode="decimal"]')
    expect((amount.element as HTMLInputElement).value).toBe('320.50')
    expect((form.get('input[type="date"]').element as HTMLInputElement).value).toBe('2027-03-03')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(calls).toBe(0)
    expect(form.get('[data-testid="error-summary"]').text()).toContain('Give the bank transfer’s reference')
  })

  it('asks for a reason instead of a reference when the fee is waived', async () => {
    const form = await mountForm()
    await form.get('select').setValue('waived')
    expect(form.text()).toContain('Why is the fee waived?')
    expect(form.find('textarea').exists()).toBe(true)
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(form.get('[data-testid="error-summary"]').text()).toContain('Give the reason the fee is waived')
  })

  it('sends cash in minor units with the receipt number and a submission key, then says it is done', async () => {
    let sent: Record<string, unknown> = {}
    cleanups.push(registerEndpoint(PATH, { method: 'POST', handler: async (event) => {
      sent = await readBody(event)
      return { created: true, payment: { id: 'p1', method: 'cash', amountMinor: 10000, currency: 'EUR' } }
    } }))
    const form = await mountForm()
    await form.get('select').setValue('cash')
    await form.get('input[inputmode="decimal"]').setValue('100')
    await form.findAll('input[type="text"]').at(-1)!.setValue('R-0117')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.emitted('done')).toBeTruthy())
    expect(sent).toMatchObject({ method: 'cash', amountMinor: 10000, date: '2027-03-03', reference: 'R-0117' })
    expect(String(sent.idempotencyKey)).toMatch(/^[\w-]{8,}$/)
  })
})
