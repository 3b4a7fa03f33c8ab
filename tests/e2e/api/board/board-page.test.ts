// The board's page as the server renders it: the day's tiles arrive drawn with the page (not
// fetched after it has started), the screen says it is connecting, and someone the board is
// not for gets no tile in the page.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { ApiClient } from '../../../support/api'
import { closeTestDb } from '../../../support/db'
import { gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { openToday } from '../../../support/board'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Board Page Cup')
  await gridEntry(w, { compId: 'P1' })
  await gridEntry(w, { compId: 'P2' })
  await openToday(w)
})

/** A plain GET of the page, as a browser sends it, with the client's session. */
async function boardPage(client: ApiClient) {
  const res = await fetch(`${baseUrl}/competitions/${w.competitionId}/board`, {
    headers: { accept: 'text/html', cookie: client.cookie, 'x-forwarded-for': client.address },
    redirect: 'manual',
  })
  return { status: res.status, html: await res.text() }
}
const tileIds = (html: string) => [...html.matchAll(/data-testid="board-tile-cid"[^>]*>([^<]+)</g)].map(m => m[1])

describe('the board page from the server', () => {
  it('arrives with the day’s tiles drawn, connecting', async () => {
    const page = await boardPage(w.director.client)
    expect(page.status).toBe(200)
    expect(tileIds(page.html).sort()).toEqual(['P1', 'P2'])
    expect(page.html).toMatch(/data-testid="board"[^>]*data-loaded="true"/)
    expect(page.html).toMatch(/data-testid="board"[^>]*data-connection="connecting"/)
    expect(page.html).not.toContain('data-testid="board-stale"')
  })

  it('draws no tile for someone the board is not for', async () => {
    const page = await boardPage(w.outsider.client)
    expect(tileIds(page.html)).toEqual([])
  })
})
