// Every request's arrival instant, before any middleware, for its Server-Timing
// (server/utils/server-timing.ts).
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', markRequestStart)
})
