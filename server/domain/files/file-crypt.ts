// Stored files are sealed with AES-256-GCM under the key of NUXT_FILES_KEY. Each sealed file
// carries what it takes to open it on its own:
//
//   magic "\x93GMF" (4) · version 1 (1) · key id (8) · IV (12) · ciphertext · GCM tag (16)
//
// The header is the cipher's additional data, so a changed key id or IV fails like a changed
// byte of the content. The key id is the first 16 hex digits of the key's SHA-256: no second
// setting, and an operator can compute it. Older keys (NUXT_FILES_OLD_KEYS) stay readable while
// `npm run files:rekey` moves their files to the current key. A file without the magic was
// written before encryption (plain, "legacy") and is read as it is.
// Plain node:crypto with no imports of the app, so the scripts and the seed share it.
import { createCipheriv, createDecipheriv, createHash, randomBytes, type DecipherGCM } from 'node:crypto'
import { Transform } from 'node:stream'

export const FILES_KEY_VARIABLE = 'NUXT_FILES_KEY'
export const FILES_OLD_KEYS_VARIABLE = 'NUXT_FILES_OLD_KEYS'

/** No PDF, image or IGC file starts with 0x93, so a legacy file is never taken for a sealed one. */
const MAGIC = Buffer.from([0x93, 0x47, 0x4D, 0x46])
const VERSION = 1
const KEY_BYTES = 32
const KEY_ID_BYTES = 8
const IV_BYTES = 12
const TAG_BYTES = 16
export const HEADER_BYTES = MAGIC.length + 1 + KEY_ID_BYTES + IV_BYTES

export interface FileKey {
  /** 16 hex digits: the start of the key's SHA-256. */
  id: string
  key: Buffer
}

/** The key new files are sealed with (null when none is configured) and every key that opens one. */
export interface FileKeyring {
  current: FileKey | null
  byId: Map<string, Buffer>
}

export interface FileHeader {
  version: number
  keyId: string
  iv: Buffer
}

/** A setting that is not a key; the message names the setting and what it should be. */
export class FileKeyError extends Error {
  override name = 'FileKeyError'
}

/**
 * A stored file that cannot be opened: `unknown-key` (sealed under a key this process lacks),
 * `damaged` (fails the integrity check: tampered, truncated or the wrong key), `no-key` (no key
 * to seal with). Never carries the file's bytes.
 */
export class StoredFileError extends Error {
  override name = 'StoredFileError'
  constructor(message: string, readonly reason: 'unknown-key' | 'damaged' | 'no-key') {
    super(message)
  }
}

export function keyIdOf(key: Buffer): string {
  return createHash('sha256').update(key).digest('hex').slice(0, KEY_ID_BYTES * 2)
}

/** 32 random bytes, as NUXT_FILES_KEY writes them (base64). */
export function newFilesKey(): string {
  return randomBytes(KEY_BYTES).toString('base64')
}

/**
 * A key written as 64 hex digits or as base64 (standard or URL-safe, 43 characters and an
 * optional '='), decoding to exactly 32 bytes. The message never repeats the value.
 */
export function parseFileKey(text: string, variable = FILES_KEY_VARIABLE): FileKey {
  const value = text.trim()
  let key: Buffer | null = null
  if (/^[0-9a-f]{64}$/i.test(value)) key = Buffer.from(value, 'hex')
  else if (/^[\w+/-]{43}=?$/.test(value)) key = Buffer.from(value, 'base64')
  if (!key || key.length !== KEY_BYTES) {
    throw new FileKeyError(`${variable} is not a key: it must be 32 random bytes written as 64 hex digits or 44 base64 characters `
      + `(e.g. \`openssl rand -base64 32\`); the value given is ${value.length} characters long.`)
  }
  return { id: keyIdOf(key), key }
}

/** The keyring of the settings; throws FileKeyError when one of them is not a key. */
export function fileKeyring(settings: { key?: string | null, oldKeys?: string | null }): FileKeyring {
  const current = settings.key?.trim() ? parseFileKey(settings.key) : null
  const byId = new Map<string, Buffer>()
  const old = (settings.oldKeys ?? '').split(',').map(k => k.trim()).filter(Boolean)
  old.forEach((text, i) => {
    const parsed = parseFileKey(text, old.length === 1 ? FILES_OLD_KEYS_VARIABLE : `${FILES_OLD_KEYS_VARIABLE} (key ${i + 1} of ${old.length})`)
    byId.set(parsed.id, parsed.key)
  })
  if (current) byId.set(current.id, current.key)
  return { current, byId }
}

/** The keyring of an environment (NUXT_FILES_KEY, NUXT_FILES_OLD_KEYS). */
export function fileKeyringFromEnv(env: NodeJS.ProcessEnv = process.env): FileKeyring {
  return fileKeyring({ key: env[FILES_KEY_VARIABLE], oldKeys: env[FILES_OLD_KEYS_VARIABLE] })
}

/** What is wrong with the settings for a production start, one sentence each. */
export function fileKeyProblems(settings: { key?: string | null, oldKeys?: string | null }): string[] {
  if (!settings.key?.trim()) return [`${FILES_KEY_VARIABLE} is not set.`]
  try {
    fileKeyring(settings)
    return []
  }
  catch (error) {
    if (error instanceof FileKeyError) return [error.message]
    throw error
  }
}

function headerOf(keyId: string, iv: Buffer): Buffer {
  return Buffer.concat([MAGIC, Buffer.from([VERSION]), Buffer.from(keyId, 'hex'), iv])
}

