// Where a scan leads on the grid: the server answers when it can; a signal that neither answers
// nor fails hands over to the day's pack after a few seconds instead of leaving the scan hanging.
import { createHash } from 'node:crypto'
import { afterEach, describe, expect, it } from 'vitest'
import { registerEndpoint } from '@nuxt/test-utils/runtime'
import type { GridPack } from '#shared/types/api-grid'
import { resolveGridScan } from '~/utils/gridResolve'

const TOKEN = 'Zy9xWv8uTs7rQp6oNm5lKj4iHg3fEd2cBa1-_zyxwvu'
const COMPETITION = '4b0c7e55-2a61-4f0e-9d3a-8c1e6f2b7a90'
const pack = {
  entries: [{ dossier: { entry: { id: 'entry-k7', compId: 'K7' } }, tag: { shortCode: 'K7MP9RTX', tokenHash: createHash('sha256').update(TOKEN).digest('hex') } }],
} as unknown as GridPack

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

describe('resolveGridScan', () => {
  it('takes the server’s answer when it comes', async () => {
    cleanups.push(registerEndpoint(`/api/tags/${TOKEN}`, () => ({ competitionId: COMPETITION, entryId: 'entry-k7', compId: 'K7' })))
    expect(await resolveGridScan(COMPETITION, `https://grid.example/t/${TOKEN}`, pack, true))
      .toEqual({ ok: true, entryId: 'entry-k7', compId: 'K7', offline: false })
  })

  it('falls back to the day’s pack when the server does not answer at all', async () => {
    let asked = 0
    cleanups.push(registerEndpoint(`/api/tags/${TOKEN}`, () => {
      asked++
      return new Promise(() => { /* a signal that carries nothing back */ })
    }))
    const started = Date.now()
    expect(await resolveGridScan(COMPETITION, `https://grid.example/t/${TOKEN}`, pack, true))
      .toEqual({ ok: true, entryId: 'entry-k7', compId: 'K7', offline: true })
    expect(asked).toBe(1)
    // It waited for the server a while before giving up on it (the timeout, not an error).
    expect(Date.now() - started).toBeGreaterThanOrEqual(3000)
  }, 15_000)
})
