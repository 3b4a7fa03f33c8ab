// A plain link (`<a href>`) followed within the app, as NuxtLink would: a long list of links
// (the launch grid's gliders) renders without a NuxtLink each, whose route resolving and
// watchers cost the phone's start some milliseconds a row. A click asking for another tab or
// window (a modifier key, the middle button) is left to the browser.
export function followInApp(event: MouseEvent, to: string): void {
  if (event.defaultPrevented || event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey) return
  event.preventDefault()
  void navigateTo(to)
}
