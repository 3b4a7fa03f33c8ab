// Gridmark — Nuxt configuration. The source folder is the project root (srcDir '.'),
// so a stray file under app/ cannot silently move it.
import { fileURLToPath } from 'node:url'

/** V8's explicit compile hint: the first line of a script every function of which runs on load. */
const COMPILE_HINT = '//# allFunctionsCalledOnLoad'

export default defineNuxtConfig({
  srcDir: '.',

  // The server's domain (server/domain/<area>/) is not auto-imported: its modules are
  // imported by name through this alias (vitest.config.ts declares it too).
  alias: {
    '#domain': fileURLToPath(new URL('./server/domain', import.meta.url)),
  },
  compatibilityDate: '2026-11-01',
  devtools: { enabled: false },
  telemetry: false,

  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/eslint', '@vite-pwa/nuxt', 'nuxt-security'],

  // Security headers (docs/concerns.md, "Cross-site requests and security headers"). Pages get a
  // CSP with a fresh nonce for Nuxt's own inline scripts; every answer gets nosniff, a
  // Referrer-Policy and DENY framing. What depends on the request is set per request by
  // server/middleware/same-origin.ts: HSTS only over https (a plain-http airfield LAN must
  // not be told to use https), a CSP for API answers, and the origin check of every write.
  // Off, because the app does each its own way already: the rate and size limits (sign-in
  // limits, bodies limited while they stream), CSRF (the origin check), CORS (no other site
  // may call the API), the XSS "validator" (bodies are checked by zod, text escaped by Vue).
  security: {
    headers: {
      contentSecurityPolicy: {
        'default-src': ['\'self\''],
        'base-uri': ['\'none\''],
        'object-src': ['\'none\''],
        'frame-ancestors': ['\'none\''],
        'form-action': ['\'self\''],
        // Nuxt's inline scripts carry the nonce; what they load is trusted from them on.
        'script-src': ['\'self\'', '\'strict-dynamic\'', '\'nonce-{{nonce}}\''],
        'script-src-attr': ['\'none\''],
        // Vue's style bindings and the scanner's own element styles.
        'style-src': ['\'self\'', '\'unsafe-inline\''],
        // The fonts are bundled; the scanner draws its icons from data: and blob: images.
        'font-src': ['\'self\'', 'data:'],
        'img-src': ['\'self\'', 'data:', 'blob:'],
        'media-src': ['\'self\'', 'blob:'],
        // The board's socket is on this same origin ('self' covers ws: and wss: there).
        'connect-src': ['\'self\''],
        'worker-src': ['\'self\''],
        'manifest-src': ['\'self\''],
        // The document review shows an uploaded PDF in a frame of this origin.
        'frame-src': ['\'self\''],
        'upgrade-insecure-requests': false,
      },
      strictTransportSecurity: false,
      referrerPolicy: 'same-origin',
      xContentTypeOptions: 'nosniff',
      xFrameOptions: 'DENY',
      // Would block the review page's frame of an uploaded PDF (an API answer, without COEP).
      crossOriginEmbedderPolicy: false,
      permissionsPolicy: {
        'camera': ['self'],
        'fullscreen': ['self'],
        'display-capture': [],
        'geolocation': [],
        'microphone': [],
      },
    },
    rateLimiter: false,
    requestSizeLimiter: false,
    xssValidator: false,
    corsHandler: false,
    allowedMethodsRestricter: false,
    csrf: false,
    removeLoggers: false,
  },

  // The app reads the session through its own store (GET /api/me, stores/session.ts); the
  // module's app plugins would fetch it once more in every server render and ship their code
  // to every page. Its server routes and helpers stay.
  auth: { loadStrategy: 'none' },

  // The faces of Barlow the templates use, and no other (tests/unit/font-weights.test.ts): each
  // face is one more download on a weak signal and one more layout of the page as it arrives.
  css: [
    '@fontsource/barlow/400.css',
    '@fontsource/barlow/600.css',
    '@fontsource/barlow/700.css',
    '@fontsource/barlow/800.css',
    '~/assets/css/main.css',
  ],

  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Gridmark',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1, viewport-fit=cover' },
        { name: 'description', content: 'Scrutineering desk for gliding competitions' },
        { name: 'theme-color', content: '#0e1f3b' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
      // The CSP allows no eval. Zod compiles object parsers with `new Function` when it may and
      // probes for it as each schema is built: blocked, the probe is swallowed but still reported
      // as a violation. Told before any module runs (this classic script runs before the deferred
      // module scripts; nuxt-security gives it the page's nonce), zod never tries.
      // The same script starts public/warm-intl.js: the browser's locale data is loaded in a
      // worker while the page is parsed, not in the middle of the app's start (docs/bench.md).
      script: [{ innerHTML: 'globalThis.__zod_globalConfig=Object.assign(globalThis.__zod_globalConfig||{},{jitless:true});try{new Worker(\'/warm-intl.js\')}catch{}', tagPriority: 'critical' }],
    },
  },

  runtimeConfig: {
    // Read at run time from the environment; the start and test scripts set them.
    databaseUrl: '',
    // How many reverse proxies in front of the app append to X-Forwarded-For
    // (server/utils/client-address.ts); 0 believes no header. trustProxy=true is the older switch for one.
    trustedProxyHops: 0,
    trustProxy: false,
    // Card payments (NUXT_PAYMENTS_SECRET_KEY, …_WEBHOOK_SECRET, …_API_BASE). With real keys and
    // no apiBase the SDK talks to the real service; npm start and npm test point apiBase at
    // the local fake. Without a secret key, checkout answers that card payment is not set up.
    payments: { secretKey: '', webhookSecret: '', apiBase: '' },
    // Only failed sign-ins count (server/domain/people/login-limit.ts): per client address, generous
    // since a whole airfield may share one, and per account at one address.
    loginLimit: {
      perAddress: 100,
      perAccountAtAddress: 10,
      windowSeconds: 900,
    },
    // Requests throttled per client address, successful or not.
    signUpLimit: { perAddress: 20, windowSeconds: 3600 },
    passwordResetLimit: { perAddress: 10, windowSeconds: 3600 },
    session: {
      name: 'gridmark-session',
      maxAge: 60 * 60 * 24 * 14,
      // Secure cookies need https or http://127.0.0.1; a plain-http airfield LAN sets
      // NUXT_SESSION_COOKIE_SECURE=false.
      cookie: { secure: true, sameSite: 'lax' as const },
    },
    // E-mail (NUXT_SMTP_URL, NUXT_MAIL_FROM, NUXT_MAIL_WORKER_INTERVAL_MS, …). Without an SMTP
    // URL mail stays queued in the outbox. siteUrl (NUXT_SITE_URL) is the address links in e-mails use;
    // empty means the address the request came in on.
    smtpUrl: '',
    mailFrom: 'Gridmark <no-reply@gridmark.invalid>',
    siteUrl: '',
    /**
     * Signs invitation links (NUXT_INVITATION_SECRET). In production it is required, ≥ 32 characters
     * and unlike the other secrets (server/plugins/production-start.ts); only the demo falls back
     * to the session password.
     */
    invitationSecret: '',
    /** Signs glider tags (NUXT_TAG_SECRET); required in production like the invitation secret. Changing it invalidates every printed tag. */
    tagSecret: '',
    /**
     * Seals every stored file (NUXT_FILES_KEY: 32 random bytes, base64 or hex); required in
     * production, generated into .data/files-key by npm start. NUXT_FILES_OLD_KEYS (comma-separated)
     * keeps files sealed under earlier keys readable until `npm run files:rekey` has moved them.
     */
    filesKey: '',
    filesOldKeys: '',
    /**
     * NUXT_DEMO_MODE=true: the demo's built server (`npm start`, the tests). It skips the checks of
     * a production start and lets tags and invitations fall back to the session password.
     */
    demoMode: false,
    mailWorker: {
      intervalMs: 2000,
      batchSize: 10,
      backoffBaseMs: 30_000,
      backoffMaxMs: 60 * 60 * 1000,
    },
    reminders: {
      /** How often the pre-event reminder job looks for due reminders; 0 turns the timer off. */
      intervalMs: 60 * 60 * 1000,
    },
    retention: {
      /** How often the retention job deletes the document files due (NUXT_RETENTION_INTERVAL_MS); 0 turns the timer off. */
      intervalMs: 60 * 60 * 1000,
    },
  },

  tailwindcss: {
    cssPath: false,
    viewer: false,
  },

  nitro: {
    experimental: { websocket: true },
    // Scripts, styles and fonts are stored gzipped and brotli-compressed beside the originals and
    // served compressed to browsers that accept it: a third of the bytes on a weak signal.
    compressPublicAssets: { gzip: true, brotli: true },
    // Uploaded documents and IGC files; server/plugins/uploads-storage.ts can swap in an
    // S3-compatible bucket at run time.
    storage: {
      uploads: { driver: 'fs', base: './.data/uploads' },
    },
  },

  // The grid app shell (utils/gridPageCache.ts): rendered without the server's data, so it
  // carries no user's or competition's data and renders any grid page on the phone.
  routeRules: {
    '/grid-shell': { ssr: false },
  },

  // The scrutineer's phone works on the grid without signal (../shared/STACK.md, "Offline with
  // @vite-pwa/nuxt in an SSR app"): the worker precaches the built assets and keeps the grid and
  // /t/ pages NetworkFirst, so a reload offline renders from the last copy. There is no SPA
  // index.html to fall back to (navigateFallback: null); every other page stays network-only.
  // plugins/grid-page-cache.client.ts puts pages opened before the worker took control, and
  // in-app navigations, into the same cache, with the grid app shell: a grid page never opened
  // online (a grid check from the day's list, a tag link) gets the shell when there is no
  // signal, and renders from the day's pack (middleware/auth.global.ts lets it, offline).
  pwa: {
    registerType: 'autoUpdate',
    manifest: {
      name: 'Gridmark',
      short_name: 'Gridmark',
      description: 'Scrutineering desk for gliding competitions',
      theme_color: '#0e1f3b',
      background_color: '#f5f3ec',
      display: 'standalone',
      start_url: '/',
      icons: [{ src: '/favicon.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' }],
    },
    workbox: {
      // Registered by plugins/grid-page-cache.client.ts (registerPlugin: false below); a new
      // build's worker takes over at once, as the module's own register plugin would have it.
      skipWaiting: true,
      clientsClaim: true,
      navigateFallback: null,
      globPatterns: ['**/*.{js,css,woff2,svg,webmanifest}'],
      cleanupOutdatedCaches: true,
      runtimeCaching: [{
        // Serialised into the worker: keep it self-contained (no imports, no outer names).
        urlPattern: ({ request, url }) => request.mode === 'navigate'
          && (/^\/competitions\/[^/]+\/grid(?:\/|$)/.test(url.pathname) || url.pathname.startsWith('/t/')),
        handler: 'NetworkFirst',
        options: {
          cacheName: 'gridmark-grid-pages',
          networkTimeoutSeconds: 5,
          expiration: { maxEntries: 300, maxAgeSeconds: 60 * 60 * 24 * 30 },
          cacheableResponse: { statuses: [200] },
          // No network and no copy of this page: the grid app shell, if kept.
          plugins: [{
            handlerDidError: async () => (await caches.match('/grid-shell', { cacheName: 'gridmark-grid-pages' })) ?? undefined,
          }],
        },
      }],
    },
    client: { registerPlugin: false, installPrompt: false, periodicSyncForUpdates: 0 },
    devOptions: { enabled: false },
  },

  typescript: {
    strict: true,
  },

  // Every component is a <script setup>: Vue's Options API support is left out of the bundle.
  // Chunks under 1 KB are merged into others (where that runs no code a page would not run): each
  // script is a request, a round trip on a weak signal, and the entry page asked for 38 (now
  // 28), most of them a few hundred bytes. Larger merges put other pages' code on the board,
  // over its JavaScript budget (docs/bench.md).
  vite: {
    vue: { features: { optionsAPI: false } },
    build: { rollupOptions: { output: { experimentalMinChunkSize: 1024 } } },
  },

  // Nothing is fetched ahead of need on a weak signal (issue "On the field", the JavaScript
  // budget): a link loads its page's code when touched or focused, not when it scrolls into
  // view, and the server's HTML names no chunk for later (`prefetch`), such as the camera
  // scanner's library. The offline worker still precaches every chunk once it is installed.
  experimental: {
    defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } },
  },

  hooks: {
    // V8's compile hint on the app's scripts: a script marked so is compiled whole on a background
    // thread while it downloads, instead of function by function on the page's main thread as
    // each is first called (some 130 ms of a grid page's start on this machine; docs/bench.md).
    // Nearly all of these scripts run as their page starts. Not the camera scanner's library,
    // loaded when the camera opens and mostly formats the tags never use; not scripts under
    // 8 KB, which compile in a few milliseconds at most and whose hint (some 20 bytes gzipped
    // each) would cost more on the wire than it saves: the board loads fourteen of them, and is
    // some 0.1 KB under its JavaScript budget. Browsers without the hint read a comment.
    'vite:extendConfig'(config, { isClient }) {
      if (!isClient) return
      const plugins = (config.plugins ?? []) as unknown[]
      plugins.push({
        name: 'gridmark:compile-hints',
        apply: 'build',
        enforce: 'post',
        // Last, after the bundler's own additions to a chunk's head: the hint must be its first
        // line (a client source map, when one is made for profiling, is then one line off).
        generateBundle: {
          order: 'post',
          handler(_: unknown, bundle: Record<string, { type: string, code?: string, moduleIds?: string[] }>) {
            for (const chunk of Object.values(bundle)) {
              if (chunk.type !== 'chunk' || (chunk.code?.length ?? 0) < 8192) continue
              if (chunk.moduleIds?.some(id => id.includes('/node_modules/html5-qrcode/'))) continue
              chunk.code = `${COMPILE_HINT}\n${chunk.code}`
            }
          },
        },
      })
      ;(config as { plugins?: unknown[] }).plugins = plugins
    },
    'build:manifest'(manifest) {
      for (const chunk of Object.values(manifest)) chunk.prefetch = false
    },
    // With Nitro's websockets on, nuxt-auth-utils adds a server plugin that reads the session on
    // every request (for crossws handlers, which we do not use: the board's socket handshake
    // reads the session itself, server/plugins/socket-io.ts). It cost every request a key
    // derivation, and sealed and set a fresh cookie on every anonymous one (a health check, a
    // tag link). Routes read the session where they need it, through requireUser.
    'nitro:config'(config) {
      config.plugins = (config.plugins ?? []).filter(p => !p || !/nuxt-auth-utils[\\/].*[\\/]server[\\/]plugins[\\/]ws/.test(p))
    },
  },

  eslint: {
    config: { stylistic: false },
  },
})
