// The password that seals session cookies, the key that seals stored files, and the demo
// cluster's database passwords. The built server does not read .env, so the start script passes
// them explicitly; keeping them in .data means sign-ins and files survive a restart.
import { randomBytes } from 'node:crypto'
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { FileKeyError, FILES_KEY_VARIABLE, newFilesKey, parseFileKey } from '../../server/domain/files/file-crypt'
import { localDataDir, ScriptError, step } from './common'
import type { ClusterPasswords } from './postgres'

/** nuxt-auth-utils (h3 sealed sessions) rejects shorter passwords. */
const MIN_LENGTH = 32
const passwordFile = join(localDataDir, 'session-password')

/** A new random password: 36 bytes → 48 URL-safe characters. */
export function randomSessionPassword(): string {
  return randomBytes(36).toString('base64url')
}

/** NUXT_SESSION_PASSWORD when set, else the one kept in .data/session-password (created once). */
export function sessionPassword(): string {
  const fromEnv = process.env.NUXT_SESSION_PASSWORD
  if (fromEnv !== undefined && fromEnv !== '') {
    if (fromEnv.length < MIN_LENGTH) {
      throw new ScriptError(`NUXT_SESSION_PASSWORD is ${fromEnv.length} characters long; it needs at least ${MIN_LENGTH}. `
        + 'Unset it to use a generated one.')
    }
    return fromEnv
  }

  if (existsSync(passwordFile)) {
    const stored = readFileSync(passwordFile, 'utf8').trim()
    if (stored.length >= MIN_LENGTH) return stored
    step(`${passwordFile} holds a password shorter than ${MIN_LENGTH} characters; replacing it (existing sessions end)`)
  }
  const password = randomSessionPassword()
  mkdirSync(localDataDir, { recursive: true })
  writeFileSync(passwordFile, `${password}\n`, { mode: 0o600 })
  chmodSync(passwordFile, 0o600) // mode above applies only when the file is new
  return password
}

const filesKeyFile = join(localDataDir, 'files-key')

/**
 * The key stored files are sealed under: NUXT_FILES_KEY when set, else the one kept in
 * .data/files-key (created once, readable by this user only). Losing it loses the demo's files.
 */
export function filesKey(): string {
  const fromEnv = process.env[FILES_KEY_VARIABLE]
  if (fromEnv !== undefined && fromEnv !== '') {
    try {
      parseFileKey(fromEnv)
    }
    catch (error) {
      if (error instanceof FileKeyError) throw new ScriptError(`${error.message} Unset it to use a generated one.`)
      throw error
    }
    return fromEnv
  }
  if (existsSync(filesKeyFile)) {
    const stored = readFileSync(filesKeyFile, 'utf8').trim()
    try {
      parseFileKey(stored, filesKeyFile)
      return stored
    }
    catch (error) {
      if (!(error instanceof FileKeyError)) throw error
      // Replacing it would make every file sealed under it unreadable.
      throw new ScriptError(`${error.message} Restore it from a backup; or, to start the demo afresh, delete it and run npm run seed:reset.`)
    }
  }
  const key = newFilesKey()
  mkdirSync(localDataDir, { recursive: true })
  writeFileSync(filesKeyFile, `${key}\n`, { mode: 0o600 })
  chmodSync(filesKeyFile, 0o600)
  return key
}

const clusterPasswordsFile = join(localDataDir, 'db-passwords.json')

/** The demo cluster's passwords kept in .data/db-passwords.json, or null when there is none yet. */
export function readClusterPasswords(): ClusterPasswords | null {
  if (!existsSync(clusterPasswordsFile)) return null
  try {
    const stored = JSON.parse(readFileSync(clusterPasswordsFile, 'utf8')) as Partial<ClusterPasswords>
    if (stored.superuserName && stored.superuser && stored.app) return stored as ClusterPasswords
  }
  catch { /* reported below */ }
  throw new ScriptError(`${clusterPasswordsFile} is not what npm start wrote (superuserName, superuser, app). `
    + 'Restore it from a backup, or run npm run stop and delete the demo cluster (its data) to start afresh.')
}

/** Keeps the demo cluster's passwords, readable by this user only. */
export function saveClusterPasswords(passwords: ClusterPasswords): void {
  mkdirSync(localDataDir, { recursive: true })
  writeFileSync(clusterPasswordsFile, `${JSON.stringify(passwords, null, 2)}\n`, { mode: 0o600 })
  chmodSync(clusterPasswordsFile, 0o600)
}

export { clusterPasswordsFile }
