// Uploads are streamed to storage: the file goes to a temporary file as it arrives, hashed on
// the way, and is sealed into place only when whole and valid. A server of its own (its own
// uploads and incoming folders, and a pid whose memory can be read) shows that 20 oversize
// uploads at once leave its memory as it was, that /api/health keeps answering quickly during
// a 9 MB upload, that the file is stored intact, and that an aborted upload leaves nothing.
import { createHash } from 'node:crypto'
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fileKeyringFromEnv, open } from '../../../../server/domain/files/file-crypt'
import { MESSAGES } from '../../../../shared/constants/messages'
import type { ApiClient } from '../../../support/api'
import { sendChunked, type ChunkedAnswer, type ChunkedBody } from '../../../support/chunked'
import { closeTestDb, testDb } from '../../../support/db'
import { createEntryVia, entriesWorld, entryBody, type EntriesWorld } from '../../../support/entries'
import { getBytes, postForm, tinyPdf } from '../../../support/files'
import { startServer, type RunningServer } from '../../../support/server'

const MB = 1024 * 1024
/** The header and the integrity tag of a sealed file (server/domain/files/file-crypt.ts). */
const SEALED_OVERHEAD_BYTES = 25 + 16
const BOUNDARY = 'gridmark-stream-boundary'

let server: RunningServer
let folders: { uploads: string, incoming: string }
let w: EntriesWorld
let entryId: string
const docs = () => `/api/competitions/${w.competitionId}/entries/${entryId}/documents`

beforeAll(async () => {
  const root = mkdtempSync(join(tmpdir(), 'gridmark-upload-stream-'))
  folders = { uploads: join(root, 'uploads'), incoming: join(root, 'incoming') }
  // No SMTP and no reminder timer: this second server must not take the shared server's mail.
  server = await startServer({
    NUXT_UPLOADS_DIR: folders.uploads,
    NUXT_UPLOADS_TMP_DIR: folders.incoming,
    NUXT_SMTP_URL: '',
    NUXT_REMINDERS_INTERVAL_MS: '0',
  })
  w = await entriesWorld(server.url, 'Upload Stream Cup')
  entryId = await createEntryVia(w.entrant.client, w.competitionId, entryBody(w.classId))
}, 60_000)

afterAll(async () => {
  await server?.stop()
  if (folders) rmSync(join(folders.uploads, '..'), { recursive: true, force: true })
  await closeTestDb()
})

function rssMegabytes(pid: number): number {
  const kb = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))
  return Number(kb![1]) / 1024
}

const filesIn = (dir: string): string[] => (existsSync(dir) ? readdirSync(dir, { recursive: true, withFileTypes: true }).filter(d => d.isFile()).map(d => d.name) : [])

async function until(what: string, condition: () => boolean | Promise<boolean>, timeoutMs = 10_000): Promise<void> {
  const deadline = Date.now() + timeoutMs
  while (!(await condition())) {
    if (Date.now() > deadline) throw new Error(`Timed out waiting until ${what}`)
    await new Promise(r => setTimeout(r, 25))
  }
}

function formHead(filename: string, type: string): string {
  return `--${BOUNDARY}\r\nContent-Disposition: form-data; name="kind"\r\n\r\ninsurance\r\n`
    + `--${BOUNDARY}\r\nContent-Disposition: form-data; name="expiresOn"\r\n\r\n2030-12-31\r\n`
    + `--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: ${type}\r\n\r\n`
}
const FORM_TAIL = `\r\n--${BOUNDARY}--\r\n`

/** Posts a document form chunked (tests/support/chunked.ts) as `client`, from the app's own origin. */
function postChunked(client: ApiClient, path: string, options: Omit<ChunkedBody, 'headers' | 'head' | 'tail'> & { file: Buffer }) {
  const url = new URL(path, server.url)
  return sendChunked(url.href, {
    ...options,
    headers: {
      'content-type': `multipart/form-data; boundary=${BOUNDARY}`,
      'accept': 'application/json',
      'origin': url.origin,
      'cookie': client.cookie ?? '',
      'x-forwarded-for': client.address,
    },
    head: formHead('scan.pdf', 'application/pdf'),
    tail: FORM_TAIL,
  })
}

const sha256 = (data: Uint8Array) => createHash('sha256').update(data).digest('hex')

describe('oversize uploads at once', () => {
  it('20 simultaneous chunked 30 MB document uploads are each refused with 413 and the server’s memory grows by less than 50 MB', async () => {
    // Warm up the route (code loaded, pools filled) with one refusal, then take the baseline.
    const junk = Buffer.alloc(64 * 1024, 'a')
    junk.write('%PDF-1.4\n')
    const first = await postChunked(w.entrant.client, docs(), { file: junk, totalBytes: 12 * MB })
    expect(first.status).toBe(413)
    const baseline = rssMegabytes(server.pid)

    let peak = baseline
    const sampler = setInterval(() => { peak = Math.max(peak, rssMegabytes(server.pid)) }, 20)
    const answers = await Promise.all(Array.from({ length: 20 }, () =>
      postChunked(w.entrant.client, docs(), { file: junk, totalBytes: 30 * MB }))).finally(() => clearInterval(sampler))
    peak = Math.max(peak, rssMegabytes(server.pid))

    for (const answer of answers) {
      expect(answer.status).toBe(413)
      expect(answer.body.message).toBe(MESSAGES.documentTooLarge)
      expect(answer.finished).toBe(false)
    }
    console.info(`[upload-streaming] RSS ${baseline.toFixed(0)} MB before, ${peak.toFixed(0)} MB at most while 20 × 30 MB were refused`)
    expect(peak - baseline, `RSS went from ${baseline.toFixed(0)} MB to ${peak.toFixed(0)} MB`).toBeLessThan(50)
    // Every refused upload's temporary file is gone, and nothing was stored.
    await until('the incoming folder is empty', () => filesIn(folders.incoming).length === 0)
    expect(filesIn(folders.uploads)).toEqual([])
    expect(await testDb()('documents').where({ entry_id: entryId })).toEqual([])
  }, 120_000)
})

