// Reading a PDF as a person would, with Debian's poppler-utils (installed by `npm test` when
// missing, scripts/lib/pdf-tools.ts): its text page by page (pdftotext), its page count and size
// (pdfinfo), and a page drawn as PNG (pdftoppm), kept under artifacts/ to be looked at.
import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'

const artifactsDir = () => resolve(process.env.GRIDMARK_ARTIFACTS ?? 'artifacts')

function withFile<T>(pdf: Buffer, work: (path: string, dir: string) => T): T {
  const dir = mkdtempSync(join(tmpdir(), 'gridmark-pdf-'))
  try {
    const path = join(dir, 'doc.pdf')
    writeFileSync(path, pdf)
    return work(path, dir)
  }
  finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

/**
 * The text of each page, in the order the document draws it (`pdftotext -raw`), with runs of
 * white space made one space: a table's cells read left to right, each cell whole.
 */
export function pdfPages(pdf: Buffer): string[] {
  const text = withFile(pdf, path => execFileSync('pdftotext', ['-raw', '-enc', 'UTF-8', path, '-'], { encoding: 'utf8' }))
  const pages = text.split('\f').map(p => p.replace(/\s+/g, ' ').trim())
  // pdftotext ends the last page with a form feed too.
  if (pages.length > 1 && pages[pages.length - 1] === '') pages.pop()
  return pages
}

/** pdfinfo's fields: Pages, Page size, Title … */
export function pdfInfo(pdf: Buffer): Record<string, string> {
  const out = withFile(pdf, path => execFileSync('pdfinfo', [path], { encoding: 'utf8' }))
  return Object.fromEntries(out.split('\n').filter(l => l.includes(':')).map(l => [l.slice(0, l.indexOf(':')).trim(), l.slice(l.indexOf(':') + 1).trim()]))
}

/**
 * Page `page` drawn at 72 dpi (one pixel a point) as PNG, saved as
 * <artifacts>/reports/<name>.png; its size in pixels and where it is.
 */
export function pdfPagePng(pdf: Buffer, name: string, page = 1): { width: number, height: number, path: string } {
  const png = withFile(pdf, (path, dir) => {
    execFileSync('pdftoppm', ['-png', '-r', '72', '-f', String(page), '-l', String(page), '-singlefile', path, join(dir, 'page')])
    return readFileSync(join(dir, 'page.png'))
  })
  const out = join(artifactsDir(), 'reports')
  mkdirSync(out, { recursive: true })
  const path = join(out, `${name}.png`)
  writeFileSync(path, png)
  // The PNG's IHDR chunk: width and height as 32-bit big-endian numbers at bytes 16 and 20.
  return { width: png.readUInt32BE(16), height: png.readUInt32BE(20), path }
}
