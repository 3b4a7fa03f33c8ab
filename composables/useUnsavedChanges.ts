import type { Router } from 'vue-router'

export const UNSAVED_CHANGES_MESSAGE = 'You have changes that are not saved. Leave this page and lose them?'

/** The forms on screen that may hold unsaved work, asked once per navigation. */
interface UnsavedRegistry {
  forms: Set<() => boolean>
}

const REGISTRY = Symbol.for('gridmark.unsaved-changes')

/**
 * One guard for the whole app, installed the first time a form asks: an in-app navigation
 * asks once (however many forms are dirty), and closing or reloading the tab gets the
 * browser's own warning. Kept on the router, so each app (and each test's app) has its own.
 */
function registryOf(router: Router): UnsavedRegistry {
  const holder = router as Router & { [REGISTRY]?: UnsavedRegistry }
  if (holder[REGISTRY]) return holder[REGISTRY]
  const registry: UnsavedRegistry = { forms: new Set() }
  holder[REGISTRY] = registry
  const anyDirty = () => [...registry.forms].some(dirty => dirty())
  router.beforeEach((to, from) => {
    // A change of hash or query on the same page keeps the forms on screen.
    if (to.path === from.path) return true
    if (anyDirty() && !window.confirm(UNSAVED_CHANGES_MESSAGE)) return false
    return true
  })
  window.addEventListener('beforeunload', (event) => {
    if (!anyDirty()) return
    event.preventDefault()
    event.returnValue = '' // older browsers show their warning only with a value set
  })
  return registry
}

/**
 * Warns before a page with unsaved changes is left: in-app navigation asks first, closing
 * the tab gets the browser's warning. `values` reads the form's current values; they are
 * compared with the values when the form appeared (or was last saved: call `saved()`).
 * While `saving` is true (the submit is running, and may navigate on success) nothing asks.
 */
export function useUnsavedChanges(values: () => unknown, options: { saving?: MaybeRefOrGetter<boolean> } = {}) {
  const snapshot = ref(JSON.stringify(values()))
  const dirty = computed(() => JSON.stringify(values()) !== snapshot.value)
  /** The current values are what is saved now. */
  function saved() {
    snapshot.value = JSON.stringify(values())
  }
  const pending = () => dirty.value && !toValue(options.saving)

  if (import.meta.client) {
    const router = useRouter()
    onMounted(() => registryOf(router).forms.add(pending))
    onBeforeUnmount(() => registryOf(router).forms.delete(pending))
  }
  return { dirty, saved }
}
