import type { ApiErrorBody } from '#shared/types/api'

// One reading of failed $fetch calls for every form and page, so messages stay consistent.

export function apiStatus(error: unknown): number | undefined {
  if (error && typeof error === 'object') {
    const e = error as { status?: number, statusCode?: number, response?: { status?: number } }
    return e.status ?? e.statusCode ?? e.response?.status
  }
  return undefined
}

export function apiErrorBody(error: unknown): Partial<ApiErrorBody> {
  const data = (error as { data?: unknown } | null)?.data
  return data && typeof data === 'object' ? (data as Partial<ApiErrorBody>) : {}
}

/** Seconds from a Retry-After header (delta-seconds or an HTTP date). */
export function retryAfterSeconds(error: unknown, now = Date.now()): number | undefined {
  const headers = (error as { response?: { headers?: Headers } } | null)?.response?.headers
  const value = headers?.get?.('retry-after')
  if (!value) return undefined
  const seconds = Number(value)
  if (Number.isFinite(seconds)) return Math.max(0, seconds)
  const at = Date.parse(value)
  return Number.isNaN(at) ? undefined : Math.max(0, Math.round((at - now) / 1000))
}

/** Whole minutes to wait, rounded up: "try again in 0 minutes" would invite a failing retry. */
export function waitMinutes(seconds: number): number {
  return Math.max(1, Math.ceil(seconds / 60))
}

// Messages only the browser can produce; the API's own wording lives in shared/constants/messages.ts.
export const UI_MESSAGES = {
  offline: 'Gridmark could not reach its server. Check your connection and try again.',
  tooManyAttemptsLater: 'Too many sign-in attempts. Try again later.',
} as const
