// The outbox of grid checks as pure logic over a storage in memory: oldest first, one at a
// time, stop at a failure that may pass later, refusals kept for attention (never dropped).
import { describe, expect, it } from 'vitest'
import { classifySendFailure, drainQueue, type AttentionItem, type QueuedCheck, type QueueStorage } from '~/utils/gridQueue'

function memoryStorage(items: QueuedCheck[]) {
  const queue = new Map(items.map(i => [i.idempotencyKey, i]))
  const attention = new Map<string, AttentionItem>()
  const storage: QueueStorage = {
    queued: async () => [...queue.values()].reverse(), // any order: the logic must sort
    update: async (item) => { queue.set(item.idempotencyKey, item) },
    remove: async (key) => { queue.delete(key) },
    moveToAttention: async (item) => { queue.delete(item.idempotencyKey); attention.set(item.idempotencyKey, item) },
  }
  return { storage, queue, attention }
}

const check = (key: string, queuedAt: string): QueuedCheck => ({
  idempotencyKey: key,
  competitionId: 'c',
  compId: key.toUpperCase(),
  queuedAt,
  attempts: 0,
  body: { idempotencyKey: key, entryId: key, day: '2027-07-13', checkedAt: queuedAt, answers: [] },
})
const failure = (status?: number, message?: string) => Object.assign(new Error('send failed'), { status, message })
const failureOf = (e: unknown) => ({ status: (e as { status?: number }).status, message: (e as { message?: string }).message })

describe('classifySendFailure', () => {
  it('retries no connection, 408, 429 and 5xx; shows every other refusal', () => {
    expect(classifySendFailure(undefined, undefined).kind).toBe('retry')
    for (const s of [408, 429, 500, 502, 503]) expect(classifySendFailure(s, 'x').kind).toBe('retry')
    for (const s of [400, 401, 403, 404, 409, 422]) expect(classifySendFailure(s, 'x')).toEqual({ kind: 'attention', status: s, message: 'x' })
  })
})

describe('drainQueue', () => {
  it('sends oldest first, one at a time, and empties the queue', async () => {
    const { storage, queue } = memoryStorage([check('b', '2027-07-13T10:02:00Z'), check('a', '2027-07-13T10:01:00Z'), check('c', '2027-07-13T10:03:00Z')])
    const order: string[] = []
    let inFlight = 0
    const result = await drainQueue(storage, async (item) => {
      inFlight++
      expect(inFlight).toBe(1)
      order.push(item.idempotencyKey)
      await new Promise(r => setTimeout(r, 2))
      inFlight--
    }, failureOf)
    expect(order).toEqual(['a', 'b', 'c'])
    expect(result).toMatchObject({ sent: ['a', 'b', 'c'], stoppedBy: null, remaining: 0 })
    expect(queue.size).toBe(0)
  })

  it('stops at a network failure and keeps that check and the later ones, in order, for the next run', async () => {
    const { storage, queue } = memoryStorage([check('a', '2027-07-13T10:01:00Z'), check('b', '2027-07-13T10:02:00Z'), check('c', '2027-07-13T10:03:00Z')])
    const tried: string[] = []
    const result = await drainQueue(storage, async (item) => {
      tried.push(item.idempotencyKey)
      if (item.idempotencyKey === 'b') throw failure(undefined)
    }, failureOf)
    expect(tried).toEqual(['a', 'b'])
    expect(result.stoppedBy?.kind).toBe('retry')
    expect(result.remaining).toBe(2)
    expect([...queue.keys()].sort()).toEqual(['b', 'c'])
    expect(queue.get('b')!.attempts).toBe(1)

    const again = await drainQueue(storage, async (item) => { tried.push(item.idempotencyKey) }, failureOf)
    expect(again.sent).toEqual(['b', 'c'])
    expect(tried).toEqual(['a', 'b', 'b', 'c'])
  })

  it('moves a 409 conflict to attention with the server’s words and goes on with the next check', async () => {
    const { storage, queue, attention } = memoryStorage([check('a', '2027-07-13T10:01:00Z'), check('b', '2027-07-13T10:02:00Z')])
    const result = await drainQueue(storage, async (item) => {
      if (item.idempotencyKey === 'a') throw failure(409, 'A different grid check was already recorded under this key.')
    }, failureOf, () => new Date('2027-07-13T10:05:00Z'))
    expect(result.sent).toEqual(['b'])
    expect(queue.size).toBe(0)
    expect(attention.get('a')).toMatchObject({ status: 409, message: 'A different grid check was already recorded under this key.', movedAt: '2027-07-13T10:05:00.000Z', compId: 'A' })
  })

  it('keeps a check the server cannot take now (503) in the queue', async () => {
    const { storage, queue, attention } = memoryStorage([check('a', '2027-07-13T10:01:00Z')])
    const result = await drainQueue(storage, async () => { throw failure(503, 'Gridmark cannot reach its database.') }, failureOf)
    expect(result.stoppedBy).toEqual({ kind: 'retry', status: 503, message: 'Gridmark cannot reach its database.' })
    expect(queue.has('a')).toBe(true)
    expect(attention.size).toBe(0)
  })
})
