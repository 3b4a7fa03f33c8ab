// Every stored file is sealed at rest (AES-256-GCM, NIST SP 800-38D) under NUXT_FILES_KEY: on
// disk a document or an IGC file holds none of the bytes uploaded, is readable by its owner only
// (0600 in a 0700 folder) and opens with the key to exactly them; the API sends the original.
// `npm run files:rekey` moves every file, plain ones stored before encryption included, to a new
// key, also after a run that stopped half-way; a file that cannot be opened is never sent.
// `npm run files:orphans` finds stored files without a row and removes the old ones.
// A database and a server of their own: the rekey covers every row, and the keys change.
import { spawn } from 'node:child_process'
import { createHash, randomBytes, randomUUID } from 'node:crypto'
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import knex from 'knex'
import { createStorage } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { createKnexConfig } from '../../../../knexfile'
import { fileKeyring, open, parseFileKey, readFileHeader, seal, type FileKeyring } from '../../../../server/domain/files/file-crypt'
import { resealFile, type UploadsStore } from '../../../../server/domain/files/file-store'
import { MESSAGES } from '../../../../shared/constants/messages'
import { signedUpClient, type ApiClient } from '../../../support/api'
import { closeTestDb, createClass, createCompetition, createEntry, testDb } from '../../../support/db'
import { getBytes, igcFixture, postForm, tinyPdf } from '../../../support/files'
import { startServer, type RunningServer } from '../../../support/server'

const root = fileURLToPath(new URL('../../../..', import.meta.url))
const sharedUrl = process.env.DATABASE_URL!
const database = `gridmark_files_crypt_${process.pid}`
const ownUrl = (() => {
  const url = new URL(sharedUrl)
  url.pathname = `/${database}`
  return url.toString()
})()

const keyA = randomBytes(32).toString('base64')
const keyB = randomBytes(32).toString('hex')
const idA = parseFileKey(keyA).id
const idB = parseFileKey(keyB).id
const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex')

let folders: { root: string, uploads: string, incoming: string }
let server: RunningServer | undefined
let port: number | undefined
let owner: ApiClient
let competitionId: string
let entryId: string
let recorderId: string
const uploaded: { document?: { id: string, key: string, data: Buffer }, igc?: { id: string, key: string, data: Buffer }, legacy?: { id: string, key: string, data: Buffer } } = {}

/** A server on this file's database and folders, sealing under `key`; on the first one's port, so clients carry over. */
async function serve(key: string, oldKeys = ''): Promise<RunningServer> {
  const started = await startServer({
    ...inject('serviceEnv'), // its own mail worker sends this database's sign-up mail
    DATABASE_URL: ownUrl,
    NUXT_UPLOADS_DIR: folders.uploads,
    NUXT_UPLOADS_TMP_DIR: folders.incoming,
    NUXT_FILES_KEY: key,
    NUXT_FILES_OLD_KEYS: oldKeys,
    NUXT_REMINDERS_INTERVAL_MS: '0',
  }, port)
  port = started.port
  return started
}

/** Runs a maintenance script with only these settings; resolves with its exit code and output. */
function runScript(name: 'files-rekey' | 'files-orphans', env: Record<string, string>, args: string[] = []): Promise<{ code: number | null, output: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', join('scripts', `${name}.ts`), ...args], {
      cwd: root,
      env: { PATH: process.env.PATH, HOME: process.env.HOME, DATABASE_URL: ownUrl, NUXT_UPLOADS_DIR: folders.uploads, NUXT_UPLOADS_TMP_DIR: folders.incoming, ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    })
    let output = ''
    child.stdout.on('data', (d) => { output += d })
    child.stderr.on('data', (d) => { output += d })
    child.on('close', code => resolve({ code, output }))
  })
}

const pathOf = (key: string) => join(folders.uploads, ...key.split(':'))
const fileUrl = (kind: 'documents' | 'igc-files', id: string) => `/api/competitions/${competitionId}/entries/${entryId}/${kind}/${id}/file`
const ringOf = (key: string, oldKeys = ''): FileKeyring => fileKeyring({ key, oldKeys })

