// The worker's cache of launch-grid pages (nuxt.config.ts, pwa.workbox, which repeats these
// names because its rules are serialised into the worker). It holds the grid pages opened
// online and the grid app shell: a page rendered without any user's or competition's data
// (routeRules, ssr: false) that the worker serves for a grid check or tag link never opened
// online, so the page renders on the phone from the day's pack.
export const GRID_PAGE_CACHE = 'gridmark-grid-pages'
export const GRID_SHELL_PATH = '/grid-shell'

/** Pages rendered for one user must not be shown to the next: sign-out and a change of user drop them. */
export async function forgetGridPages(): Promise<void> {
  if (typeof caches === 'undefined') return
  await caches.delete(GRID_PAGE_CACHE).catch(() => false)
}
