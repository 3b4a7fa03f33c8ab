// The outbox worker: every few seconds it sends the messages that are due and reschedules
// failures with exponential backoff, so mail queued while SMTP is down goes out later.
// Without an SMTP URL (it is read once, at start) it says so once and leaves the mail queued:
// it does not poll the outbox at all.
import { closeMailer, sendDueMail, useMailer } from '#domain/mail/transport'

export default defineNitroPlugin((nitroApp) => {
  const config = useRuntimeConfig()
  const cfg = config.mailWorker
  const intervalMs = Number(cfg.intervalMs) || 2000
  const settings = {
    batchSize: Number(cfg.batchSize) || 10,
    backoffBaseMs: Number(cfg.backoffBaseMs) || 30_000,
    backoffMaxMs: Number(cfg.backoffMaxMs) || 3_600_000,
    leaseMs: 120_000,
  }
  const from = config.mailFrom || 'Gridmark <no-reply@gridmark.invalid>'

  let stopped = false
  let timer: ReturnType<typeof setTimeout> | undefined
  let running: Promise<void> | undefined
  let lastError = ''

  if (!useMailer()) {
    console.warn('[gridmark] no SMTP URL configured (NUXT_SMTP_URL): e-mail stays queued in the outbox')
    return
  }

  const tick = async () => {
    const mailer = useMailer()!
    try {
      // Keep going while full batches come back, so a backlog drains quickly.
      for (;;) {
        const result = await sendDueMail(useDb(), mailer, from, settings)
        if (stopped || result.claimed < settings.batchSize) break
      }
      lastError = ''
    }
    catch (error) {
      // Typically the database is not reachable yet; try again on the next tick.
      const message = (error as Error).message
      if (message !== lastError) console.warn(`[gridmark] mail worker: ${message}`)
      lastError = message
    }
  }

  const schedule = () => {
    if (stopped) return
    timer = setTimeout(() => {
      running = tick().finally(() => {
        running = undefined
        schedule()
      })
    }, intervalMs)
  }
  schedule()

  nitroApp.hooks.hook('close', async () => {
    stopped = true
    clearTimeout(timer)
    await running
    closeMailer()
  })
})