beforeAll(async () => {
  folders = (() => {
    const dir = mkdtempSync(join(tmpdir(), 'gridmark-files-crypt-'))
    return { root: dir, uploads: join(dir, 'uploads'), incoming: join(dir, 'incoming') }
  })()
  await testDb().raw(`DROP DATABASE IF EXISTS ${database} WITH (FORCE)`)
  await testDb().raw(`CREATE DATABASE ${database}`)
  await closeTestDb()
  // Migrated first, as `npm test` does for the shared database (a server migrates after it listens).
  const migrator = knex(createKnexConfig(ownUrl, { timeouts: false }))
  await migrator.migrate.latest().finally(() => migrator.destroy())
  // From here on the helpers of tests/support arrange this file's database (this worker only).
  process.env.DATABASE_URL = ownUrl
  server = await serve(keyA)
  const o = await signedUpClient(server.url, 'Morag Quillfeather')
  owner = o.client
  competitionId = await createCompetition('Sealed Files Cup', [{ userId: o.user.id, role: 'entrant' }])
  entryId = await createEntry({ competitionId, classId: await createClass(competitionId), entrantUserId: o.user.id, compId: 'KM1' })
  const [unit] = await testDb()('units').insert({ entry_id: entryId, competition_id: competitionId, kind: 'flight-recorder', model: 'Test Recorder TR-1', serial: 'A-0001', approval_level: 'all-flights' }).returning('id')
  recorderId = unit.id
}, 120_000)

afterAll(async () => {
  await server?.stop()
  await closeTestDb()
  const admin = knex(createKnexConfig(sharedUrl))
  await admin.raw(`DROP DATABASE IF EXISTS ${database} WITH (FORCE)`).finally(() => admin.destroy())
  if (folders) rmSync(folders.root, { recursive: true, force: true })
})

