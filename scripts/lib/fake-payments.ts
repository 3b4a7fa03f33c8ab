// A local stand-in for the card payment service, on loopback only. It speaks the part of the
// service's HTTP API that the app's SDK client calls (checkout sessions, refunds), serves a
// plain hosted checkout page, and delivers signed webhooks to the app — so `npm start` and
// the tests exercise the real SDK and the real signature check without leaving the machine.
//
// Where webhooks go: to the origin of the session's success_url + /api/payments/webhook
// (the app builds success_url from its own address), unless `webhookUrl` is given. One fake
// serving one app therefore needs no set-up; the app never has to tell the fake anything
// the real service would not hear.
//
// Test hooks (not part of the real API): POST /__test/sessions/:id/pay {cardNumber?} pays
// like the checkout page does and answers JSON; POST /__test/deliver {eventId} delivers an
// event again (a duplicate); GET /__test/events lists what was delivered.
import { createHmac, randomBytes } from 'node:crypto'
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'

export const FAKE_TEST_CARD = '4242 4242 4242 4242'
export const FAKE_DECLINED_CARD = '4000 0000 0000 0002'

export interface FakePaymentsOptions {
  port?: number
  secretKey?: string
  webhookSecret?: string
  /** Overrides the webhook target derived from success_url. */
  webhookUrl?: string
  /** Delay before a refund's webhook goes out, as the real service notifies later. */
  refundWebhookDelayMs?: number
}

interface Session {
  id: string
  object: 'checkout.session'
  url: string | null
  status: 'open' | 'complete' | 'expired'
  payment_status: 'unpaid' | 'paid'
  amount_total: number
  currency: string
  metadata: Record<string, string>
  client_reference_id: string | null
  customer_email: string | null
  payment_intent: string | null
  success_url: string
  cancel_url: string
  mode: string
  created: number
  livemode: false
  line_items_description: string
  /** Not in the real object: kept to address webhooks. */
  _webhook: string
  _paymentIntentMetadata: Record<string, string>
}

interface Charge {
  id: string
  payment_intent: string
  amount: number
  amount_refunded: number
  currency: string
  refunded: boolean
  metadata: Record<string, string>
  sessionId: string
}

interface DeliveredEvent {
  id: string
  type: string
  payload: string
  target: string
  attempts: { status: number | null, at: number }[]
}

export interface FakePayments {
  url: string
  port: number
  secretKey: string
  webhookSecret: string
  events: DeliveredEvent[]
  stop(): Promise<void>
}

const id = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`

/** The SDK's form encoding (`a[b][0][c]=1`) back into nested objects and arrays. */
export function parseForm(body: string): Record<string, unknown> {
  const root: Record<string, unknown> = {}
  for (const [key, value] of new URLSearchParams(body)) {
    const parts = key.replace(/\]/g, '').split('[')
    let node: Record<string, unknown> | unknown[] = root
    parts.forEach((part, i) => {
      const last = i === parts.length - 1
      const nextIsIndex = /^\d+$/.test(parts[i + 1] ?? '')
      const slot = node as Record<string, unknown>
      if (last) slot[part] = value
      else {
        slot[part] ??= nextIsIndex ? [] : {}
        node = slot[part] as Record<string, unknown>
      }
    })
  }
  return root
}

export function signPayload(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`).digest('hex')
  return `t=${timestamp},v1=${signature}`
}

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    let data = ''
    req.setEncoding('utf8')
    req.on('data', (chunk: string) => {
      data += chunk
      if (data.length > 1_000_000) req.destroy()
    })
    req.on('end', () => resolve(data))
    req.on('error', reject)
  })
}

function send(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
  res.writeHead(status, { 'content-type': 'application/json', 'request-id': id('req'), ...headers })
  res.end(JSON.stringify(body))
}

function apiError(res: ServerResponse, status: number, message: string, code?: string, param?: string): void {
  send(res, status, { error: { type: status === 401 ? 'authentication_error' : 'invalid_request_error', message, code, param } })
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)

