// Starts the built server (.output) on a free loopback port against the throwaway database
// that `npm test` prepared. Used by the global setup and by tests that restart a server.
import { spawn, type ChildProcess } from 'node:child_process'
import { createServer } from 'node:net'
import { existsSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { newFilesKey } from '../../server/domain/files/file-crypt'

const root = fileURLToPath(new URL('../..', import.meta.url))
const entry = `${root}.output/server/index.mjs`

export interface RunningServer {
  url: string
  port: number
  /** The server process' id (its memory can be read in /proc/<pid>/status). */
  pid: number
  stop: () => Promise<void>
  /** Everything the server printed, for failure messages. */
  output: () => string
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.once('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number }
      srv.close(() => resolve(port))
    })
  })
}

export async function startServer(env: Record<string, string> = {}, port?: number): Promise<RunningServer> {
  if (!existsSync(entry)) throw new Error('No built server in .output: run `npm test`, which builds first.')
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.')
  const listenPort = port ?? await freePort()
  const child: ChildProcess = spawn(process.execPath, [entry], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(listenPort),
      NITRO_HOST: '127.0.0.1',
      NITRO_PORT: String(listenPort),
      // Tests speak for many clients from one machine, as one reverse proxy in front would:
      // the last address of X-Forwarded-For is the client.
      NUXT_TRUSTED_PROXY_HOPS: '1',
      // The test server serves the demo's seed, as npm start does (tests/e2e/production-start.test.ts
      // starts the production way).
      NUXT_DEMO_MODE: 'true',
      // The retention job runs at chosen instants through its admin route, never by the clock.
      NUXT_RETENTION_INTERVAL_MS: '0',
      // `npm test` gives the key the demo's files were sealed under; a server of its own (the
      // bench) seals under a fresh one.
      NUXT_FILES_KEY: process.env.NUXT_FILES_KEY || newFilesKey(),
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  let log = ''
  child.stdout?.on('data', (d) => { log += d })
  child.stderr?.on('data', (d) => { log += d })

  const url = `http://127.0.0.1:${listenPort}`
  const deadline = Date.now() + 30_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`The server exited early:\n${log}`)
    try {
      const res = await fetch(`${url}/api/health`)
      if (res.status === 200) break
    }
    catch { /* not listening yet */ }
    if (Date.now() > deadline) {
      child.kill('SIGKILL')
      throw new Error(`The server did not become healthy in 30 s:\n${log}`)
    }
    await new Promise(r => setTimeout(r, 150))
  }

  return {
    url,
    port: listenPort,
    pid: child.pid!,
    output: () => log,
    stop: () => new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve()
      child.once('exit', () => resolve())
      child.kill('SIGTERM')
      setTimeout(() => child.kill('SIGKILL'), 5000).unref()
    }),
  }
}
