// The one SMTP transport of this server process (nodemailer), created on first use from the
// runtime config, and the outbox worker's steps: claim due messages, send, record the result.
import nodemailer, { type Transporter } from 'nodemailer'
import type { Knex } from 'knex'
import type { MailOutboxRow } from '#shared/types/rows'
import { FORGOTTEN_BODY } from '#shared/constants/mail-outbox'

let transport: Transporter | undefined
let transportUrl: string | undefined

/** The configured SMTP URL, or '' when mail is not configured. */
export function smtpUrl(): string {
  return process.env.SMTP_URL || useRuntimeConfig().smtpUrl || ''
}

export function useMailer(): Transporter | undefined {
  const url = smtpUrl()
  if (!url) return undefined
  if (!transport || transportUrl !== url) {
    // The options object form: a second argument to createTransport would be message defaults.
    transport = nodemailer.createTransport({
      url,
      connectionTimeout: 5000,
      greetingTimeout: 5000,
      socketTimeout: 10_000,
    })
    transportUrl = url
  }
  return transport
}

export function closeMailer(): void {
  transport?.close()
  transport = undefined
}

export interface WorkerSettings {
  batchSize: number
  backoffBaseMs: number
  backoffMaxMs: number
  /** How long a claimed message stays reserved for the sender that claimed it. */
  leaseMs: number
}

/** Exponential backoff: base, 2·base, 4·base … up to the cap. */
export function backoffMs(attempts: number, baseMs: number, maxMs: number): number {
  const exponent = Math.max(0, Math.min(attempts - 1, 30))
  return Math.min(maxMs, baseMs * 2 ** exponent)
}

/**
 * Claims up to batchSize due messages: rows locked by another server are skipped, and the
 * claimed ones are pushed out by the lease so no other worker sends them meanwhile.
 */
export async function claimDueMail(db: Knex, settings: WorkerSettings): Promise<MailOutboxRow[]> {
  return db.transaction(async (trx) => {
    const rows: MailOutboxRow[] = await trx('mail_outbox')
      .whereNull('sent_at')
      .where('next_attempt_at', '<=', trx.fn.now())
      .orderBy('next_attempt_at')
      .limit(settings.batchSize)
      .forUpdate()
      .skipLocked()
    if (rows.length) {
      await trx('mail_outbox')
        .whereIn('id', rows.map(r => r.id))
        .update({ next_attempt_at: trx.raw(`now() + (? * interval '1 millisecond')`, [settings.leaseMs]) })
    }
    return rows
  })
}

/** Sends one batch; returns how many were sent and how many failed. */
export async function sendDueMail(db: Knex, mailer: Transporter, from: string, settings: WorkerSettings) {
  const rows = await claimDueMail(db, settings)
  let sent = 0
  let failed = 0
  for (const row of rows) {
    try {
      await mailer.sendMail({
        from,
        to: row.to_address,
        subject: row.subject,
        text: row.text_body,
        html: row.html_body ?? undefined,
        headers: { 'X-Gridmark-Template': row.template, 'X-Gridmark-Outbox-Id': String(row.id) },
      })
      await db('mail_outbox').where({ id: row.id }).update({
        sent_at: db.fn.now(),
        attempts: row.attempts + 1,
        last_error: null,
        // A one-time link leaves the outbox with the message: only the recipient keeps it.
        ...(row.secret_body ? { text_body: FORGOTTEN_BODY, html_body: null } : {}),
      })
      sent++
    }
    catch (error) {
      const attempts = row.attempts + 1
      const delay = backoffMs(attempts, settings.backoffBaseMs, settings.backoffMaxMs)
      await db('mail_outbox').where({ id: row.id }).update({
        attempts,
        last_error: String((error as Error).message ?? error).slice(0, 1000),
        next_attempt_at: db.raw(`now() + (? * interval '1 millisecond')`, [delay]),
      })
      failed++
    }
  }
  return { sent, failed, claimed: rows.length }
}
