// The browser tests drive Debian's Chromium through playwright-core (no browser download);
// ffmpeg turns a QR image into a fake camera feed for the scanning tests.
import { existsSync } from 'node:fs'
import { aptInstall } from './apt'
import { isRoot, ScriptError, step } from './common'

export const CHROMIUM_PATH = '/usr/bin/chromium'
const FFMPEG_PATH = '/usr/bin/ffmpeg'

export async function ensureBrowser(): Promise<void> {
  const missing = [
    ...(existsSync(CHROMIUM_PATH) ? [] : ['chromium']),
    ...(existsSync(FFMPEG_PATH) ? [] : ['ffmpeg']),
  ]
  if (missing.length === 0) return
  if (isRoot()) {
    await aptInstall(missing, 'The browser tests need them (about 40 s)')
    if (!existsSync(CHROMIUM_PATH)) throw new ScriptError(`apt-get installed chromium, but ${CHROMIUM_PATH} is still missing.`)
    return
  }
  if (missing.includes('chromium')) {
    throw new ScriptError(`The browser tests need Chromium at ${CHROMIUM_PATH}. `
      + 'Install it with: sudo apt-get install --no-install-recommends chromium ffmpeg')
  }
  // Only the camera tests need ffmpeg; everything else can still run.
  step(`Note: ${FFMPEG_PATH} is missing (sudo apt-get install ffmpeg); tests that fake a camera will fail`)
}
