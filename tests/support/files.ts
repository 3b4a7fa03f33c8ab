// Helpers for the files area's tests: multipart uploads through a signed-in ApiClient, tiny
// valid PDF / PNG / JPEG files made in code, the IGC fixtures, and the uploads folder.
import { randomBytes } from 'node:crypto'
import { readFileSync, readdirSync, existsSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { ApiClient, ApiResponse } from './api'

const root = fileURLToPath(new URL('../..', import.meta.url))

/** Sends a multipart form as a browser would, with the client's cookie and address. */
export async function postForm(
  client: ApiClient,
  path: string,
  fields: Record<string, string>,
  file?: { name: string, data: Uint8Array, type?: string },
): Promise<ApiResponse> {
  const form = new FormData()
  for (const [k, v] of Object.entries(fields)) form.append(k, v)
  if (file) form.append('file', new Blob([file.data as BlobPart], { type: file.type ?? 'application/octet-stream' }), file.name)
  const headers: Record<string, string> = { 'x-forwarded-for': client.address, 'accept': 'application/json' }
  if (client.cookie) headers.cookie = client.cookie
  const res = await fetch(client.baseUrl + path, { method: 'POST', headers, body: form })
  const text = await res.text()
  let body: unknown = text
  try { body = JSON.parse(text) }
  catch { /* not JSON */ }
  return { status: res.status, headers: res.headers, body }
}

/** GET returning the raw bytes (for downloads). */
export async function getBytes(client: ApiClient, path: string): Promise<{ status: number, headers: Headers, data: Buffer }> {
  const headers: Record<string, string> = { 'x-forwarded-for': client.address }
  if (client.cookie) headers.cookie = client.cookie
  const res = await fetch(client.baseUrl + path, { headers })
  return { status: res.status, headers: res.headers, data: Buffer.from(await res.arrayBuffer()) }
}

/**
 * A one-page PDF, small but well formed, so a browser's viewer can open it. With `padBytes`,
 * it also carries an unreferenced stream of that many random bytes (a large scan's weight).
 */
export function tinyPdf(text = 'Test document', padBytes = 0): Buffer {
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 300 200] /Contents 4 0 R /Resources << /Font << /F1 5 0 R >> >> >>',
    '',
    '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>',
  ]
  const stream = `BT /F1 18 Tf 30 100 Td (${text.replace(/[()\\]/g, '')}) Tj ET`
  objects[3] = `<< /Length ${stream.length} >>\nstream\n${stream}\nendstream`
  if (padBytes > 0) {
    const pad = randomBytes(padBytes).toString('latin1')
    objects.push(`<< /Length ${pad.length} >>\nstream\n${pad}\nendstream`)
  }
  let out = '%PDF-1.4\n'
  const offsets: number[] = []
  objects.forEach((body, i) => {
    offsets.push(out.length)
    out += `${i + 1} 0 obj\n${body}\nendobj\n`
  })
  const xref = out.length
  out += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`
  for (const o of offsets) out += `${String(o).padStart(10, '0')} 00000 n \n`
  out += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`
  return Buffer.from(out, 'latin1')
}

/** A 1×1 PNG. */
export function tinyPng(): Buffer {
  return Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64')
}

/** The start of a JPEG (SOI + JFIF APP0 segment) and its end marker: enough to be recognised. */
export function tinyJpeg(): Buffer {
  return Buffer.from([
    0xFF, 0xD8, 0xFF, 0xE0, 0x00, 0x10, 0x4A, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00,
    0xFF, 0xD9,
  ])
}

export function igcFixture(name: 'valid-declaration.igc' | 'garbage.txt'): Buffer {
  return readFileSync(join(root, 'tests/fixtures/igc', name))
}

/** Where the test server keeps uploads (the default folder, unless NUXT_UPLOADS_DIR moves it). */
export function uploadsDir(): string {
  return process.env.NUXT_UPLOADS_DIR ?? resolve(root, '.data/uploads')
}

/** How many stored files an entry has in one area (documents or igc). */
export function storedFileCount(area: 'documents' | 'igc', entryId: string): number {
  const dir = join(uploadsDir(), area, entryId)
  return existsSync(dir) ? readdirSync(dir).length : 0
}