/** The header of a stored file's first bytes; null when it has none (a legacy, plain file). */
export function readFileHeader(head: Buffer): FileHeader | null {
  if (head.length < HEADER_BYTES || !head.subarray(0, MAGIC.length).equals(MAGIC)) return null
  const version = head[MAGIC.length]!
  if (version !== VERSION) throw new StoredFileError(`The stored file has an unknown format version (${version}).`, 'damaged')
  const at = MAGIC.length + 1
  return {
    version,
    keyId: head.subarray(at, at + KEY_ID_BYTES).toString('hex'),
    iv: Buffer.from(head.subarray(at + KEY_ID_BYTES, HEADER_BYTES)),
  }
}

/** The key new files are sealed with; throws StoredFileError (no-key) when none is configured. */
export function sealingKey(keyring: FileKeyring): FileKey {
  if (!keyring.current) throw new StoredFileError(`No key to seal files with: ${FILES_KEY_VARIABLE} is not set.`, 'no-key')
  return keyring.current
}

function decipherFor(header: FileHeader, head: Buffer, keyring: FileKeyring): DecipherGCM {
  const key = keyring.byId.get(header.keyId)
  if (!key) {
    throw new StoredFileError(`The stored file is sealed under key ${header.keyId}, which is neither ${FILES_KEY_VARIABLE} `
      + `nor one of ${FILES_OLD_KEYS_VARIABLE}.`, 'unknown-key')
  }
  return createDecipheriv('aes-256-gcm', key, header.iv).setAAD(head.subarray(0, HEADER_BYTES))
}

const damaged = () => new StoredFileError('The stored file fails its integrity check: it was changed or cut short.', 'damaged')

/** Seals the bytes as they stream: the header first, the tag last. Nothing is kept in memory. */
export function sealingStream(keyring: FileKeyring): Transform {
  const { id, key } = sealingKey(keyring)
  const iv = randomBytes(IV_BYTES)
  const header = headerOf(id, iv)
  const cipher = createCipheriv('aes-256-gcm', key, iv).setAAD(header)
  let started = false
  const start = (stream: Transform) => {
    if (!started) stream.push(header)
    started = true
  }
  return new Transform({
    transform(chunk: Buffer, _encoding, done) {
      start(this)
      done(null, cipher.update(chunk))
    },
    flush(done) {
      start(this)
      this.push(cipher.final())
      done(null, cipher.getAuthTag())
    },
  })
}

/**
 * Opens a stored file as it streams: a sealed one is decrypted (the last 16 bytes, the tag, are
 * held back until the end, where a failed check errors the stream), a legacy one passes as it
 * is. `onHeader` hears the key id found (null for a legacy file) before any byte is passed on.
 */
export function openingStream(keyring: FileKeyring, onHeader?: (keyId: string | null) => void): Transform {
  let head: Buffer | null = Buffer.alloc(0)
  let decipher: DecipherGCM | null = null
  let tail = Buffer.alloc(0)
  const decrypt = (data: Buffer): Buffer => {
    if (!decipher) return data
    const all = Buffer.concat([tail, data])
    const cut = Math.max(0, all.length - TAG_BYTES)
    tail = all.subarray(cut)
    return decipher.update(all.subarray(0, cut))
  }
  const begin = () => {
    const header = readFileHeader(head!)
    if (header) decipher = decipherFor(header, head!, keyring)
    onHeader?.(header?.keyId ?? null)
    const rest = header ? head!.subarray(HEADER_BYTES) : head!
    head = null
    return decrypt(rest)
  }
  return new Transform({
    transform(chunk: Buffer, _encoding, done) {
      try {
        if (head === null) return done(null, decrypt(chunk))
        head = Buffer.concat([head, chunk])
        if (head.length < HEADER_BYTES) return done()
        done(null, begin())
      }
      catch (error) {
        done(error as Error)
      }
    },
    flush(done) {
      try {
        if (head !== null) this.push(begin())
        if (!decipher) return done()
        if (tail.length < TAG_BYTES) throw damaged()
        decipher.setAuthTag(tail)
        done(null, decipher.final())
      }
      catch (error) {
        done(error instanceof StoredFileError ? error : damaged())
      }
    },
  })
}

/** The bytes sealed under the current key. */
export function seal(data: Buffer, keyring: FileKeyring): Buffer {
  const { id, key } = sealingKey(keyring)
  const iv = randomBytes(IV_BYTES)
  const header = headerOf(id, iv)
  const cipher = createCipheriv('aes-256-gcm', key, iv).setAAD(header)
  return Buffer.concat([header, cipher.update(data), cipher.final(), cipher.getAuthTag()])
}

/** A stored file's bytes opened: decrypted, or as they are for a legacy file (keyId null). */
export function open(stored: Buffer, keyring: FileKeyring): { data: Buffer, keyId: string | null } {
  const header = readFileHeader(stored)
  if (!header) return { data: stored, keyId: null }
  const decipher = decipherFor(header, stored, keyring)
  if (stored.length < HEADER_BYTES + TAG_BYTES) throw damaged()
  decipher.setAuthTag(stored.subarray(stored.length - TAG_BYTES))
  try {
    const data = Buffer.concat([decipher.update(stored.subarray(HEADER_BYTES, stored.length - TAG_BYTES)), decipher.final()])
    return { data, keyId: header.keyId }
  }
  catch {
    throw damaged()
  }
}
