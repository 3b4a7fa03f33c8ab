// A local SMTP capture for `npm start` and `npm test`: an SMTP server on loopback that keeps
// every message in memory, and a small web page (plus JSON) where a person or a test reads
// what was sent. An outage switch makes the SMTP side refuse with a temporary failure (451),
// to show that the outbox keeps mail until the relay is back.
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'
import { SMTPServer } from 'smtp-server'
import { simpleParser, type AddressObject } from 'mailparser'

export interface CapturedMessage {
  id: number
  receivedAt: string
  from: string
  to: string[]
  subject: string
  text: string
  html: string | null
  /** Every http(s) address in the text part, in order. */
  links: string[]
  headers: Record<string, string>
}

export interface FakeSmtp {
  smtpPort: number
  httpPort: number
  smtpUrl: string
  pageUrl: string
  messages: CapturedMessage[]
  stop(): Promise<void>
}

const HOST = '127.0.0.1'
/** Messages kept at most; the oldest go first. */
const MAX_MESSAGES = 2000

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(value) ? value : value ? [value] : []
  return list.flatMap(a => a.value.map(v => (v.address ?? '').toLowerCase())).filter(Boolean)
}

function escapeHtml(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')
}

const LINK = /https?:\/\/[^\s<>"')]+/g

/** The text with its addresses turned into links, everything else escaped. */
function linkify(text: string): string {
  let out = ''
  let last = 0
  for (const match of text.matchAll(LINK)) {
    out += escapeHtml(text.slice(last, match.index))
    const url = escapeHtml(match[0])
    out += `<a href="${url}">${url}</a>`
    last = match.index + match[0].length
  }
  return out + escapeHtml(text.slice(last))
}

function page(messages: CapturedMessage[], outage: Outage): string {
  const items = [...messages].reverse().map(m => `
    <article aria-labelledby="m${m.id}">
      <h2 id="m${m.id}">${escapeHtml(m.subject || '(no subject)')}</h2>
      <dl>
        <dt>To</dt><dd>${escapeHtml(m.to.join(', '))}</dd>
        <dt>From</dt><dd>${escapeHtml(m.from)}</dd>
        <dt>Received</dt><dd><time datetime="${m.receivedAt}">${escapeHtml(m.receivedAt.replace('T', ' ').slice(0, 19))} UTC</time></dd>
      </dl>
      <pre>${linkify(m.text)}</pre>
    </article>`).join('\n')
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Captured e-mail</title>
<style>
  body { font-family: system-ui, sans-serif; margin: 0; padding: 16px; background: #f5f7fa; color: #0e1f3b; }
  main { max-width: 760px; margin: 0 auto; }
  article { background: #fff; border-radius: 8px; padding: 16px; margin: 0 0 16px; box-shadow: 0 1px 2px rgba(0,0,0,.08); }
  h1 { font-size: 1.5rem; } h2 { font-size: 1.15rem; margin: 0 0 8px; }
  dl { display: grid; grid-template-columns: max-content 1fr; gap: 2px 12px; margin: 0 0 12px; font-size: .9rem; }
  dt { font-weight: 600; } dd { margin: 0; overflow-wrap: anywhere; }
  pre { white-space: pre-wrap; overflow-wrap: anywhere; font: inherit; margin: 0; }
  a { color: #0f766e; }
  .note { color: #475569; }
</style></head>
<body><main>
<h1>Captured e-mail</h1>
<p class="note">Mail the local Gridmark sent, newest first. Nothing here leaves this machine. ${messages.length} message(s)${outage.down ? ' — <strong>outage simulated: the SMTP side is refusing mail</strong>' : ''}. JSON: <a href="/api/messages">/api/messages</a>.</p>
${items || '<p>No mail yet.</p>'}
</main></body></html>`
}

interface Outage {
  down: boolean
  /** When given, only these recipients are refused (lets one test simulate an outage alone). */
  recipients: string[] | null
}

async function readJson(req: IncomingMessage): Promise<unknown> {
  const chunks: Buffer[] = []
  for await (const chunk of req) chunks.push(chunk as Buffer)
  const raw = Buffer.concat(chunks).toString('utf8')
  return raw ? JSON.parse(raw) : {}
}

function send(res: ServerResponse, status: number, body: unknown, type = 'application/json'): void {
  const text = type === 'application/json' ? JSON.stringify(body) : String(body)
  res.writeHead(status, { 'content-type': `${type}; charset=utf-8`, 'cache-control': 'no-store' })
  res.end(text)
}

function listen(server: Server, port: number): Promise<void> {
  return new Promise((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, HOST, () => {
      server.off('error', reject)
      resolve()
    })
  })
}

export async function startFakeSmtp(options: { smtpPort?: number, httpPort?: number } = {}): Promise<FakeSmtp> {
  const messages: CapturedMessage[] = []
  let nextId = 1
  const outage: Outage = { down: false, recipients: null }

  const refused = (address: string) =>
    outage.down && (outage.recipients === null || outage.recipients.includes(address.toLowerCase()))

  const temporaryFailure = () => Object.assign(new Error('Service temporarily unavailable (simulated outage)'), { responseCode: 451 })

  const smtp = new SMTPServer({
    authOptional: true,
    // nodemailer would try STARTTLS and fail on the missing certificate.
    disabledCommands: ['STARTTLS'],
    banner: 'Gridmark local mail capture',
    logger: false,
    size: 10 * 1024 * 1024,
    onMailFrom(_address, _session, callback) {
      if (outage.down && outage.recipients === null) return callback(temporaryFailure())
      callback()
    },
    onRcptTo(address, _session, callback) {
      if (refused(address.address)) return callback(temporaryFailure())
      callback()
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const text = mail.text ?? ''
          const headers: Record<string, string> = {}
          for (const [key, value] of mail.headers) if (typeof value === 'string') headers[key] = value
          messages.push({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: mail.from?.text ?? '',
            to: addresses(mail.to).length ? addresses(mail.to) : session.envelope.rcptTo.map(r => r.address.toLowerCase()),
            subject: mail.subject ?? '',
            text,
            html: typeof mail.html === 'string' ? mail.html : null,
            links: [...text.matchAll(LINK)].map(m => m[0]),
            headers,
          })
          if (messages.length > MAX_MESSAGES) messages.splice(0, messages.length - MAX_MESSAGES)
          callback()
        })
        .catch((error: Error) => callback(error))
    },
  })

  const http: Server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', `http://${HOST}`)
    const to = url.searchParams.get('to')?.toLowerCase()
    const matches = (m: CapturedMessage) => !to || m.to.includes(to)
    void (async () => {
      if (url.pathname === '/' && req.method === 'GET') return send(res, 200, page(messages, outage), 'text/html')
      if (url.pathname === '/api/messages' && req.method === 'GET') {
        return send(res, 200, [...messages].filter(matches).reverse())
      }
      if (url.pathname === '/api/messages' && req.method === 'DELETE') {
        const kept = messages.filter(m => !matches(m))
        const removed = messages.length - kept.length
        messages.splice(0, messages.length, ...kept)
        return send(res, 200, { removed })
      }
      if (url.pathname === '/api/outage' && req.method === 'GET') return send(res, 200, outage)
      if (url.pathname === '/api/outage' && req.method === 'POST') {
        let body: unknown
        try {
          body = await readJson(req)
        }
        catch {
          return send(res, 400, { message: 'The body is not valid JSON.' })
        }
        const b = body as { down?: unknown, recipients?: unknown }
        if (typeof b.down !== 'boolean') return send(res, 400, { message: 'Send {"down": true} or {"down": false}.' })
        const recipients = Array.isArray(b.recipients) ? b.recipients.map(r => String(r).toLowerCase()) : null
        outage.down = b.down
        outage.recipients = b.down ? recipients : null
        return send(res, 200, outage)
      }
      send(res, 404, { message: 'Nothing here. The captured mail is at /.' })
    })().catch(() => send(res, 500, { message: 'The mail capture failed on this request.' }))
  })

  // A client that hangs up mid-session must not stop the capture.
  smtp.on('error', () => {})
  await listen(smtp.server as unknown as Server, options.smtpPort ?? 0)
  try {
    await listen(http, options.httpPort ?? 0)
  }
  catch (error) {
    await new Promise<void>(resolve => smtp.close(() => resolve()))
    throw error
  }
  const smtpPort = (smtp.server.address() as AddressInfo).port
  const httpPort = (http.address() as AddressInfo).port

  return {
    smtpPort,
    httpPort,
    smtpUrl: `smtp://${HOST}:${smtpPort}`,
    pageUrl: `http://${HOST}:${httpPort}`,
    messages,
    stop: async () => {
      await Promise.all([
        new Promise<void>(resolve => smtp.close(() => resolve())),
        new Promise<void>((resolve) => {
          http.closeAllConnections()
          http.close(() => resolve())
        }),
      ])
    },
  }
}
