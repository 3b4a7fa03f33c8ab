/* eslint-disable @typescript-eslint/no-explicit-any -- response bodies are what the tests assert */
// Answers go gzipped to a client that takes gzip (server/plugins/compress-answers.ts): a page's
// HTML and the day's pack reach a phone on a weak signal at a fraction of their size, and say
// so (Content-Encoding, Vary); a client that does not take gzip gets them as they are; small
// answers, PDFs and the board's snapshot (gzipped by its own route) are not gzipped again.
// Read with node:http, which, unlike fetch, hands over the bytes as they came.
import { request } from 'node:http'
import { gunzipSync } from 'node:zlib'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { closeTestDb } from '../../../support/db'
import { gridEntry, gridWorld, type GridWorld } from '../../../support/grid'
import { openToday } from '../../../support/board'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let entryId: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Packed Small Cup')
  entryId = await gridEntry(w, { compId: 'Z1' })
  await gridEntry(w, { compId: 'Z2' })
  await openToday(w)
})

interface Raw { status: number, headers: Record<string, string | string[] | undefined>, bytes: Buffer }

function get(path: string, client: GridWorld['scrutineer']['client'], encoding: string, accept = 'application/json'): Promise<Raw> {
  return new Promise((resolve, reject) => {
    const req = request(baseUrl + path, { headers: { 'cookie': client.cookie, 'x-forwarded-for': client.address, accept, 'accept-encoding': encoding } }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, bytes: Buffer.concat(chunks) }))
      res.on('error', reject)
    })
    req.on('error', reject)
    req.end()
  })
}

const varies = (r: Raw) => String(r.headers.vary ?? '').toLowerCase().includes('accept-encoding')

describe('answers gzipped for clients that take gzip', () => {
  it('sends a page’s HTML gzipped, at under half its size, and as it is to a client that does not take gzip', async () => {
    const path = `/competitions/${w.competitionId}/grid`
    const zipped = await get(path, w.scrutineer.client, 'gzip, deflate, br', 'text/html')
    expect(zipped.status).toBe(200)
    expect(zipped.headers['content-encoding']).toBe('gzip')
    expect(zipped.headers['content-type']).toMatch(/^text\/html/)
    expect(varies(zipped)).toBe(true)
    const html = gunzipSync(zipped.bytes).toString('utf8')
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true)
    expect(html).toContain('Packed Small Cup')
    expect(zipped.bytes.length).toBeLessThan(html.length / 2)

    const plain = await get(path, w.scrutineer.client, 'identity', 'text/html')
    expect(plain.status).toBe(200)
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(varies(plain)).toBe(true)
    expect(plain.bytes.toString('utf8').startsWith('<!DOCTYPE html>')).toBe(true)
  })

  it('sends the day’s pack gzipped, the same JSON once unzipped', async () => {
    const path = `${w.base}/grid/pack`
    const zipped = await get(path, w.scrutineer.client, 'gzip')
    const plain = await get(path, w.scrutineer.client, '')
    expect(zipped.status).toBe(200)
    expect(zipped.headers['content-encoding']).toBe('gzip')
    expect(zipped.headers['content-type']).toMatch(/^application\/json/)
    expect(plain.headers['content-encoding']).toBeUndefined()
    const fromZipped = JSON.parse(gunzipSync(zipped.bytes).toString('utf8')) as any
    const fromPlain = JSON.parse(plain.bytes.toString('utf8')) as any
    expect(fromZipped.entries.map((e: any) => e.dossier.entry.compId).sort()).toEqual(['Z1', 'Z2'])
    expect(fromZipped).toEqual({ ...fromPlain, generatedAt: fromZipped.generatedAt })
    expect(zipped.bytes.length).toBeLessThan(plain.bytes.length / 2)
  })

  it('sends a missing page’s HTML readable (the error page is made in-process from the visitor’s headers)', async () => {
    const missing = await get('/no-such-page', w.scrutineer.client, 'gzip', 'text/html')
    expect(missing.status).toBe(404)
    const html = missing.headers['content-encoding'] === 'gzip' ? gunzipSync(missing.bytes).toString('utf8') : missing.bytes.toString('utf8')
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true)
    expect(html).toContain('There is nothing at this address')
  })

  it('leaves a small answer, a PDF and the board’s snapshot (gzipped once, by its route) as they are', async () => {
    const small = await get('/api/health', w.scrutineer.client, 'gzip')
    expect(small.status).toBe(200)
    expect(small.headers['content-encoding']).toBeUndefined()
    expect(JSON.parse(small.bytes.toString('utf8'))).toBeTruthy()

    const pdf = await get(`${w.base}/entries/${entryId}/report.pdf`, w.organiser.client, 'gzip', 'application/pdf')
    expect(pdf.status).toBe(200)
    expect(pdf.headers['content-encoding']).toBeUndefined()
    expect(pdf.bytes.subarray(0, 5).toString()).toBe('%PDF-')

    const board = await get(`${w.base}/board`, w.director.client, 'gzip')
    expect(board.status).toBe(200)
    // Small enough for its route to send it as it is; then this plugin gzips it, once.
    const text = board.headers['content-encoding'] === 'gzip' ? gunzipSync(board.bytes).toString('utf8') : board.bytes.toString('utf8')
    expect((JSON.parse(text) as any).tiles.map((t: any) => t.compId).sort()).toEqual(['Z1', 'Z2'])
  })
})
