// The glider report as an A4 PDF (pdfkit, in the tag sheet's manner: the bundled Helvetica, the
// deep ink blue, a condensed competition ID). Each entry starts on a new page: a header with
// the competition ID large, then the dossier, units, documents, findings, grid checks,
// weigh-ins and the director's actions, each a small table that breaks across pages with its
// column heads repeated. Every page's foot names the glider and numbers the page, and says that
// Gridmark assists the scrutineers and does not replace their judgement.
import PDFDocument from 'pdfkit'
import { HARDWARE_CAUTION } from '#shared/engine'
import { APPROVAL_LEVEL_LABELS, type ApprovalLevel } from '#shared/constants/entries'
import { READINESS_LABELS } from '#shared/constants/readiness'
import type { EntryReport, GliderReport, ReportFinding } from './entry-report'

const A4 = { width: 595.28, height: 841.89 }
const MARGIN_X = 48 // ≈ 17 mm
const MARGIN_TOP = 48
const MARGIN_BOTTOM = 62 // room for the foot
const CONTENT_W = A4.width - 2 * MARGIN_X
const INK = '#0f2340'
const MUTED = '#4a5870'
const RULE = '#b9c2d0'
const SHADE = '#eef1f6'
const HELD = '#9b1c1c'
const BODY = 9
const CELL_PAD = 4
const CONDENSED = 78 // horizontal scaling, per cent, as the tag sheet
// pdfkit supports horizontalScaling; its type definitions do not list it yet.
const condensed = { horizontalScaling: CONDENSED } as PDFKit.Mixins.TextOptions

const DISCLAIMER = 'Gridmark assists the scrutineers; it does not replace their judgement.'
const RESULT_WORDS: Record<string, string> = { 'pass': 'Pass', 'fail': 'Fail', 'not-checked': 'Not checked' }
const STATE_WORDS: Record<ReportFinding['state'], string> = { 'open': 'Open', 'waiting for review': 'Open, waiting for review', 'waived': 'Waived', 'fixed': 'Fixed' }
const ENTRY_STATUS_WORDS: Record<string, string> = { draft: 'Draft', submitted: 'Submitted', accepted: 'Accepted', rejected: 'Rejected', withdrawn: 'Withdrawn' }
const PAYMENT_WORDS: Record<string, string> = { unpaid: 'Not paid', paid: 'Paid', refunded: 'Refunded' }
const POINT_WORDS: Record<string, string> = { 'main-wheel': 'main wheel', 'tail-wheel': 'tail wheel', 'tail-skid': 'tail skid', 'nose-wheel': 'nose wheel' }
const ACTION_WORDS: Record<string, string> = { hold: 'Hold', release: 'Release', waiver: 'Waiver' }

interface Column {
  label: string
  width: number
  align?: 'left' | 'right'
  bold?: boolean
  /** The cell's first line in bold (a check id above its rule). */
  firstLineBold?: boolean
}

