// Puts the launch-grid pages into the worker's page cache (nuxt.config.ts, pwa.workbox): the
// first page load happens before the worker takes control and in-app navigations never reach
// it, so without this a reload with no signal would find nothing. Same cache name as the
// worker's NetworkFirst rule; the worker then serves these copies when the network is gone.
export const GRID_PAGE_CACHE = 'gridmark-grid-pages'
const GRID_PAGE = /^\/competitions\/[^/]+\/grid(?:\/|$)|^\/t\//

export default defineNuxtPlugin(() => {
  if (!('serviceWorker' in navigator) || !('caches' in window)) return
  const router = useRouter()
  const ready = navigator.serviceWorker.ready

  async function keep(fullPath: string) {
    if (!GRID_PAGE.test(fullPath) || !navigator.onLine) return
    await ready
    try {
      const cache = await caches.open(GRID_PAGE_CACHE)
      const url = new URL(fullPath, location.origin).toString()
      const res = await fetch(url, { credentials: 'same-origin', headers: { accept: 'text/html' } })
      if (res.ok && (res.headers.get('content-type') ?? '').includes('text/html')) await cache.put(url, res)
    }
    catch {
      // No signal or storage full: the page simply is not kept this time.
    }
  }

  void keep(router.currentRoute.value.fullPath)
  router.afterEach((to) => { void keep(to.fullPath) })
})
