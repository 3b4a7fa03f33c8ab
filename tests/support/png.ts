// A small PNG reader for screenshots: 8-bit RGB or RGBA, not interlaced (what Chromium writes).
// Enough to measure the brightness of what a screen shows, without a dependency.
import { inflateSync } from 'node:zlib'

export interface Pixels {
  width: number
  height: number
  /** 4 bytes (RGBA) per pixel, row by row. */
  rgba: Uint8Array
}

export function decodePng(png: Buffer): Pixels {
  if (png.readUInt32BE(0) !== 0x89504E47) throw new Error('not a PNG')
  let offset = 8
  let width = 0
  let height = 0
  let colourType = 0
  const idat: Buffer[] = []
  while (offset < png.length) {
    const length = png.readUInt32BE(offset)
    const type = png.toString('ascii', offset + 4, offset + 8)
    const data = png.subarray(offset + 8, offset + 8 + length)
    if (type === 'IHDR') {
      width = data.readUInt32BE(0)
      height = data.readUInt32BE(4)
      const bitDepth = data[8]
      colourType = data[9]!
      if (bitDepth !== 8 || (colourType !== 2 && colourType !== 6) || data[12] !== 0) throw new Error(`unsupported PNG (depth ${bitDepth}, colour type ${colourType})`)
    }
    else if (type === 'IDAT') {
      idat.push(data)
    }
    else if (type === 'IEND') {
      break
    }
    offset += 12 + length
  }
  const channels = colourType === 6 ? 4 : 3
  const stride = width * channels
  const raw = inflateSync(Buffer.concat(idat))
  const out = new Uint8Array(width * height * channels)
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)]!
    const line = raw.subarray(y * (stride + 1) + 1, (y + 1) * (stride + 1))
    const row = y * stride
    for (let x = 0; x < stride; x++) {
      const a = x >= channels ? out[row + x - channels]! : 0
      const b = y > 0 ? out[row - stride + x]! : 0
      const c = x >= channels && y > 0 ? out[row - stride + x - channels]! : 0
      let predictor = 0
      if (filter === 1) predictor = a
      else if (filter === 2) predictor = b
      else if (filter === 3) predictor = (a + b) >> 1
      else if (filter === 4) {
        const p = a + b - c
        const pa = Math.abs(p - a)
        const pb = Math.abs(p - b)
        const pc = Math.abs(p - c)
        predictor = pa <= pb && pa <= pc ? a : pb <= pc ? b : c
      }
      out[row + x] = (line[x]! + predictor) & 0xFF
    }
  }
  if (channels === 4) return { width, height, rgba: out }
  const rgba = new Uint8Array(width * height * 4)
  for (let i = 0, j = 0; i < out.length; i += 3, j += 4) {
    rgba[j] = out[i]!
    rgba[j + 1] = out[i + 1]!
    rgba[j + 2] = out[i + 2]!
    rgba[j + 3] = 255
  }
  return { width, height, rgba }
}

/** sRGB channel (0–255) to linear light (WCAG 2 relative luminance). */
function linear(channel: number): number {
  const c = channel / 255
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
}

/** Mean relative luminance (WCAG 2: 0.2126 R + 0.7152 G + 0.0722 B, linear) of every pixel. */
export function meanLuminance(pixels: Pixels): number {
  const table = Array.from({ length: 256 }, (_, i) => linear(i))
  let sum = 0
  const n = pixels.width * pixels.height
  for (let i = 0; i < n * 4; i += 4) {
    sum += 0.2126 * table[pixels.rgba[i]!]! + 0.7152 * table[pixels.rgba[i + 1]!]! + 0.0722 * table[pixels.rgba[i + 2]!]!
  }
  return n ? sum / n : 0
}
