// A body sent chunked (no Content-Length), as a client that does not declare its size would:
// the head, then `file` in `chunkBytes` pieces (repeated until `totalBytes`, `pauseMs` apart),
// then the tail. Sending stops as soon as the server answers; `finished` tells whether the
// whole body went out, `abortAfterBytes` drops the connection midway. Used by the body-limit
// and upload-streaming tests.
import { request, type ClientRequest } from 'node:http'

export interface ChunkedAnswer {
  status: number
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- response bodies are what the tests assert
  body: any
  sentBytes: number
  finished: boolean
}

export interface ChunkedBody {
  headers: Record<string, string>
  head?: string
  tail?: string
  /** What is repeated as the body's middle; 64 KB of 'a' when not given. */
  file?: Buffer
  totalBytes?: number
  chunkBytes?: number
  pauseMs?: number
  abortAfterBytes?: number
  onRequest?: (req: ClientRequest) => void
}

export function sendChunked(url: string, body: ChunkedBody): Promise<ChunkedAnswer> {
  const file = body.file ?? Buffer.alloc(64 * 1024, 'a')
  const chunkBytes = body.chunkBytes ?? 64 * 1024
  const total = body.totalBytes ?? file.length
  return new Promise((resolve, reject) => {
    const target = new URL(url)
    const req = request({ host: target.hostname, port: target.port, path: target.pathname, method: 'POST', headers: body.headers })
    body.onRequest?.(req)
    let sentBytes = 0
    let answered = false
    let finished = false
    req.on('response', (res) => {
      answered = true
      let text = ''
      res.setEncoding('utf8')
      res.on('data', (d) => { text += d })
      res.on('end', () => {
        req.destroy()
        let parsed: unknown = text
        try { parsed = JSON.parse(text) }
        catch { /* not JSON */ }
        resolve({ status: res.statusCode ?? 0, body: parsed, sentBytes, finished })
      })
    })
    req.on('error', (err) => {
      if (answered) return
      if (body.abortAfterBytes !== undefined) resolve({ status: 0, body: null, sentBytes, finished })
      else reject(err)
    })
    const write = (data: Buffer | string) => new Promise<void>(done => (req.write(data) ? done() : req.once('drain', () => done())))
    void (async () => {
      if (body.head) await write(body.head)
      while (!answered && sentBytes < total) {
        if (body.abortAfterBytes !== undefined && sentBytes >= body.abortAfterBytes) {
          req.destroy()
          return
        }
        const offset = sentBytes % file.length
        const piece = file.subarray(offset, Math.min(offset + chunkBytes, file.length, offset + total - sentBytes))
        sentBytes += piece.length
        await write(piece)
        if (body.pauseMs) await new Promise(r => setTimeout(r, body.pauseMs))
      }
      if (!answered) {
        finished = true
        req.end(body.tail ?? '')
      }
    })().catch(reject)
  })
}
