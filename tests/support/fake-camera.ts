// A fake camera for the scanning tests: Chromium plays an MJPEG file as its camera, and the file
// shows the QR code of a tag URL (qrcode → PNG, ffmpeg → MJPEG, as ../shared/STACK.md records).
// html5-qrcode decodes it in about a second, exactly as it would a sticker held up to a phone.
import { execFile } from 'node:child_process'
import { mkdtemp } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'
import QRCode from 'qrcode'

const run = promisify(execFile)

/** Writes an MJPEG camera feed showing the QR code of `text` and returns its path. */
export async function makeQrVideo(text: string): Promise<string> {
  const dir = await mkdtemp(join(tmpdir(), 'gridmark-camera-'))
  const png = join(dir, 'tag.png')
  const video = join(dir, 'tag.mjpeg')
  await QRCode.toFile(png, text, { errorCorrectionLevel: 'M', margin: 4, width: 360 })
  await run('ffmpeg', [
    '-loglevel', 'error', '-y', '-loop', '1', '-i', png, '-t', '4', '-r', '15',
    '-vf', 'pad=640:480:(ow-iw)/2:(oh-ih)/2:white,format=yuvj420p',
    '-c:v', 'mjpeg', '-f', 'mjpeg', video,
  ])
  return video
}

/** Chromium arguments for a camera that shows the QR code of `text`, with permission granted. */
export async function fakeCameraArgs(text: string): Promise<string[]> {
  const video = await makeQrVideo(text)
  return ['--use-fake-device-for-media-stream', '--use-fake-ui-for-media-stream', `--use-file-for-fake-video-capture=${video}`]
}
