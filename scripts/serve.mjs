#!/usr/bin/env node
// `npm run serve`: the production start. Runs the built server (`npm run build` first) with
// NODE_ENV=production; it never seeds the demo, migrates DATABASE_URL, and refuses to start
// without its secrets or while an account has the demo password (server/plugins/production-start.ts).
// Plain Node with no dependencies, so a deployment needs only .output and this file.
import { existsSync } from 'node:fs'

const entry = new URL('../.output/server/index.mjs', import.meta.url)

if (!existsSync(entry)) {
  console.error('✖ There is no built server in .output: run `npm run build` first.')
  process.exit(1)
}
if (process.env.NUXT_DEMO_MODE && process.env.NUXT_DEMO_MODE !== 'false') {
  console.error('✖ NUXT_DEMO_MODE is set, but `npm run serve` is the production start: unset it (`npm start` runs the demo).')
  process.exit(1)
}
process.env.NODE_ENV = 'production'
await import(entry.href)