/** A number with up to `digits` decimals, or a dash. */
function n(v: number | null | undefined, digits = 1): string {
  return v == null ? '—' : new Intl.NumberFormat('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: 0 }).format(v)
}

/** An instant as YYYY-MM-DD HH:mm in the competition's time zone. */
export function localTime(isoInstant: string, timeZone: string): string {
  const parts = Object.fromEntries(new Intl.DateTimeFormat('en-CA', {
    timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23',
  }).formatToParts(new Date(isoInstant)).map(p => [p.type, p.value]))
  return `${parts.year}-${parts.month}-${parts.day} ${parts.hour}:${parts.minute}`
}

/** Writes the report top to bottom, adding pages as needed; remembers which glider each page belongs to. */
class ReportWriter {
  readonly pageOwners: string[] = []
  private owner = ''

  constructor(readonly doc: PDFKit.PDFDocument, readonly report: GliderReport) {
    // Every page, also one pdfkit adds itself for a long paragraph, belongs to the glider being written.
    doc.on('pageAdded', () => this.pageOwners.push(this.owner))
  }

  private get bottom(): number {
    return A4.height - MARGIN_BOTTOM
  }

  newPage(owner: string): void {
    this.owner = owner
    this.doc.addPage()
    this.doc.x = MARGIN_X
    this.doc.y = MARGIN_TOP
  }

  /** A new page when less than `height` is left on this one; a continued page names its glider. */
  ensure(height: number): boolean {
    if (this.doc.y + height <= this.bottom) return false
    this.newPage(this.owner)
    this.doc.font('Helvetica').fontSize(8).fillColor(MUTED)
      .text(`${this.owner} — continued`, MARGIN_X, MARGIN_TOP - 20, { width: CONTENT_W, lineBreak: false })
    this.doc.x = MARGIN_X
    this.doc.y = MARGIN_TOP
    return true
  }

  gap(h: number): void {
    this.doc.y += h
  }

  heading(text: string): void {
    this.ensure(60)
    this.gap(8)
    const y = this.doc.y
    this.doc.font('Helvetica-Bold').fontSize(12).fillColor(INK).text(text, MARGIN_X, y, { width: CONTENT_W })
    const below = this.doc.y + 2
    this.doc.save().moveTo(MARGIN_X, below).lineTo(MARGIN_X + CONTENT_W, below).lineWidth(1).strokeColor(INK).stroke().restore()
    this.doc.y = below + 6
  }

  subheading(text: string): void {
    this.ensure(40)
    this.gap(4)
    this.doc.font('Helvetica-Bold').fontSize(10).fillColor(INK).text(text, MARGIN_X, this.doc.y, { width: CONTENT_W })
    this.gap(3)
  }

  paragraph(text: string, opts: { muted?: boolean, size?: number, bold?: boolean } = {}): void {
    const size = opts.size ?? BODY
    this.doc.font(opts.bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(size)
    const h = this.doc.heightOfString(text, { width: CONTENT_W })
    this.ensure(Math.min(h, 80))
    this.doc.fillColor(opts.muted ? MUTED : INK).text(text, MARGIN_X, this.doc.y, { width: CONTENT_W })
    this.gap(3)
  }

  /** Label–value pairs in `columns` columns. */
  pairs(items: [string, string][], columns = 3): void {
    const colW = CONTENT_W / columns
    for (let i = 0; i < items.length; i += columns) {
      const row = items.slice(i, i + columns)
      this.doc.fontSize(BODY)
      const h = Math.max(...row.map(([, v]) => this.doc.font('Helvetica-Bold').heightOfString(v || '—', { width: colW - 8 }))) + 12
      this.ensure(h)
      const y = this.doc.y
      row.forEach(([label, value], j) => {
        const x = MARGIN_X + j * colW
        this.doc.font('Helvetica').fontSize(7).fillColor(MUTED).text(label.toUpperCase(), x, y, { width: colW - 8, lineBreak: false, characterSpacing: 0.4 })
        this.doc.font('Helvetica-Bold').fontSize(BODY).fillColor(INK).text(value || '—', x, y + 9, { width: colW - 8 })
      })
      this.doc.y = y + h
    }
  }

  /** A table; rows that do not fit go on to the next page under the column heads again. */
  table(columns: Column[], rows: string[][], opts: { shadeRow?: (i: number) => boolean, colour?: (row: number, col: number) => string | undefined } = {}): void {
    const widths = columns.map(c => c.width)
    const scale = CONTENT_W / widths.reduce((a, b) => a + b, 0)
    const ws = widths.map(w => w * scale)
    const xs = ws.map((_, i) => MARGIN_X + ws.slice(0, i).reduce((a, b) => a + b, 0))
    const head = () => {
      const y = this.doc.y
      this.doc.font('Helvetica-Bold').fontSize(7.5)
      const h = Math.max(...columns.map((c, i) => this.doc.heightOfString(c.label, { width: ws[i]! - 2 * CELL_PAD }))) + 2 * CELL_PAD
      this.doc.save().rect(MARGIN_X, y, CONTENT_W, h).fill(SHADE).restore()
      columns.forEach((c, i) => {
        this.doc.fillColor(MUTED).text(c.label, xs[i]! + CELL_PAD, y + CELL_PAD, { width: ws[i]! - 2 * CELL_PAD, align: c.align ?? 'left' })
      })
      this.doc.y = y + h
    }
    this.ensure(40)
    head()
    // A cell as runs of text, each in its font, one under the other.
    const runs = (cell: string, c: Column): [string, string][] => {
      const text = cell || '—'
      if (!c.firstLineBold) return [[c.bold ? 'Helvetica-Bold' : 'Helvetica', text]]
      const [first, ...rest] = text.split('\n')
      return rest.length ? [['Helvetica-Bold', first!], ['Helvetica', rest.join('\n')]] : [['Helvetica-Bold', first!]]
    }
    rows.forEach((row, r) => {
      const heights = row.map((cell, i) => runs(cell, columns[i]!).reduce((sum, [font, text]) =>
        sum + this.doc.font(font).fontSize(BODY).heightOfString(text, { width: ws[i]! - 2 * CELL_PAD }), 0))
      const h = Math.max(...heights) + 2 * CELL_PAD
      if (this.ensure(h)) head()
      const y = this.doc.y
      if (opts.shadeRow?.(r)) this.doc.save().rect(MARGIN_X, y, CONTENT_W, h).fill('#f7f8fb').restore()
      row.forEach((cell, i) => {
        let at = y + CELL_PAD
        for (const [font, text] of runs(cell, columns[i]!)) {
          this.doc.font(font).fontSize(BODY).fillColor(opts.colour?.(r, i) ?? INK)
            .text(text, xs[i]! + CELL_PAD, at, { width: ws[i]! - 2 * CELL_PAD, align: columns[i]!.align ?? 'left' })
          at = this.doc.y
        }
      })
      this.doc.save().moveTo(MARGIN_X, y + h).lineTo(MARGIN_X + CONTENT_W, y + h).lineWidth(0.4).strokeColor(RULE).stroke().restore()
      this.doc.y = y + h
    })
    this.gap(6)
  }

  // -------------------------------------------------------------------------------------
  // One entry

  entry(e: EntryReport): void {
    const { report, doc } = this
    const tz = report.competition.timeZone
    this.newPage(`${e.entry.compId} · ${e.entry.registration}`)

    // Header: the competition, the competition ID large, who and what it is.
    doc.font('Helvetica').fontSize(8).fillColor(MUTED)
      .text(`GLIDER REPORT · ${report.competition.name.toUpperCase()}`, MARGIN_X, MARGIN_TOP, { width: CONTENT_W, characterSpacing: 0.6, lineBreak: false, ellipsis: true })
    const top = MARGIN_TOP + 16
    const cid = e.entry.compId.toUpperCase()
    doc.font('Helvetica-Bold').fontSize(56).fillColor(INK).text(cid, MARGIN_X, top - 6, { lineBreak: false, ...condensed })
    const cidW = doc.widthOfString(cid) * CONDENSED / 100
    const x = MARGIN_X + Math.max(cidW, 40) + 18
    const w = MARGIN_X + CONTENT_W - x
    doc.font('Helvetica-Bold').fontSize(16).text(e.entry.pilotName, x, top, { width: w, lineBreak: false, ellipsis: true })
    doc.font('Helvetica').fontSize(10.5)
      .text(`${e.entry.gliderType} · ${e.entry.registration} · ${e.entry.className}`, x, top + 20, { width: w, lineBreak: false, ellipsis: true })
    const evaluated = report.day
      ? `Findings as the checks read them on ${report.day.day} (${report.day.kind === 'practice' ? 'practice' : 'contest'} day, ${report.day.status}).`
      : 'Findings as the checks read them today: no contest day has been opened yet.'
    doc.fontSize(8).fillColor(MUTED)
      .text(`Printed ${localTime(report.generatedAt, tz)} (${tz}). ${evaluated}`, x, top + 36, { width: w })
    doc.y = Math.max(doc.y, top + 56) + 4
    doc.save().moveTo(MARGIN_X, doc.y).lineTo(MARGIN_X + CONTENT_W, doc.y).lineWidth(2).strokeColor(INK).stroke().restore()
    this.gap(6)

    this.dossier(e)
    this.units(e)
    this.documents(e)
    this.findings(e)
    this.gridChecks(e)
    this.weighIns(e)
    this.actions(e)
  }

  private dossier(e: EntryReport): void {
    const d = e.entry
    this.heading('Dossier')
    const cg = d.cgForwardLimitM == null && d.cgAftLimitM == null ? '' : `${n(d.cgForwardLimitM, 3)} to ${n(d.cgAftLimitM, 3)} m aft of datum`
    this.pairs([
      ['Pilot in command', d.pilotName],
      ['Co-pilot', d.copilotName ?? 'None'],
      ['Competition ID', d.compId],
      ['Glider type', d.gliderType],
      ['Registration', d.registration],
      ['Class', d.className],
      ['Span', d.spanM == null ? '' : `${n(d.spanM, 2)} m`],
      ['MTOM (flight manual)', d.mtomKg == null ? '' : `${n(d.mtomKg)} kg`],
      ['CG limits', cg],
      ['Propulsion', d.motorGlider],
      ['Entry', ENTRY_STATUS_WORDS[d.status] ?? d.status],
      ['Entry fee', PAYMENT_WORDS[d.paymentStatus] ?? d.paymentStatus],
    ])
  }

  private units(e: EntryReport): void {
    this.heading('Units')
    const cw = e.units.filter(u => u.kind === 'collision-warning')
    const fr = e.units.filter(u => u.kind === 'flight-recorder')
    this.subheading('Collision-warning units')
    if (!cw.length) this.paragraph('None declared.', { muted: true })
    else {
      this.table(
        [{ label: 'Model', width: 110 }, { label: 'Serial', width: 70 }, { label: 'Radio ID', width: 60, bold: true }, { label: 'Firmware', width: 55 },
          { label: 'Firmware expires', width: 70 }, { label: 'Last updated', width: 65 }, { label: 'Obstacle data until', width: 70 }],
        cw.map(u => [u.model, u.serial ?? '', u.radioId ?? '', u.firmwareVersion ?? '', u.firmwareExpiresOn ?? '', u.firmwareUpdatedOn ?? '', u.obstacleDbExpiresOn ?? '']),
      )
    }
    this.subheading('Flight recorders')
    if (!fr.length) this.paragraph('None declared.', { muted: true })
    else {
      this.table(
        [{ label: 'Model', width: 120 }, { label: 'Serial', width: 80 }, { label: 'IGC recorder ID', width: 80, bold: true }, { label: 'Firmware', width: 60 }, { label: 'Approval level', width: 130 }],
        fr.map(u => [u.model, u.serial, u.igcRecorderId ?? '', u.firmwareVersion ?? '', u.approvalLevel ? (APPROVAL_LEVEL_LABELS[u.approvalLevel as ApprovalLevel] ?? u.approvalLevel) : '']),
      )
    }
  }

  private documents(e: EntryReport): void {
    this.heading('Documents')
    if (!e.documents.length) {
      this.paragraph('None uploaded, and none required.', { muted: true })
      return
    }
    this.table(
      [{ label: 'Document', width: 150, bold: true }, { label: 'Required', width: 60 }, { label: 'State', width: 100 }, { label: 'Valid until', width: 80 }, { label: 'Through the last contest day', width: 110 }],
      e.documents.map(d => [d.label, d.required ? 'Yes' : 'No', d.state, d.validUntil ?? '', d.validThroughContest === null ? '' : d.validThroughContest ? 'Yes' : 'No']),
      { colour: (r, c) => (c === 4 && e.documents[r]!.validThroughContest === false) || (c === 2 && ['Rejected', 'Not uploaded'].includes(e.documents[r]!.state)) ? HELD : undefined },
    )
    this.paragraph('Only each document’s kind, state and validity are printed, never its content.', { muted: true, size: 7.5 })
  }

  private findings(e: EntryReport): void {
    this.heading('Findings')
    if (!e.findings.length) {
      this.paragraph('No finding, now or earlier.', { muted: true })
      return
    }
    this.table(
      [{ label: 'Rule', width: 170, firstLineBold: true }, { label: 'Severity', width: 58 }, { label: 'State', width: 70, bold: true }, { label: 'What the check found', width: 200 }],
      e.findings.map(f => [
        `${f.checkId}\n${f.title}`,
        f.severity === 'blocking' ? 'Blocking' : 'Advisory',
        STATE_WORDS[f.state],
        [f.reason, f.detail, f.caution ? 'Touches hardware: see the caution below.' : null].filter(Boolean).join('\n'),
      ]),
      { colour: (r, c) => (c === 2 && e.findings[r]!.state === 'open' && e.findings[r]!.severity === 'blocking' ? HELD : undefined) },
    )
    if (e.findings.some(f => f.caution)) this.paragraph(`Caution: ${HARDWARE_CAUTION}`, { size: 8 })
  }

  private gridChecks(e: EntryReport): void {
    const tz = this.report.competition.timeZone
    this.heading('Grid checks')
    if (!e.gridChecks.length) {
      this.paragraph('No grid check recorded.', { muted: true })
      return
    }
    for (const g of e.gridChecks) {
      this.subheading(`${g.day} · checked ${localTime(g.checkedAt, tz)} by ${g.scrutineer.name} · ${g.outcome === 'pass' ? 'passed' : 'failed'} · ${READINESS_LABELS[g.readiness] ?? g.readiness}`)
      this.table(
        [{ label: 'Checklist item', width: 220 }, { label: 'Answer', width: 70, bold: true }, { label: 'Note', width: 210 }],
        g.answers.map(a => [a.label, RESULT_WORDS[a.result] ?? a.result, a.note]),
        { colour: (r, c) => (c === 1 && g.answers[r]!.result === 'fail' ? HELD : undefined) },
      )
      if (g.notes) this.paragraph(`Notes: ${g.notes}`)
      if (g.weighIn) this.paragraph(`Weighed with this check: ${n(g.weighIn.massKg)} kg on the scales (see the weigh-ins).`)
    }
  }

  private weighIns(e: EntryReport): void {
    this.heading('Weigh-ins')
    if (!e.weighIns.length) {
      this.paragraph('Not weighed.', { muted: true })
      return
    }
    const d = e.entry
    for (const w of e.weighIns) {
      const [mu, au] = w.units === 'lb-in' ? ['lb', 'in'] : ['kg', 'm']
      this.subheading(`Weighed on ${w.weighedOn}`)
      this.paragraph(`Scale readings: ${w.readings.map(r => `${POINT_WORDS[r.point] ?? r.point} ${n(r.weight)} ${mu} at ${n(r.arm, 3)} ${au}`).join('; ')}.`)
      this.table(
        [{ label: 'Term of the take-off mass', width: 260 }, { label: 'Mass (kg)', width: 80, align: 'right' }, { label: 'Lever arm (m)', width: 80, align: 'right' }],
        [
          ...w.terms.map(t => [t.label, n(t.massKg), t.armM == null ? '' : n(t.armM, 3)]),
          ['Take-off mass (sum of the terms)', n(w.massKg), w.cgArmM == null ? '' : `CG ${n(w.cgArmM, 3)}`],
        ],
        { shadeRow: i => i === w.terms.length },
      )
      const limits = [
        d.classMaxMtomKg != null ? `class limit ${n(d.classMaxMtomKg)} kg` : null,
        d.mtomKg != null ? `flight manual MTOM ${n(d.mtomKg)} kg` : null,
        d.cgForwardLimitM != null || d.cgAftLimitM != null ? `CG limits ${n(d.cgForwardLimitM, 3)} to ${n(d.cgAftLimitM, 3)} m` : null,
      ].filter(Boolean)
      const missing = w.armsMissing.length ? ` The CG cannot be computed: no lever arm for ${w.armsMissing.join(', ')}.` : ''
      if (limits.length || missing) this.paragraph(`${limits.length ? `Against: ${limits.join('; ')}.` : ''}${missing}`, { muted: true })
    }
  }

  private actions(e: EntryReport): void {
    const tz = this.report.competition.timeZone
    this.heading('The director’s actions')
    if (!e.actions.length) {
      this.paragraph('None: no hold, release or waiver.', { muted: true })
      return
    }
    this.table(
      [{ label: 'When', width: 80 }, { label: 'Action', width: 60, bold: true }, { label: 'For', width: 95 }, { label: 'Reason', width: 185 }, { label: 'By', width: 80 }],
      e.actions.map(a => [
        localTime(a.at, tz),
        ACTION_WORDS[a.kind] ?? a.kind,
        [a.kind === 'waiver' ? (a.scope === 'competition' ? 'The competition' : a.day ?? '') : a.day ?? '', a.checkId].filter(Boolean).join('\n'),
        a.withdrawal ? `${a.reason}\nWithdrawn ${localTime(a.withdrawal.at, tz)} by ${a.withdrawal.by.name}: ${a.withdrawal.reason}` : a.reason,
        a.actor.name,
      ]),
    )
  }

  /** The foot of every page: the glider, the page number, the disclaimer. */
  feet(): void {
    const { doc } = this
    const range = doc.bufferedPageRange()
    for (let i = range.start; i < range.start + range.count; i++) {
      doc.switchToPage(i)
      // Text below the bottom margin would start a new page: no margin while writing the foot.
      const margins = doc.page.margins
      doc.page.margins = { ...margins, bottom: 0 }
      const y = A4.height - 40
      doc.save().moveTo(MARGIN_X, y - 6).lineTo(MARGIN_X + CONTENT_W, y - 6).lineWidth(0.4).strokeColor(RULE).stroke().restore()
      doc.font('Helvetica').fontSize(7.5).fillColor(MUTED)
      const owner = this.pageOwners[i - range.start] ?? ''
      doc.text(`${this.report.competition.name} · ${owner}`, MARGIN_X, y, { width: CONTENT_W * 0.7, lineBreak: false, ellipsis: true })
      doc.text(`Page ${i - range.start + 1} of ${range.count}`, MARGIN_X + CONTENT_W * 0.7, y, { width: CONTENT_W * 0.3, align: 'right', lineBreak: false })
      doc.text(DISCLAIMER, MARGIN_X, y + 11, { width: CONTENT_W, lineBreak: false })
      doc.page.margins = margins
    }
  }
}

/** The report as a PDF: each entry from a new page; one page saying so when there is none. */
export function renderGliderReport(report: GliderReport): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: MARGIN_TOP, bottom: MARGIN_BOTTOM, left: MARGIN_X, right: MARGIN_X },
    autoFirstPage: false,
    bufferPages: true,
    info: { Title: `${report.title} — ${report.competition.name}`, Creator: 'Gridmark' },
  })
  const chunks: Buffer[] = []
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })
  const writer = new ReportWriter(doc, report)
  if (!report.entries.length) {
    writer.newPage(report.title)
    doc.font('Helvetica-Bold').fontSize(16).fillColor(INK).text(report.title, MARGIN_X, MARGIN_TOP, { width: CONTENT_W })
    doc.moveDown(0.5).font('Helvetica').fontSize(11).text('No accepted entry in this selection: nothing to report yet.', { width: CONTENT_W })
  }
  for (const e of report.entries) writer.entry(e)
  writer.feet()
  doc.end()
  return done
}
