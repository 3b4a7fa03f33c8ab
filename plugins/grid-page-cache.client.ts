import { GRID_PAGE_CACHE, GRID_SHELL_PATH } from '~/utils/gridPageCache'

// Puts the launch-grid pages into the worker's page cache (nuxt.config.ts, pwa.workbox): the
// first page load happens before the worker takes control and in-app navigations never reach
// it, so without this a reload with no signal would find nothing. Same cache name as the
// worker's NetworkFirst rule; the worker then serves these copies when the network is gone.
// With the first grid page of a visit (when the day's pack comes) it also keeps the grid app
// shell, which the worker serves for a grid check or tag link never opened online.
// It also registers the worker (nuxt.config.ts, pwa.client.registerPlugin: false), on the first
// grid page or tag link of a visit: only the scrutineer's phone needs it, and the other pages
// (the wall board, the landing page) carry no worker library and fetch no precache.
const GRID_PAGE = /^\/competitions\/[^/]+\/grid(?:\/|$)|^\/t\//

export default defineNuxtPlugin(() => {
  if (!('serviceWorker' in navigator) || !('caches' in window)) return
  const router = useRouter()
  const ready = navigator.serviceWorker.ready
  let registered = false

  // After the page has loaded and the phone is idle: the worker's install fetches every script
  // of the app, which must not compete with the page the scrutineer is waiting for.
  function register() {
    if (registered) return
    registered = true
    const go = () => navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch(() => {
      // Not allowed here (no https, private mode): the grid works online only.
      registered = false
    })
    const whenIdle = () => ('requestIdleCallback' in window ? requestIdleCallback(() => void go(), { timeout: 3000 }) : setTimeout(() => void go(), 500))
    if (document.readyState === 'complete') whenIdle()
    else window.addEventListener('load', whenIdle, { once: true })
  }
  // Kept again once per visit (it names this build's scripts) and whenever sign-out dropped it.
  let shellFresh = false

  async function put(path: string) {
    try {
      const cache = await caches.open(GRID_PAGE_CACHE)
      const url = new URL(path, location.origin).toString()
      const res = await fetch(url, { credentials: 'same-origin', headers: { accept: 'text/html' } })
      if (res.ok && (res.headers.get('content-type') ?? '').includes('text/html')) await cache.put(url, res)
      return res.ok
    }
    catch {
      // No signal or storage full: the page simply is not kept this time.
      return false
    }
  }

  async function keep(fullPath: string) {
    if (!GRID_PAGE.test(fullPath) || !navigator.onLine) return
    register()
    await ready
    await put(fullPath)
    if (shellFresh && await caches.match(GRID_SHELL_PATH, { cacheName: GRID_PAGE_CACHE })) return
    shellFresh = await put(GRID_SHELL_PATH)
  }

  void keep(router.currentRoute.value.fullPath)
  router.afterEach((to) => { void keep(to.fullPath) })
})
