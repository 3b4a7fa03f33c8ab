import type { GridCheckBody } from '#shared/schemas/grid'

// The phone's outbox of grid checks, as pure logic over an injected storage (IndexedDB in the
// app, a Map in tests). A check is written here before it is sent; sending goes oldest first,
// one at a time, and stops at the first failure that may pass later (no signal, a busy or
// broken server), so checks reach the server in the order they were made. A refusal the
// scrutineer must see (a 409 replay conflict, any other 4xx but 408 and 429) moves the check to
// "needs attention" with the server's words: nothing is ever dropped silently.

export interface QueuedCheck {
  /** The body's idempotency key: the same check sent twice is stored once. */
  idempotencyKey: string
  competitionId: string
  /** Competition ID of the entry, for the lists on screen. */
  compId: string
  /** The scrutineer who made it: only their session sends it (the server records the sender). */
  userId?: string
  body: GridCheckBody
  queuedAt: string
  attempts: number
  lastError?: string
}

export interface AttentionItem extends QueuedCheck {
  status: number
  message: string
  movedAt: string
}

export interface QueueStorage {
  /** Every queued check (any order). */
  queued: () => Promise<QueuedCheck[]>
  update: (item: QueuedCheck) => Promise<void>
  remove: (idempotencyKey: string) => Promise<void>
  /** Takes the check out of the queue and keeps it in the attention list, in one step. */
  moveToAttention: (item: AttentionItem) => Promise<void>
}

export type SendFailure =
  | { kind: 'attention', status: number, message: string }
  | { kind: 'retry', status?: number, message: string }

const OFFLINE_MESSAGE = 'No connection to the server; the check waits on this phone.'

/** What a failed send means: try again later, or show it to the scrutineer. */
export function classifySendFailure(status: number | undefined, message: string | undefined): SendFailure {
  if (status === undefined || status === 0) return { kind: 'retry', message: OFFLINE_MESSAGE }
  if (status === 408 || status === 429 || status >= 500) {
    return { kind: 'retry', status, message: message || `The server answered ${status}; the check waits and is sent again.` }
  }
  return { kind: 'attention', status, message: message || `The server refused this check (${status}).` }
}

/** Oldest first; the key breaks ties so the order never depends on the storage. */
export function sendOrder(items: readonly QueuedCheck[]): QueuedCheck[] {
  return [...items].sort((a, b) => a.queuedAt.localeCompare(b.queuedAt) || a.idempotencyKey.localeCompare(b.idempotencyKey))
}

export interface DrainResult {
  sent: string[]
  attention: AttentionItem[]
  /** Set when sending stopped at a failure that may pass later. */
  stoppedBy: SendFailure | null
  remaining: number
}

/**
 * Sends the queue in order. `send` resolves when the server stored the check (201, or 200 for a
 * replay of the same check) and throws otherwise; `failureOf` reads status and message from
 * what it threw.
 */
export async function drainQueue(
  storage: QueueStorage,
  send: (item: QueuedCheck) => Promise<unknown>,
  failureOf: (error: unknown) => { status?: number, message?: string },
  now: () => Date = () => new Date(),
): Promise<DrainResult> {
  const order = sendOrder(await storage.queued())
  const result: DrainResult = { sent: [], attention: [], stoppedBy: null, remaining: order.length }
  for (const item of order) {
    try {
      await send(item)
      await storage.remove(item.idempotencyKey)
      result.sent.push(item.idempotencyKey)
      result.remaining--
    }
    catch (error) {
      const { status, message } = failureOf(error)
      const failure = classifySendFailure(status, message)
      if (failure.kind === 'attention') {
        const moved: AttentionItem = { ...item, attempts: item.attempts + 1, status: failure.status, message: failure.message, movedAt: now().toISOString() }
        await storage.moveToAttention(moved)
        result.attention.push(moved)
        result.remaining--
        continue
      }
      await storage.update({ ...item, attempts: item.attempts + 1, lastError: failure.message })
      result.stoppedBy = failure
      break
    }
  }
  return result
}
