// The local SMTP capture as one of the services `npm start` and `npm test` run beside the app.
// npm start: fixed ports (SMTP 2525, page 3025; MAIL_CAPTURE_SMTP_PORT / MAIL_CAPTURE_PORT
// override). npm test: free ports, a quick mail worker and no reminder timer (tests run the
// reminder job through its admin route).
import { ScriptError } from './common'
import { startFakeSmtp } from './fake-smtp'
import type { LocalService } from './services'

function portFrom(name: string, fallback: number): number {
  const raw = process.env[name]
  if (raw === undefined || raw === '') return fallback
  const port = Number(raw)
  if (!Number.isInteger(port) || port < 1 || port > 65535) throw new ScriptError(`${name}=${raw} is not a valid port number.`)
  return port
}

export const mailCapture: LocalService = {
  name: 'local mail capture',
  async start(options = {}) {
    const smtpPort = options.forTests ? 0 : portFrom('MAIL_CAPTURE_SMTP_PORT', 2525)
    const httpPort = options.forTests ? 0 : portFrom('MAIL_CAPTURE_PORT', 3025)
    let fake
    try {
      fake = await startFakeSmtp({ smtpPort, httpPort })
    }
    catch (error) {
      throw new ScriptError(`The local mail capture could not listen on 127.0.0.1 (SMTP ${smtpPort}, page ${httpPort}): ${(error as Error).message}. `
        + 'Stop the program using the port, or set MAIL_CAPTURE_SMTP_PORT / MAIL_CAPTURE_PORT.', { cause: error })
    }
    const env: Record<string, string> = {
      NUXT_SMTP_URL: fake.smtpUrl,
      MAIL_CAPTURE_URL: fake.pageUrl,
    }
    if (process.env.NUXT_MAIL_FROM) env.NUXT_MAIL_FROM = process.env.NUXT_MAIL_FROM
    if (options.forTests) {
      Object.assign(env, {
        NUXT_MAIL_WORKER_INTERVAL_MS: '250',
        NUXT_MAIL_WORKER_BACKOFF_BASE_MS: '1000',
        NUXT_MAIL_WORKER_BACKOFF_MAX_MS: '4000',
        NUXT_REMINDERS_INTERVAL_MS: '0',
      })
    }
    return {
      env,
      notes: [`Captured e-mail: ${fake.pageUrl}`],
      stop: () => fake.stop(),
    }
  },
}