describe('a stored file', () => {
  it('a document: on disk none of its bytes, mode 0600 in 0700 folders, the key id in its header and row; it opens to exactly the upload', async () => {
    const data = tinyPdf('Medical certificate of Morag Quillfeather, class 2', 2000)
    const res = await postForm(owner, `/api/competitions/${competitionId}/entries/${entryId}/documents`, { kind: 'medical', expiresOn: '2030-12-31' }, { name: 'medical.pdf', data, type: 'application/pdf' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const row = await testDb()('documents').where({ id: res.body.document.id }).first()
    uploaded.document = { id: row.id, key: row.storage_key, data }
    expect(row.file_key_id).toBe(idA)
    expect(row.sha256).toBe(sha256(data)) // of the content, not of what lies on disk

    const stored = readFileSync(pathOf(row.storage_key))
    expect(stored.includes(Buffer.from('Quillfeather'))).toBe(false)
    expect(stored.includes(Buffer.from('%PDF'))).toBe(false)
    expect(stored.includes(data.subarray(200, 232))).toBe(false)
    expect(statSync(pathOf(row.storage_key)).mode & 0o777).toBe(0o600)
    expect(statSync(dirname(pathOf(row.storage_key))).mode & 0o777).toBe(0o700)
    expect(statSync(join(folders.uploads, 'documents')).mode & 0o777).toBe(0o700)
    expect(readFileHeader(stored)?.keyId).toBe(idA)
    expect(open(stored, ringOf(keyA)).data.equals(data)).toBe(true)

    const download = await getBytes(owner, fileUrl('documents', row.id))
    expect(download.status).toBe(200)
    expect(download.data.equals(data)).toBe(true)
    expect(Number(download.headers.get('content-length'))).toBe(data.length)
  })

  it('an IGC file: the same, and none of its declaration lies on disk', async () => {
    const data = igcFixture('valid-declaration.igc')
    const res = await postForm(owner, `/api/competitions/${competitionId}/entries/${entryId}/igc-files`, { unitId: recorderId }, { name: 'KM1.igc', data })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body.igcFile.pilot).toBe('Marit Dovecote') // parsed from the upload as before
    const row = await testDb()('igc_files').where({ id: res.body.igcFile.id }).first()
    uploaded.igc = { id: row.id, key: row.storage_key, data }
    expect(row.file_key_id).toBe(idA)
    const stored = readFileSync(pathOf(row.storage_key))
    for (const text of ['Marit Dovecote', 'HFPLTPILOTINCHARGE', 'D-KMOR', 'AXGMK7Q']) expect(stored.includes(Buffer.from(text)), text).toBe(false)
    expect(statSync(pathOf(row.storage_key)).mode & 0o777).toBe(0o600)
    expect(open(stored, ringOf(keyA)).data.equals(data)).toBe(true)
    const download = await getBytes(owner, fileUrl('igc-files', row.id))
    expect(download.status).toBe(200)
    expect(download.data.equals(data)).toBe(true)
  })

  it('one stored before encryption (plain, no key id in its row) is still sent as it is', async () => {
    const data = tinyPdf('Licence of Morag Quillfeather, stored in plain')
    const key = `documents:${entryId}:${randomUUID()}`
    mkdirSync(dirname(pathOf(key)), { recursive: true })
    writeFileSync(pathOf(key), data)
    const [row] = await testDb()('documents').insert({
      entry_id: entryId, competition_id: competitionId, kind: 'licence', original_filename: 'licence.pdf', media_type: 'application/pdf',
      size_bytes: data.length, sha256: sha256(data), storage_key: key, expires_on: '2031-01-01', uploaded_by: (await testDb()('users').first('id')).id,
    }).returning(['id', 'file_key_id'])
    expect(row.file_key_id).toBeNull()
    uploaded.legacy = { id: row.id, key, data }
    const download = await getBytes(owner, fileUrl('documents', row.id))
    expect(download.status).toBe(200)
    expect(download.data.equals(data)).toBe(true)
  })
})

describe('files:rekey', () => {
  it('refuses to guess a key for a database of its own', async () => {
    const { code, output } = await runScript('files-rekey', {})
    expect(code).toBe(1)
    expect(output).toMatch(/NUXT_FILES_KEY is not set: give this command the same NUXT_FILES_KEY \(and NUXT_FILES_OLD_KEYS\) as the server/)
  })

  it('moves every file to the new key, also one an earlier run had sealed before it stopped, and says 0 are left', async () => {
    await server!.stop()
    server = undefined
    const count = async () => Number((await testDb()('documents').whereRaw('file_key_id IS DISTINCT FROM ?', [idB]).count({ n: '*' }).first())!.n)
      + Number((await testDb()('igc_files').whereRaw('file_key_id IS DISTINCT FROM ?', [idB]).count({ n: '*' }).first())!.n)
    expect(await count()).toBe(3)
    // An earlier run stopped after sealing the IGC file under B and before updating its row.
    const store: UploadsStore = { storage: createStorage({ driver: fsDriver({ base: folders.uploads }) }), folder: folders.uploads }
    expect(await resealFile(store, ringOf(keyB, keyA), uploaded.igc!.key)).toEqual({ from: idA })
    expect(readFileHeader(readFileSync(pathOf(uploaded.igc!.key)))?.keyId).toBe(idB)
    expect((await testDb()('igc_files').where({ id: uploaded.igc!.id }).first()).file_key_id).toBe(idA)

    const { code, output } = await runScript('files-rekey', { NUXT_FILES_KEY: keyB, NUXT_FILES_OLD_KEYS: keyA })
    expect(output).toMatch(/3 files to move to key/)
    expect(output).toMatch(new RegExp(`documents ${uploaded.document!.id}: ${idA} → ${idB}`))
    expect(output).toMatch(new RegExp(`documents ${uploaded.legacy!.id}: plain → ${idB}`))
    expect(output).toMatch(/\n0 files left under older keys\n/)
    expect(code, output).toBe(0)
    expect(await count()).toBe(0)
    for (const file of Object.values(uploaded)) {
      const stored = readFileSync(pathOf(file.key))
      expect(readFileHeader(stored)?.keyId).toBe(idB)
      expect(open(stored, ringOf(keyB)).data.equals(file.data)).toBe(true)
      expect(statSync(pathOf(file.key)).mode & 0o777).toBe(0o600)
    }
    // No replacement was left beside a file.
    expect(readFileSync(pathOf(uploaded.legacy!.key)).includes(Buffer.from('Quillfeather'))).toBe(false)

    const again = await runScript('files-rekey', { NUXT_FILES_KEY: keyB, NUXT_FILES_OLD_KEYS: keyA })
    expect(again.output).toMatch(/Every file is under the current key[\s\S]*\n0 files left under older keys\n/)
    expect(again.code).toBe(0)
  }, 120_000)

  it('a server with the new key alone sends every file as it was uploaded', async () => {
    server = await serve(keyB)
    expect((await getBytes(owner, fileUrl('documents', uploaded.document!.id))).data.equals(uploaded.document!.data)).toBe(true)
    expect((await getBytes(owner, fileUrl('igc-files', uploaded.igc!.id))).data.equals(uploaded.igc!.data)).toBe(true)
    expect((await getBytes(owner, fileUrl('documents', uploaded.legacy!.id))).data.equals(uploaded.legacy!.data)).toBe(true)
  }, 60_000)
})

describe('a file that cannot be opened', () => {
  it('is never sent: a changed byte answers 500, a key the server lacks 503, each with a message; the server log says which file', async () => {
    const path = pathOf(uploaded.document!.key)
    const original = readFileSync(path)
    const changed = Buffer.from(original)
    changed[changed.length - 40]! ^= 0x01
    writeFileSync(path, changed)
    const damaged = await owner.get(fileUrl('documents', uploaded.document!.id))
    expect(damaged.status).toBe(500)
    expect(damaged.body.message).toBe(MESSAGES.storedFileDamaged)
    expect(server!.output()).toContain(`stored file ${uploaded.document!.key}: The stored file fails its integrity check`)

    writeFileSync(path, seal(uploaded.document!.data, ringOf(randomBytes(32).toString('base64'))))
    const unknown = await owner.get(fileUrl('documents', uploaded.document!.id))
    expect(unknown.status).toBe(503)
    expect(unknown.body.message).toBe(MESSAGES.storedFileKeyUnknown)
    expect(JSON.stringify(unknown.body)).not.toContain('PDF')
    writeFileSync(path, original)
    expect((await getBytes(owner, fileUrl('documents', uploaded.document!.id))).status).toBe(200)
  })
})

describe('files:orphans', () => {
  it('lists stored files without a row and old temporary uploads; --remove removes those older than an hour only', async () => {
    const twoHoursAgo = new Date(Date.now() - 2 * 60 * 60 * 1000)
    const oldOrphan = `documents:${entryId}:${randomUUID()}`
    const youngOrphan = `igc:${entryId}:${randomUUID()}`
    for (const key of [oldOrphan, youngOrphan]) writeFileSync(pathOf(key), seal(Buffer.from('left by a crash'), ringOf(keyB)))
    utimesSync(pathOf(oldOrphan), twoHoursAgo, twoHoursAgo)
    mkdirSync(folders.incoming, { recursive: true })
    const oldTemp = join(folders.incoming, randomUUID())
    const youngTemp = join(folders.incoming, randomUUID())
    writeFileSync(oldTemp, 'half an upload')
    writeFileSync(youngTemp, 'an upload under way')
    utimesSync(oldTemp, twoHoursAgo, twoHoursAgo)

    const listed = await runScript('files-orphans', {})
    expect(listed.code, listed.output).toBe(0)
    expect(listed.output).toContain(oldOrphan)
    expect(listed.output).toContain(youngOrphan)
    expect(listed.output).toMatch(/2 files without a row found, 0 removed/)
    expect(listed.output).toMatch(/2 files left in .* found, 0 removed/)
    expect(listed.output).toMatch(/Run with --remove/)
    for (const file of Object.values(uploaded)) expect(listed.output).not.toContain(file.key)
    expect(existsSync(pathOf(oldOrphan))).toBe(true)

    const removed = await runScript('files-orphans', {}, ['--remove'])
    expect(removed.code, removed.output).toBe(0)
    expect(removed.output).toMatch(/2 files without a row found, 1 removed/)
    expect(removed.output).toMatch(/2 files left in .* found, 1 removed/)
    expect(existsSync(pathOf(oldOrphan))).toBe(false)
    expect(existsSync(pathOf(youngOrphan))).toBe(true)
    expect(existsSync(oldTemp)).toBe(false)
    expect(existsSync(youngTemp)).toBe(true)
    // Every file with a row is still there and still opens.
    for (const file of Object.values(uploaded)) {
      expect(open(readFileSync(pathOf(file.key)), ringOf(keyB)).data.equals(file.data)).toBe(true)
    }
    expect((await getBytes(owner, fileUrl('igc-files', uploaded.igc!.id))).data.equals(uploaded.igc!.data)).toBe(true)
  }, 60_000)
})
