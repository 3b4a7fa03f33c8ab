import type { ComputedRef } from 'vue'

/**
 * A parameter of the page's address, fixed for the page's life: another address is another
 * page (Nuxt keys each page by its parameters). Read from the live route instead, a page left
 * before it had loaded (Back pressed on a slow signal) went on reading the next page's address,
 * found nothing under it and replaced that page with "Not found".
 */
export function usePageParam(name: string): ComputedRef<string> {
  const raw = useRoute().params[name]
  const value = String(Array.isArray(raw) ? raw[0] : raw)
  return computed(() => value)
}
