// Started by the page's head (nuxt.config.ts, app.head.script), in a worker of its own. A page's
// first date, time or number format in a locale, or first sort by locale, makes the browser load
// that locale's data: some 30–70 ms on a desktop, several times that on a phone. The data is
// shared by the whole browser process, so loading it here, beside the page while its HTML is
// parsed, leaves the page's own first formats a few milliseconds instead of a pause in its start.
// The locales: the app's (en-GB for what people read, en-CA for ISO dates in shared/engine/dates.ts)
// and the browser's own.
const locales = new Set(['en-GB', 'en-CA', ...(self.navigator.languages || [])])
for (const locale of locales) {
  try {
    new Intl.DateTimeFormat(locale, { timeZone: 'Europe/London', dateStyle: 'full', timeStyle: 'long' }).formatToParts(0)
    new Intl.NumberFormat(locale, { maximumFractionDigits: 1 }).format(1.5)
  }
  catch {
    // A locale this browser does not know: the page pays for it itself, as before.
  }
}
try {
  new Intl.Collator('und', { numeric: true, sensitivity: 'base' }).compare('K7', 'K10')
}
catch {
  // As above.
}
self.close()
