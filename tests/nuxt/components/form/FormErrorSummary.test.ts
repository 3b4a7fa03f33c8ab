import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { flushPromises } from '@vue/test-utils'
import { defineComponent, h, ref } from 'vue'
import FormErrorSummary from '~/components/form/FormErrorSummary.vue'
import FormField from '~/components/form/FormField.vue'
import type { ErrorSummaryItem } from '~/composables/useFormErrors'

// The summary beside real fields (attached to the page), so it can read their labels.
describe('FormErrorSummary', () => {
  it('names the field of every line, from its own label or the one on the page', async () => {
    const items = ref<ErrorSummaryItem[]>([])
    const Host = defineComponent({
      setup: () => () => h('form', [
        h(FormErrorSummary, { items: items.value }),
        h(FormField, { 'id': 'f-span', 'label': 'Span (m)', 'mark': 'submit', 'modelValue': '', 'onUpdate:modelValue': () => {} }),
        h('label', { for: 'f-crew' }, 'Crew (optional)'),
        h('textarea', { id: 'f-crew' }),
      ]),
    })
    const page = await mountSuspended(Host, { attachTo: document.body })
    items.value = [
      { fieldId: 'f-span', message: 'Enter the span as a number.' },
      { fieldId: 'f-crew', message: 'Keep each name under 120 characters.' },
      { fieldId: 'f-other', label: 'Registration', message: 'Enter the registration.' },
      { message: 'Gridmark could not reach its server.' },
    ]
    await flushPromises()
    const lines = page.findAll('[data-testid="error-summary"] li').map(li => li.text())
    expect(lines).toEqual([
      'Span (m): Enter the span as a number.',
      'Crew: Keep each name under 120 characters.',
      'Registration: Enter the registration.',
      'Gridmark could not reach its server.',
    ])
    page.unmount()
  })
})
