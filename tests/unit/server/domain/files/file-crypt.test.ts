// Stored files sealed with AES-256-GCM (NIST SP 800-38D): a sealed file opens to its bytes with
// its key, whole or streamed in any chunking; a changed byte anywhere (header included) or a key
// the keyring lacks is an error, never bytes; a file without the header is a legacy, plain one.
import { createHash, randomBytes } from 'node:crypto'
import { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import { describe, expect, it } from 'vitest'
import {
  fileKeyProblems, fileKeyring, HEADER_BYTES, keyIdOf, newFilesKey, open, openingStream, parseFileKey,
  readFileHeader, seal, sealingStream, StoredFileError, type FileKeyring,
} from '#domain/files/file-crypt'

const keyring = (key = newFilesKey(), oldKeys = ''): FileKeyring => fileKeyring({ key, oldKeys })

async function streamed(data: Buffer, chunkBytes: number, ...steps: NodeJS.ReadWriteStream[]): Promise<Buffer> {
  const chunks: Buffer[] = []
  for (let i = 0; i < data.length; i += chunkBytes) chunks.push(data.subarray(i, i + chunkBytes))
  const out: Buffer[] = []
  await pipeline([Readable.from(chunks), ...steps, async (source: AsyncIterable<Buffer>) => {
    for await (const chunk of source) out.push(chunk)
  }])
  return Buffer.concat(out)
}

function reason(fn: () => unknown): string | undefined {
  try {
    fn()
  }
  catch (error) {
    return error instanceof StoredFileError ? error.reason : `not a StoredFileError: ${String(error)}`
  }
  return undefined
}

describe('the files key', () => {
  it('is 32 bytes written as hex or base64 (standard or URL-safe); its id is the start of its SHA-256', () => {
    const bytes = randomBytes(32)
    const id = createHash('sha256').update(bytes).digest('hex').slice(0, 16)
    for (const text of [bytes.toString('hex'), bytes.toString('hex').toUpperCase(), bytes.toString('base64'), bytes.toString('base64url'), ` ${bytes.toString('base64')}\n`]) {
      const key = parseFileKey(text)
      expect(key.key.equals(bytes)).toBe(true)
      expect(key.id).toBe(id)
    }
    expect(keyIdOf(bytes)).toBe(id)
    expect(parseFileKey(newFilesKey()).key).toHaveLength(32)
  })

  it('refuses anything else with a message that names the setting and never repeats the value', () => {
    const tooShort = randomBytes(16).toString('base64')
    for (const text of [tooShort, randomBytes(33).toString('hex'), 'x'.repeat(44), 'a passphrase that is long enough to look like one']) {
      expect(() => parseFileKey(text)).toThrow(/^NUXT_FILES_KEY is not a key: it must be 32 random bytes written as 64 hex digits or 44 base64 characters/)
    }
    expect(() => parseFileKey(tooShort)).not.toThrow(new RegExp(tooShort.replace(/[+/=]/g, '.')))
    expect(fileKeyProblems({ key: '' })).toEqual(['NUXT_FILES_KEY is not set.'])
    expect(fileKeyProblems({ key: 'short' })[0]).toMatch(/NUXT_FILES_KEY is not a key.*5 characters long/)
    expect(fileKeyProblems({ key: newFilesKey(), oldKeys: `${newFilesKey()}, nope` })[0]).toMatch(/^NUXT_FILES_OLD_KEYS \(key 2 of 2\) is not a key/)
    expect(fileKeyProblems({ key: newFilesKey(), oldKeys: `${newFilesKey()},${newFilesKey()}` })).toEqual([])
  })

  it('a keyring opens files of the current key and of every old key', () => {
    const [a, b, c] = [newFilesKey(), newFilesKey(), newFilesKey()]
    const ring = keyring(c, `${a},${b}`)
    expect(ring.current!.id).toBe(parseFileKey(c).id)
    expect([...ring.byId.keys()].sort()).toEqual([a, b, c].map(k => parseFileKey(k).id).sort())
    const data = randomBytes(1000)
    expect(open(seal(data, keyring(a)), ring).data.equals(data)).toBe(true)
    expect(open(seal(data, keyring(b)), ring).data.equals(data)).toBe(true)
    expect(fileKeyring({}).current).toBeNull()
  })
})

describe('sealing and opening', () => {
  const ring = keyring()

  it('round trip: whole, and streamed in odd chunk sizes, for empty, tiny and larger files', async () => {
    for (const size of [0, 1, 15, 16, 17, 25, 4096, 300_001]) {
      const data = randomBytes(size)
      const sealed = seal(data, ring)
      expect(sealed.length).toBe(HEADER_BYTES + size + 16)
      expect(open(sealed, ring)).toEqual({ data, keyId: ring.current!.id })
      for (const chunk of size > 5000 ? [7919, 64 * 1024] : [1, 7, 64 * 1024]) {
        const streamSealed = await streamed(data, chunk, sealingStream(ring))
        expect(streamSealed.length).toBe(sealed.length)
        expect(open(streamSealed, ring).data.equals(data)).toBe(true)
        expect((await streamed(streamSealed, chunk, openingStream(ring))).equals(data)).toBe(true)
      }
    }
  })

  it('never leaves the content readable, and seals the same bytes differently each time (fresh IV)', () => {
    const data = Buffer.from('HFPLTPILOTINCHARGE:Morag Quillfeather\r\n'.repeat(50), 'latin1')
    const a = seal(data, ring)
    const b = seal(data, ring)
    expect(a.includes(Buffer.from('Quillfeather'))).toBe(false)
    expect(a.equals(b)).toBe(false)
  })

  it('the header: magic, version 1, key id, IV; a file without it is legacy', () => {
    const sealed = seal(Buffer.from('x'), ring)
    const header = readFileHeader(sealed)!
    expect(header.version).toBe(1)
    expect(header.keyId).toBe(ring.current!.id)
    expect(header.iv).toHaveLength(12)
    expect(sealed.subarray(0, 4)).toEqual(Buffer.from([0x93, 0x47, 0x4D, 0x46]))
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\n%%EOF\n')
    expect(readFileHeader(pdf)).toBeNull()
    expect(readFileHeader(Buffer.from('A'))).toBeNull()
    expect(open(pdf, ring)).toEqual({ data: pdf, keyId: null })
    const unknownVersion = Buffer.from(sealed)
    unknownVersion[4] = 2
    expect(reason(() => readFileHeader(unknownVersion))).toBe('damaged')
  })

  it('a legacy file streams through as it is, however it is cut', async () => {
    for (const data of [Buffer.from('%PDF'), Buffer.from('AXKMDEMFLIGHT:1\r\nHFDTEDATE:140527,01\r\n'.repeat(20))]) {
      let seen: string | null | undefined
      expect((await streamed(data, 3, openingStream(ring, (id) => {
        seen = id
      }))).equals(data)).toBe(true)
      expect(seen).toBeNull()
    }
  })

  it('tampering anywhere is an error: header, content, tag, or a cut', async () => {
    const data = randomBytes(200)
    const sealed = seal(data, ring)
    for (const at of [5, 14, HEADER_BYTES - 1, HEADER_BYTES, HEADER_BYTES + 100, sealed.length - 1]) {
      const changed = Buffer.from(sealed)
      changed[at]! ^= 0x01
      // A changed key id names a key the ring lacks; anything else fails the integrity check.
      expect(reason(() => open(changed, ring)), `byte ${at}`).toBe(at < 13 && at >= 5 ? 'unknown-key' : 'damaged')
      await expect(streamed(changed, 50, openingStream(ring))).rejects.toBeInstanceOf(StoredFileError)
    }
    for (const cut of [sealed.length - 1, HEADER_BYTES + 10, HEADER_BYTES + 2]) {
      expect(reason(() => open(sealed.subarray(0, cut), ring)), `cut at ${cut}`).toBe('damaged')
      await expect(streamed(sealed.subarray(0, cut), 50, openingStream(ring))).rejects.toMatchObject({ reason: 'damaged' })
    }
  })

  it('the wrong key is an error: a key the ring lacks, or another key under the right id', async () => {
    const data = randomBytes(100)
    const sealed = seal(data, ring)
    const other = keyring()
    expect(reason(() => open(sealed, other))).toBe('unknown-key')
    await expect(streamed(sealed, 10, openingStream(other))).rejects.toMatchObject({ reason: 'unknown-key' })
    const impostor: FileKeyring = { current: null, byId: new Map([[ring.current!.id, other.current!.key]]) }
    expect(reason(() => open(sealed, impostor))).toBe('damaged')
    await expect(streamed(sealed, 10, openingStream(impostor))).rejects.toMatchObject({ reason: 'damaged' })
  })

  it('without a current key nothing is sealed', () => {
    const none = fileKeyring({})
    expect(reason(() => seal(Buffer.from('x'), none))).toBe('no-key')
    expect(reason(() => sealingStream(none))).toBe('no-key')
  })

  it('errors carry no byte of the file', () => {
    const secret = Buffer.from('medical certificate of Morag Quillfeather')
    const changed = seal(secret, ring)
    changed[HEADER_BYTES + 3]! ^= 0xFF
    try {
      open(changed, ring)
      expect.unreachable()
    }
    catch (error) {
      expect(error).toBeInstanceOf(StoredFileError)
      expect(`${(error as Error).message} ${JSON.stringify(error)}`).not.toMatch(/Quillfeather|medical/)
    }
  })
})
