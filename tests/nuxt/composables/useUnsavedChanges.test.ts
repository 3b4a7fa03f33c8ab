import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { defineComponent, h, nextTick, ref } from 'vue'
import { UNSAVED_CHANGES_MESSAGE, useUnsavedChanges } from '~/composables/useUnsavedChanges'

// A form in miniature: one value, a saving flag, the composable.
const Form = defineComponent({
  setup() {
    const value = ref('first')
    const saving = ref(false)
    const unsaved = useUnsavedChanges(() => ({ value: value.value.trim() }), { saving })
    return { value, saving, ...unsaved }
  },
  render: () => h('form'),
})

const mounted: { unmount: () => void }[] = []
const originalConfirm = window.confirm
/** The test environment has no dialogs: answer the question as the person would. */
function answerConfirm(answer: boolean) {
  const confirm = vi.fn((_message?: string) => answer)
  window.confirm = confirm
  return confirm
}
afterEach(async () => {
  while (mounted.length) mounted.pop()!.unmount()
  window.confirm = originalConfirm
  await useRouter().replace('/')
})

async function mountForm() {
  const form = await mountSuspended(Form)
  mounted.push(form)
  return form
}

describe('useUnsavedChanges', () => {
  it('is dirty once a value differs from what the form started with, and clean again after saved()', async () => {
    const form = await mountForm()
    expect(form.vm.dirty).toBe(false)
    form.vm.value = 'second'
    await nextTick()
    expect(form.vm.dirty).toBe(true)
    form.vm.value = ' first '
    await nextTick()
    expect(form.vm.dirty).toBe(false) // typed back to what it was
    form.vm.value = 'third'
    form.vm.saved()
    await nextTick()
    expect(form.vm.dirty).toBe(false)
  })

  it('asks before an in-app navigation leaves unsaved changes, and stays when told to', async () => {
    const form = await mountForm()
    const confirm = answerConfirm(false)
    form.vm.value = 'changed'
    await nextTick()
    const router = useRouter()
    await router.push('/sign-in')
    expect(confirm).toHaveBeenCalledWith(UNSAVED_CHANGES_MESSAGE)
    expect(router.currentRoute.value.path).toBe('/')

    answerConfirm(true)
    await router.push('/sign-in')
    expect(router.currentRoute.value.path).toBe('/sign-in')
  })

  it('lets a clean form go without asking, and a saving one too (its save may navigate)', async () => {
    const form = await mountForm()
    const confirm = answerConfirm(false)
    const router = useRouter()
    await router.push('/sign-in')
    expect(router.currentRoute.value.path).toBe('/sign-in')
    await router.replace('/')

    form.vm.value = 'changed'
    form.vm.saving = true
    await nextTick()
    await router.push('/sign-in')
    expect(router.currentRoute.value.path).toBe('/sign-in')
    expect(confirm).not.toHaveBeenCalled()
  })

  it('warns on closing the tab only while changes are unsaved', async () => {
    const form = await mountForm()
    const clean = new Event('beforeunload', { cancelable: true })
    window.dispatchEvent(clean)
    expect(clean.defaultPrevented).toBe(false)
    form.vm.value = 'changed'
    await nextTick()
    const dirty = new Event('beforeunload', { cancelable: true })
    window.dispatchEvent(dirty)
    expect(dirty.defaultPrevented).toBe(true)
  })
})
