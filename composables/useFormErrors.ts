import type { z } from 'zod'
import { MESSAGES } from '#shared/constants/messages'

export interface ErrorSummaryItem {
  /** The id of the field to jump to, or undefined for a whole-form message. */
  fieldId?: string
  /** The field's name as its label shows it; the summary reads it from the label when absent. */
  label?: string
  message: string
}

/**
 * Error state for one form. Client-side zod errors and the API's 400 body share one shape
 * ({ fieldErrors, formErrors }), so both land in the same place and read the same to the user.
 */
export function useFormErrors<F extends string>(fields: readonly F[], fieldId: (field: F) => string, labelOf?: (field: F) => string | undefined) {
  // shallowRef: each update replaces the whole object, and a generic key type survives unwrapping.
  const fieldErrors = shallowRef<Partial<Record<F, string[]>>>({})
  const formErrors = shallowRef<string[]>([])

  const summary = computed<ErrorSummaryItem[]>(() => [
    ...fields.flatMap((f) => {
      const first = fieldErrors.value[f]?.[0]
      return first ? [{ fieldId: fieldId(f), label: labelOf?.(f), message: first }] : []
    }),
    ...formErrors.value.map(message => ({ message })),
  ])
  const hasErrors = computed(() => summary.value.length > 0)

  function clear() {
    fieldErrors.value = {}
    formErrors.value = []
  }

  function set(next: { fieldErrors?: Record<string, string[] | undefined>, formErrors?: string[] }) {
    const known: Partial<Record<F, string[]>> = {}
    const rest: string[] = [...(next.formErrors ?? [])]
    for (const [key, messages] of Object.entries(next.fieldErrors ?? {})) {
      if (!messages?.length) continue
      if ((fields as readonly string[]).includes(key)) known[key as F] = messages
      else rest.push(...messages)
    }
    fieldErrors.value = known
    formErrors.value = rest
  }

  /** A failed safeParse, flattened as z.flattenError does (first path key, else the form's). */
  function fromZod(error: Pick<z.ZodError, 'issues'>) {
    const flat: { formErrors: string[], fieldErrors: Record<string, string[]> } = { formErrors: [], fieldErrors: {} }
    for (const issue of error.issues) {
      const key = issue.path[0]
      if (key === undefined) flat.formErrors.push(issue.message)
      else (flat.fieldErrors[String(key)] ??= []).push(issue.message)
    }
    set(flat)
  }

  /** Maps a failed $fetch to messages. `conflictField` receives a 409's message (e.g. e-mail taken). */
  function fromApi(error: unknown, options: { conflictField?: F, unauthorised?: string } = {}) {
    const status = apiStatus(error)
    const body = apiErrorBody(error)
    const message = typeof body.message === 'string' && body.message ? body.message : undefined
    if (status === undefined) return set({ formErrors: [UI_MESSAGES.offline] })
    if (status === 400 || status === 422) {
      const data = body.data ?? {}
      if (data.fieldErrors || data.formErrors?.length) return set({ fieldErrors: data.fieldErrors, formErrors: data.formErrors })
      return set({ formErrors: [message ?? MESSAGES.unexpected] })
    }
    if (status === 401) return set({ formErrors: [message ?? options.unauthorised ?? MESSAGES.badCredentials] })
    if (status === 409 && options.conflictField) {
      return set({ fieldErrors: { [options.conflictField]: [message ?? MESSAGES.conflict] } })
    }
    if (status === 429) {
      // Worded from Retry-After, not the body, so the minutes are exact whatever the server said.
      const seconds = retryAfterSeconds(error)
      return set({ formErrors: [seconds === undefined ? UI_MESSAGES.tooManyAttemptsLater : MESSAGES.tooManyAttempts(waitMinutes(seconds))] })
    }
    // 503 carries a considered message (e.g. the database is down); other 5xx details stay private.
    if (status >= 500) return set({ formErrors: [status === 503 && message ? message : MESSAGES.unexpected] })
    return set({ formErrors: [message ?? MESSAGES.unexpected] })
  }

  /** aria-describedby / aria-invalid helpers for one field. */
  function errorOf(field: F): string | undefined {
    return fieldErrors.value[field]?.[0]
  }

  return { fieldErrors, formErrors, summary, hasErrors, clear, set, fromZod, fromApi, errorOf }
}
