// The A4 sheet of glider tags (pdfkit): 2 × 4 stickers, each with the competition ID large
// enough to read across the grid, the QR code drawn as vector squares (sharp at any printer
// resolution), the short code for typing by hand, class and registration, and the
// competition's name. Thin dashed lines mark where to cut; margins suit common sticker sheets.
import PDFDocument from 'pdfkit'
import QRCode from 'qrcode'
import type { PrintableTag } from '#shared/types/api-tags'

const A4 = { width: 595.28, height: 841.89 }
const COLUMNS = 2
const ROWS = 4
const MARGIN_X = 28 // ≈ 10 mm
const MARGIN_Y = 36 // ≈ 13 mm
const PADDING = 12
const INK = '#0f2340'
const TAGS_PER_PAGE = COLUMNS * ROWS
const CONDENSED = 78 // horizontal scaling, per cent: a condensed look from the bundled Helvetica
// pdfkit supports horizontalScaling; its type definitions do not list it yet.
const condensed = { horizontalScaling: CONDENSED } as PDFKit.Mixins.TextOptions

export function tagSheetFilename(slug: string): string {
  return `tags-${slug.replace(/[^\w-]+/g, '-')}.pdf`
}

/** The QR code of `url` as filled squares, `size` points wide, top-left at (x, y). */
function drawQr(doc: PDFKit.PDFDocument, url: string, x: number, y: number, size: number): void {
  const { modules } = QRCode.create(url, { errorCorrectionLevel: 'M' })
  const cell = size / modules.size
  for (let r = 0; r < modules.size; r++) {
    for (let c = 0; c < modules.size; c++) {
      // Slight overlap so no hairline gaps show between neighbouring squares.
      if (modules.data[r * modules.size + c]) doc.rect(x + c * cell, y + r * cell, cell + 0.05, cell + 0.05)
    }
  }
  doc.fill(INK)
}

/** The largest font size up to `max` at which `text` fits `width` (condensed). */
function fittingSize(doc: PDFKit.PDFDocument, text: string, width: number, max: number): number {
  doc.fontSize(100)
  const at100 = doc.widthOfString(text) * CONDENSED / 100
  return Math.min(max, Math.floor((width / at100) * 100))
}

function drawTag(doc: PDFKit.PDFDocument, tag: PrintableTag, competitionName: string, x: number, y: number, w: number, h: number): void {
  doc.save().lineWidth(0.4).dash(3, { space: 3 }).strokeColor('#8a96a8').rect(x, y, w, h).stroke().undash().restore()

  const qrSize = h - 2 * PADDING - 18
  const qrX = x + w - PADDING - qrSize
  const qrY = y + PADDING
  drawQr(doc, tag.url, qrX, qrY, qrSize)

  const textX = x + PADDING
  const textW = qrX - textX - 10
  const compId = tag.compId.toUpperCase()
  doc.fillColor(INK).font('Helvetica-Bold')
  const size = fittingSize(doc, compId, textW, 84)
  doc.fontSize(size).text(compId, textX, y + PADDING - size * 0.12, { width: textW, lineBreak: false, ...condensed })

  const code = `${tag.tag.shortCode.slice(0, 4)}-${tag.tag.shortCode.slice(4)}`
  doc.font('Courier-Bold').fontSize(15).text(code, textX, y + PADDING + size * 0.9, { width: textW + 10, lineBreak: false })
  doc.font('Helvetica').fontSize(9)
    .text(tag.className, textX, y + PADDING + size * 0.9 + 22, { width: textW, lineBreak: false, ellipsis: true })
    .text(tag.registration, textX, y + PADDING + size * 0.9 + 34, { width: textW, lineBreak: false, ellipsis: true })

  doc.font('Helvetica').fontSize(7).fillColor('#3b4a61')
    .text(competitionName, x + PADDING, y + h - PADDING - 8, { width: w - 2 * PADDING, lineBreak: false, ellipsis: true })
}

/** The sheet as a PDF document: as many pages as the tags need. */
export function renderTagSheet(input: { competitionName: string, tags: PrintableTag[] }): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: 0,
    autoFirstPage: false,
    info: { Title: `Glider tags — ${input.competitionName}`, Creator: 'Gridmark' },
  })
  const chunks: Buffer[] = []
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })

  const cellW = (A4.width - 2 * MARGIN_X) / COLUMNS
  const cellH = (A4.height - 2 * MARGIN_Y) / ROWS
  if (!input.tags.length) {
    doc.addPage()
    doc.font('Helvetica').fontSize(14).fillColor(INK)
      .text('No current tags in this selection: issue tags first.', MARGIN_X, MARGIN_Y, { width: A4.width - 2 * MARGIN_X })
  }
  input.tags.forEach((tag, i) => {
    const slot = i % TAGS_PER_PAGE
    if (slot === 0) doc.addPage()
    const col = slot % COLUMNS
    const row = Math.floor(slot / COLUMNS)
    drawTag(doc, tag, input.competitionName, MARGIN_X + col * cellW, MARGIN_Y + row * cellH, cellW, cellH)
  })
  doc.end()
  return done
}