describe('a legitimate 9 MB PDF', () => {
  const pdf = tinyPdf('Insurance certificate', 9 * MB)
  let answer: ChunkedAnswer

  it('uploaded slowly while /api/health is polled: every one of at least 30 polls answers 200 within 100 ms', async () => {
    const latencies: number[] = []
    const timeline: string[] = []
    await (await fetch(`${server.url}/api/health`)).arrayBuffer() // the connection is open before timing
    const t0 = performance.now()
    let uploading = true
    const polling = (async () => {
      while (uploading) {
        const started = performance.now()
        const res = await fetch(`${server.url}/api/health`)
        await res.arrayBuffer()
        latencies.push(performance.now() - started)
        timeline.push(`${(started - t0).toFixed(0)}:${(performance.now() - started).toFixed(0)}`)
        expect(res.status).toBe(200)
      }
    })()
    // 64 KB pieces 5 ms apart: about 150 pieces over a second and more, so polls overlap
    // the whole upload, its end and the server's work once the last byte has arrived.
    answer = await postChunked(w.entrant.client, docs(), { file: pdf, pauseMs: 5 })
    timeline.push(`answered at ${(performance.now() - t0).toFixed(0)}`)
    // A few more polls while the answer's work settles.
    await new Promise(r => setTimeout(r, 200))
    uploading = false
    await polling

    expect(answer.status, JSON.stringify(answer.body)).toBe(201)
    console.info(`[upload-streaming] ${latencies.length} health polls during a 9 MB upload, slowest ${Math.max(...latencies).toFixed(0)} ms`)
    expect(latencies.length).toBeGreaterThanOrEqual(30)
    expect(Math.max(...latencies), `slowest of ${latencies.length} polls ${timeline.join(' ')}`).toBeLessThan(100)
  }, 60_000)

  it('is stored intact: its hash, size and the download are those of the bytes sent, and the upload is audited', async () => {
    expect(answer.body.document).toMatchObject({ sizeBytes: pdf.length, sha256: sha256(pdf), mediaType: 'application/pdf', originalFilename: 'scan.pdf' })
    const download = await getBytes(w.entrant.client, `${docs()}/${answer.body.document.id}/file`)
    expect(download.status).toBe(200)
    expect(download.data.length).toBe(pdf.length)
    expect(sha256(download.data)).toBe(sha256(pdf))
    const row = await testDb()('documents').where({ id: answer.body.document.id }).first()
    expect(row.storage_key.startsWith(`documents:${entryId}:`)).toBe(true)
    // Sealed at rest: what lies on disk opens with the key to the bytes sent (encryption.test.ts).
    const stored = readFileSync(join(folders.uploads, ...row.storage_key.split(':') as string[]))
    expect(stored.length).toBe(pdf.length + SEALED_OVERHEAD_BYTES)
    expect(sha256(open(stored, fileKeyringFromEnv()).data)).toBe(sha256(pdf))
    const audit = await testDb()('audit_log').where({ subject_id: row.id, action: 'document.uploaded' }).first()
    expect(audit.details).toMatchObject({ sha256: sha256(pdf), sizeBytes: pdf.length })
    // The temporary file was not left behind.
    expect(filesIn(folders.incoming)).toEqual([])
  })
})

describe('an aborted upload', () => {
  it('arrives on disk as it streams, and once the client drops the connection leaves no file and no row', async () => {
    const other = await createEntryVia(w.otherEntrant.client, w.competitionId, entryBody(w.classId, { compId: 'ot', pilotName: 'Otto Other', registration: 'G-OTTO' }))
    const pdf = tinyPdf('Never finished', 6 * MB)
    let seenGrowing = false
    const sending = postChunked(w.otherEntrant.client, `/api/competitions/${w.competitionId}/entries/${other}/documents`, {
      file: pdf,
      pauseMs: 5,
      abortAfterBytes: 3 * MB,
    })
    // While the body streams, the file grows in the incoming folder: it is not held in memory.
    await until('the upload appears in the incoming folder', () => {
      const names = filesIn(folders.incoming)
      if (names.length !== 1) return false
      seenGrowing = readFileSync(join(folders.incoming, names[0]!)).length > 256 * 1024
      return seenGrowing
    })
    const aborted = await sending
    expect(aborted.status).toBe(0)
    expect(seenGrowing).toBe(true)
    await until('the incoming folder is empty', () => filesIn(folders.incoming).length === 0)
    expect(filesIn(join(folders.uploads, 'documents', other))).toEqual([])
    expect(await testDb()('documents').where({ entry_id: other })).toEqual([])
    expect(await testDb()('audit_log').where({ action: 'document.uploaded' }).whereRaw(`details->>'entryId' = ?`, [other])).toEqual([])
    // The entry still takes a whole upload afterwards.
    const res = await postForm(w.otherEntrant.client, `/api/competitions/${w.competitionId}/entries/${other}/documents`, { kind: 'insurance', expiresOn: '2030-12-31' }, { name: 'after.pdf', data: tinyPdf('After'), type: 'application/pdf' })
    expect(res.status).toBe(201)
  }, 60_000)
})
