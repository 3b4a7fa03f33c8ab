// The organiser's "withdraw for the pilot" form: a reason first, then a confirmation, and only
// then the withdrawal; a changed reason is confirmed again; a refusal shows in the form.
import { describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import EntryWithdrawForm from '~/components/entry/EntryWithdrawForm.vue'

async function mountForm(action: (reason: string) => Promise<void>) {
  return mountSuspended(EntryWithdrawForm, { props: { compId: 'WP', action } })
}

describe('EntryWithdrawForm', () => {
  it('asks for a reason, then for a confirmation, before it withdraws', async () => {
    const action = vi.fn(async () => {})
    const form = await mountForm(action)
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(form.get('#withdraw-reason-error').text()).toContain('Say why the office withdraws this entry: the pilot is told the reason.')
    expect(action).not.toHaveBeenCalled()

    await form.get('#withdraw-reason').setValue('The trailer broke down.')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(form.get('[data-testid="withdraw-confirm"]').text()).toContain('Withdraw WP for good?')
    expect(action).not.toHaveBeenCalled()

    // A changed reason is confirmed again.
    await form.get('#withdraw-reason').setValue('The pilot is ill.')
    expect(form.find('[data-testid="withdraw-confirm"]').exists()).toBe(false)
    await form.get('form').trigger('submit')
    await flushPromises()
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(action).toHaveBeenCalledTimes(1)
    expect(action).toHaveBeenCalledWith('The pilot is ill.')
    form.unmount()
  })

  it('shows the server’s refusal in the form', async () => {
    const refusal = Object.assign(new Error('409'), { statusCode: 409, data: { message: 'This entry is already withdrawn.' } })
    const form = await mountForm(async () => { throw refusal })
    await form.get('#withdraw-reason').setValue('Twice')
    await form.get('form').trigger('submit')
    await flushPromises()
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(form.text()).toContain('This entry is already withdrawn.')
    form.unmount()
  })
})
