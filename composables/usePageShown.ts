/**
 * Whether the browser is still on this page: a page's own load error is shown full-screen
 * (`fatal`) only then. A page left while it loaded (Back on a slow signal) throws it from a
 * setup no one is waiting for any more; fatal, it replaced the next page with this one's
 * "Not found". Call before the page's first `await`, while the route is still its own.
 */
export function usePageShown(): () => boolean {
  const path = useRoute().path
  const router = useRouter()
  return () => router.currentRoute.value.path === path
}
