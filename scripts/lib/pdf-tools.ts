// The glider report's tests read its PDF as a person would: Debian's poppler-utils render a page
// to PNG (pdftoppm) and extract its text (pdftotext, pdfinfo). Installed with apt-get when we
// are root and they are missing, as the browser tests' Chromium is.
import { existsSync } from 'node:fs'
import { aptInstall } from './apt'
import { isRoot, step } from './common'

export const PDF_TOOLS = ['/usr/bin/pdftoppm', '/usr/bin/pdftotext', '/usr/bin/pdfinfo'] as const

export async function ensurePdfTools(): Promise<void> {
  if (PDF_TOOLS.every(p => existsSync(p))) return
  if (isRoot()) {
    await aptInstall(['poppler-utils'], 'The glider report tests read PDFs with them (a few seconds)')
    return
  }
  // Only the report tests need them; everything else can still run.
  step('Note: poppler-utils is missing (sudo apt-get install poppler-utils); the glider report tests will fail')
}
