import type { z } from 'zod'

/**
 * The submit cycle every form shares: validate with the shared schema, show errors in the
 * summary (focused, so screen readers hear it) and beside each field, keep the button busy
 * while the request runs, and map the API's refusal onto the same places.
 * The form's error summary must carry `ref="summaryBox"`.
 */
export function useSchemaForm<S extends z.ZodType, F extends string>(options: {
  /**
   * The schema, or a loader of it: a form always on a page that must load light passes
   * `() => import('#shared/schemas/…').then(m => m.theSchema)`, and zod is fetched on the first
   * submit instead of with the page.
   */
  schema: S | (() => Promise<S>)
  fields: readonly F[]
  idPrefix: string
  action: (data: z.output<S>) => Promise<void>
  /** Which field a 409 belongs to (e.g. the e-mail address that is taken). */
  conflictField?: F
  onFailure?: () => void
}) {
  const errors = useFormErrors(options.fields, f => `${options.idPrefix}-${f}`)
  const busy = ref(false)
  const summaryBox = useTemplateRef<{ focus: () => void }>('summaryBox')

  async function showSummary() {
    await nextTick()
    summaryBox.value?.focus()
  }

  let loaded: S | undefined = typeof options.schema === 'function' ? undefined : options.schema
  async function schemaOf(): Promise<S> {
    return loaded ??= await (options.schema as () => Promise<S>)()
  }

  async function submit(values: unknown) {
    if (busy.value) return
    errors.clear()
    let schema: S
    try {
      schema = loaded ?? await schemaOf()
    }
    catch (error) {
      // The schema's code could not be fetched: no signal, said as for a failed request.
      errors.fromApi(error)
      return showSummary()
    }
    const parsed = schema.safeParse(values)
    if (!parsed.success) {
      errors.fromZod(parsed.error)
      return showSummary()
    }
    busy.value = true
    try {
      await options.action(parsed.data)
    }
    catch (error) {
      errors.fromApi(error, { conflictField: options.conflictField })
      options.onFailure?.()
      await showSummary()
    }
    finally {
      busy.value = false
    }
  }

  return { ...errors, busy, submit }
}