function formatAmount(minor: number, currency: string): string {
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100)
  }
  catch {
    return `${(minor / 100).toFixed(2)} ${currency.toUpperCase()}`
  }
}

function checkoutPage(session: Session, message?: string): string {
  const amount = formatAmount(session.amount_total, session.currency)
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Card payment — test service</title>
<style>
body{font-family:system-ui,sans-serif;background:#f2f4f7;color:#0e1f3b;margin:0;padding:24px}
main{max-width:420px;margin:0 auto;background:#fff;border-radius:12px;padding:24px;box-shadow:0 2px 8px #0002}
h1{font-size:1.3rem;margin:0 0 4px} .amount{font-size:2rem;font-weight:700;margin:8px 0 16px}
label{display:block;font-weight:600;margin-bottom:6px} input{width:100%;box-sizing:border-box;font-size:1.1rem;padding:12px;border:1px solid #8893a5;border-radius:8px}
.row{display:flex;gap:12px;margin-top:20px} button{flex:1;font-size:1.1rem;padding:12px;border-radius:8px;border:0;cursor:pointer}
.pay{background:#0f766e;color:#fff} .cancel{background:#e5e7eb;color:#0e1f3b}
.note{font-size:.85rem;color:#555;margin-top:16px} .error{background:#fee2e2;color:#7f1d1d;padding:10px;border-radius:8px;margin-bottom:12px}
</style></head><body><main>
<p class="note">Local test payment service — no real money moves.</p>
<h1>${escapeHtml(session.line_items_description)}</h1>
<p class="amount" data-testid="amount">${escapeHtml(amount)}</p>
${message ? `<p class="error" role="alert">${escapeHtml(message)}</p>` : ''}
${session.status === 'open'
  ? `<form method="post" action="/pay/${session.id}">
<label for="card">Card number</label>
<input id="card" name="card_number" inputmode="numeric" autocomplete="cc-number" value="${FAKE_TEST_CARD}">
<p class="note">A card number ending in 0002 is declined.</p>
<div class="row"><button class="cancel" name="action" value="cancel">Cancel</button><button class="pay" name="action" value="pay">Pay ${escapeHtml(amount)}</button></div>
</form>`
  : `<p>This checkout is ${session.status === 'complete' ? 'already paid' : 'no longer open'}.</p>`}
</main></body></html>`
}

export async function startFakePayments(options: FakePaymentsOptions = {}): Promise<FakePayments> {
  const secretKey = options.secretKey ?? `sk_test_local_${randomBytes(12).toString('hex')}`
  const webhookSecret = options.webhookSecret ?? `whsec_local_${randomBytes(16).toString('hex')}`
  const refundDelay = options.refundWebhookDelayMs ?? 150
  const sessions = new Map<string, Session>()
  const charges = new Map<string, Charge>() // by payment intent
  const idempotent = new Map<string, { status: number, body: unknown }>()
  const events: DeliveredEvent[] = []
  const timers = new Set<NodeJS.Timeout>()
  let base = ''

  const publicSession = (s: Session) => {
    const { _webhook: _w, _paymentIntentMetadata: _m, line_items_description: _d, ...rest } = s
    return rest
  }

  async function deliver(event: DeliveredEvent): Promise<number | null> {
    let status: number | null = null
    try {
      const res = await fetch(event.target, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'stripe-signature': signPayload(event.payload, webhookSecret), 'user-agent': 'local-payment-fake/1.0' },
        body: event.payload,
        signal: AbortSignal.timeout(10_000),
      })
      status = res.status
      await res.text()
    }
    catch {
      status = null
    }
    event.attempts.push({ status, at: Date.now() })
    return status
  }

  /** Sends a new event; retries a few times in the background when the app does not take it. */
  async function emit(type: string, object: unknown, target: string): Promise<DeliveredEvent> {
    const evtId = id('evt')
    const payload = JSON.stringify({
      id: evtId,
      object: 'event',
      api_version: '2025-01-01',
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      pending_webhooks: 1,
      type,
      data: { object },
    })
    const event: DeliveredEvent = { id: evtId, type, payload, target, attempts: [] }
    events.push(event)
    const status = await deliver(event)
    if (status === null || status >= 300) {
      let tries = 1
      const retry = () => {
        const t = setTimeout(async () => {
          timers.delete(t)
          const s = await deliver(event)
          if ((s === null || s >= 300) && ++tries < 4) retry()
        }, 500 * tries)
        timers.add(t)
      }
      retry()
    }
    return event
  }

  /** Pays (or declines) a session, as the checkout page's Pay button does. */
  async function pay(session: Session, cardNumber: string): Promise<{ ok: boolean, message?: string, event?: DeliveredEvent }> {
    if (session.status !== 'open') return { ok: false, message: 'This checkout is no longer open.' }
    const digits = cardNumber.replace(/\D/g, '')
    if (digits.length < 12) return { ok: false, message: 'Enter a card number.' }
    if (digits.endsWith('0002')) return { ok: false, message: 'Your card was declined. Try another card.' }
    const pi = id('pi')
    session.status = 'complete'
    session.payment_status = 'paid'
    session.payment_intent = pi
    session.url = null
    charges.set(pi, {
      id: id('ch'), payment_intent: pi, amount: session.amount_total, amount_refunded: 0, currency: session.currency,
      refunded: false, metadata: session._paymentIntentMetadata, sessionId: session.id,
    })
    const event = await emit('checkout.session.completed', publicSession(session), session._webhook)
    return { ok: true, event }
  }

  function createSession(params: Record<string, unknown>, res: ServerResponse): void {
    const successUrl = params.success_url as string | undefined
    const cancelUrl = params.cancel_url as string | undefined
    if (!successUrl) return apiError(res, 400, 'Missing required param: success_url.', 'parameter_missing', 'success_url')
    if (params.mode !== 'payment') return apiError(res, 400, 'Only mode=payment is supported here.', 'parameter_invalid', 'mode')
    const items = Array.isArray(params.line_items) ? params.line_items as Record<string, any>[] : [] // eslint-disable-line @typescript-eslint/no-explicit-any
    if (items.length === 0) return apiError(res, 400, 'Missing required param: line_items.', 'parameter_missing', 'line_items')
    let total = 0
    let currency = ''
    const names: string[] = []
    for (const item of items) {
      const amount = Number(item.price_data?.unit_amount)
      const quantity = Number(item.quantity ?? 1)
      if (!Number.isInteger(amount) || amount < 0) return apiError(res, 400, 'Invalid integer: unit_amount.', 'parameter_invalid_integer', 'line_items[0][price_data][unit_amount]')
      currency = String(item.price_data?.currency ?? '').toLowerCase()
      if (!/^[a-z]{3}$/.test(currency)) return apiError(res, 400, 'Invalid currency.', 'parameter_invalid', 'currency')
      total += amount * quantity
      names.push(String(item.price_data?.product_data?.name ?? 'Payment'))
    }
    let webhook: string
    try {
      webhook = options.webhookUrl ?? new URL('/api/payments/webhook', successUrl).toString()
    }
    catch {
      return apiError(res, 400, 'Invalid URL: success_url.', 'url_invalid', 'success_url')
    }
    const sessionId = id('cs')
    const session: Session = {
      id: sessionId,
      object: 'checkout.session',
      url: `${base}/pay/${sessionId}`,
      status: 'open',
      payment_status: 'unpaid',
      amount_total: total,
      currency,
      metadata: (params.metadata as Record<string, string>) ?? {},
      client_reference_id: (params.client_reference_id as string) ?? null,
      customer_email: (params.customer_email as string) ?? null,
      payment_intent: null,
      success_url: successUrl,
      cancel_url: cancelUrl ?? successUrl,
      mode: 'payment',
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      line_items_description: names.join(', '),
      _webhook: webhook,
      _paymentIntentMetadata: ((params.payment_intent_data as Record<string, unknown>)?.metadata as Record<string, string>) ?? {},
    }
    sessions.set(sessionId, session)
    send(res, 200, publicSession(session))
  }

  function createRefund(params: Record<string, unknown>, res: ServerResponse): void {
    const pi = params.payment_intent as string | undefined
    if (!pi) return apiError(res, 400, 'Missing required param: payment_intent.', 'parameter_missing', 'payment_intent')
    const charge = charges.get(pi)
    if (!charge) return apiError(res, 404, `No such payment_intent: '${pi}'`, 'resource_missing', 'payment_intent')
    const remaining = charge.amount - charge.amount_refunded
    if (remaining <= 0) return apiError(res, 400, `Charge ${charge.id} has already been refunded.`, 'charge_already_refunded')
    const amount = params.amount === undefined ? remaining : Number(params.amount)
    if (!Number.isInteger(amount) || amount <= 0 || amount > remaining) return apiError(res, 400, 'Refund amount is greater than the unrefunded amount.', 'amount_too_large', 'amount')
    charge.amount_refunded += amount
    charge.refunded = charge.amount_refunded >= charge.amount
    const refund = {
      id: id('re'), object: 'refund', amount, currency: charge.currency, payment_intent: pi, charge: charge.id,
      status: 'succeeded', metadata: (params.metadata as Record<string, string>) ?? {}, created: Math.floor(Date.now() / 1000),
    }
    send(res, 200, refund)
    const target = sessions.get(charge.sessionId)?._webhook
    if (target) {
      const { sessionId: _s, ...publicCharge } = charge
      const snapshot = { ...publicCharge, object: 'charge' }
      const t = setTimeout(() => {
        timers.delete(t)
        void emit('charge.refunded', snapshot, target)
      }, refundDelay)
      timers.add(t)
    }
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', base)
    const path = url.pathname
    const body = req.method === 'POST' ? await readBody(req) : ''

    // Hosted checkout page
    const page = path.match(/^\/pay\/([\w]+)$/)
    if (page) {
      const session = sessions.get(page[1]!)
      if (!session) {
        res.writeHead(404, { 'content-type': 'text/html; charset=utf-8' })
        return void res.end('<!doctype html><title>Not found</title><p>No such checkout.</p>')
      }
      if (req.method === 'POST') {
        const form = new URLSearchParams(body)
        if (form.get('action') === 'cancel') {
          res.writeHead(303, { location: session.cancel_url })
          return void res.end()
        }
        const result = await pay(session, form.get('card_number') ?? '')
        if (result.ok) {
          res.writeHead(303, { location: session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id) })
          return void res.end()
        }
        res.writeHead(402, { 'content-type': 'text/html; charset=utf-8' })
        return void res.end(checkoutPage(session, result.message))
      }
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' })
      return void res.end(checkoutPage(session))
    }

    // Test hooks
    if (path.startsWith('/__test/')) {
      const json = body ? JSON.parse(body) as Record<string, string> : {}
      const payHook = path.match(/^\/__test\/sessions\/([\w]+)\/pay$/)
      if (payHook && req.method === 'POST') {
        const session = sessions.get(payHook[1]!)
        if (!session) return send(res, 404, { error: 'no such session' })
        const result = await pay(session, json.cardNumber ?? FAKE_TEST_CARD)
        return send(res, result.ok ? 200 : 402, {
          ok: result.ok, message: result.message, eventId: result.event?.id,
          webhookStatus: result.event?.attempts[0]?.status ?? null, paymentIntent: session.payment_intent,
        })
      }
      if (path === '/__test/deliver' && req.method === 'POST') {
        const event = events.find(e => e.id === json.eventId)
        if (!event) return send(res, 404, { error: 'no such event' })
        return send(res, 200, { eventId: event.id, webhookStatus: await deliver(event) })
      }
      if (path === '/__test/events' && req.method === 'GET') {
        return send(res, 200, { events: events.map(e => ({ id: e.id, type: e.type, target: e.target, attempts: e.attempts, payload: JSON.parse(e.payload) })) })
      }
      return send(res, 404, { error: 'no such test hook' })
    }

    // The API the SDK calls
    if (!path.startsWith('/v1/')) return apiError(res, 404, `Unrecognized request URL (${req.method}: ${path}).`)
    if (req.headers.authorization !== `Bearer ${secretKey}`) return apiError(res, 401, 'Invalid API Key provided.')
    const key = req.headers['idempotency-key']
    const replayKey = typeof key === 'string' ? `${req.method} ${path} ${key}` : undefined
    if (replayKey && idempotent.has(replayKey)) {
      const saved = idempotent.get(replayKey)!
      return send(res, saved.status, saved.body, { 'idempotent-replayed': 'true' })
    }
    if (replayKey) {
      // Remember what is answered for this key, so a retried request gets the same object.
      const original = res.end.bind(res)
      let status = 200
      const writeHead = res.writeHead.bind(res)
      res.writeHead = ((code: number, ...rest: unknown[]) => {
        status = code
        return (writeHead as (...a: unknown[]) => ServerResponse)(code, ...rest)
      }) as typeof res.writeHead
      res.end = ((chunk?: unknown) => {
        if (typeof chunk === 'string' && status < 500) idempotent.set(replayKey, { status, body: JSON.parse(chunk) })
        return original(chunk as string)
      }) as typeof res.end
    }

    const params = parseForm(req.method === 'GET' ? url.search.slice(1) : body)
    if (path === '/v1/checkout/sessions' && req.method === 'POST') return createSession(params, res)
    const one = path.match(/^\/v1\/checkout\/sessions\/([\w]+)$/)
    if (one && req.method === 'GET') {
      const session = sessions.get(one[1]!)
      if (!session) return apiError(res, 404, `No such checkout.session: '${one[1]}'`, 'resource_missing', 'id')
      return send(res, 200, publicSession(session))
    }
    if (path === '/v1/refunds' && req.method === 'POST') return createRefund(params, res)
    return apiError(res, 404, `Unrecognized request URL (${req.method}: ${path}).`)
  }

  const server: Server = createServer((req, res) => {
    handle(req, res).catch((error: Error) => {
      if (!res.headersSent) apiError(res, 500, `The fake payment service failed: ${error.message}`)
      else res.end()
    })
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(options.port ?? 0, '127.0.0.1', () => resolve())
  })
  const port = (server.address() as AddressInfo).port
  base = `http://127.0.0.1:${port}`

  return {
    url: base,
    port,
    secretKey,
    webhookSecret,
    events,
    stop: () => new Promise<void>((resolve) => {
      for (const t of timers) clearTimeout(t)
      server.closeAllConnections()
      server.close(() => resolve())
    }),
  }
}

/** The entry in scripts/lib/services.ts: fixed port 12111 for `npm start`, any free port in tests. */
export const paymentsFake = {
  name: 'local card payment service (fake)',
  async start(options?: { forTests?: boolean }) {
    const fake = await startFakePayments({
      port: options?.forTests ? 0 : Number(process.env.GRIDMARK_PAYMENTS_FAKE_PORT || 12111),
      refundWebhookDelayMs: options?.forTests ? 100 : 500,
    })
    return {
      env: {
        NUXT_PAYMENTS_API_BASE: fake.url,
        NUXT_PAYMENTS_SECRET_KEY: fake.secretKey,
        NUXT_PAYMENTS_WEBHOOK_SECRET: fake.webhookSecret,
        GRIDMARK_PAYMENTS_FAKE_URL: fake.url,
      },
      notes: [`Card payments go to a local test service at ${fake.url} (card ${FAKE_TEST_CARD} pays, one ending in 0002 is declined).`],
      stop: () => fake.stop(),
    }
  },
}
