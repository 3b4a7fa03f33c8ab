// The server's HTML is painted before the app starts on the phone: the app's scripts, once
// loaded, would otherwise run from parsing straight into hydration, and the first paint of a
// page the server has already rendered would wait for them (on a slow phone, a second or more
// of a blank screen). Waiting for the next frame lets the browser paint first; the app then
// starts one frame later. A hidden tab gets no frames: a timer starts it there.
export default defineNuxtPlugin({
  name: 'gridmark:paint-first',
  enforce: 'pre',
  async setup(nuxtApp) {
    if (!nuxtApp.isHydrating) return
    await new Promise<void>((resolve) => {
      const timer = setTimeout(resolve, 100)
      requestAnimationFrame(() => setTimeout(() => {
        clearTimeout(timer)
        resolve()
      }, 0))
    })
  },
})
