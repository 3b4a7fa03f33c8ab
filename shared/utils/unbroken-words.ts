// Reasons on the wall are read from across the room: a date (2027-07-09) or a registration
// (D-1234) broken at its hyphen over two lines reads as two things. The text split into runs,
// those joined by hyphens marked to be kept on one line (the page sets them `nowrap`).

export interface TextRun {
  text: string
  /** A hyphenated word that must not be broken over two lines. */
  keep: boolean
}

const HYPHENATED = /[\p{L}\p{N}]+(?:-[\p{L}\p{N}]+)+/gu

export function unbrokenRuns(text: string): TextRun[] {
  const runs: TextRun[] = []
  let at = 0
  for (const match of text.matchAll(HYPHENATED)) {
    const start = match.index ?? 0
    if (start > at) runs.push({ text: text.slice(at, start), keep: false })
    runs.push({ text: match[0], keep: true })
    at = start + match[0].length
  }
  if (at < text.length) runs.push({ text: text.slice(at), keep: false })
  return runs
}
