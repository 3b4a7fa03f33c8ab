// Reads an IGC file's header with igc-parser in lenient mode, collecting each line's error
// with its line number. A file without an A record (or date) is not an IGC file at all.
// Field sources: IGC GNSS FR specification Appendix A, H records (HFDTE, HFPLT, HFCM2, HFGTY,
// HFGID, HFCID, HFCCL, HFFTY, HFRFW), the A and I records (A3.1, A3.4) and the G record, the
// security record (A3.2) — paragraph numbers of the 2008 edition.
import IGCParser from 'igc-parser'

export interface IgcHeader {
  flightDate: string | null
  pilot: string | null
  copilot: string | null
  gliderType: string | null
  gliderId: string | null
  competitionId: string | null
  competitionClass: string | null
  recorderType: string | null
  firmwareVersion: string | null
  /** The A record's manufacturer code and serial id, six characters ("XXXABC"). */
  recorderId: string | null
  /** The three-letter codes the I record declares, in its order ("FXA", "SIU", "ENL"). */
  extensions: string[]
  hasGRecord: boolean
}

export interface IgcLineError {
  line: number
  message: string
}

export type IgcParseResult =
  | { ok: true, header: IgcHeader, errors: IgcLineError[] }
  | { ok: false, error: IgcLineError, errors: IgcLineError[] }

interface LineParser {
  processLine(line: string): void
  readonly result: IGCParser.IGCFile
}

/** The parser's message without its own " at line N: <line>" tail (we give the line apart). */
function plainMessage(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error)
  return message.replace(/ at line \d+:.*$/s, '').trim()
}

function clean(value: string | null | undefined): string | null {
  const v = value?.trim()
  return v ? v : null
}

/** A crew header of "NIL" (any case) names nobody (common practice of recorders' declarations). */
function crew(value: string | null | undefined): string | null {
  const v = clean(value)
  return v && /^nil$/i.test(v) ? null : v
}

/**
 * The A record: "A" + the manufacturer's three-character code + the recorder's three-character
 * serial id + free text (IGC GNSS FR specification Appendix A, A3.1: "AXXXABC…").
 */
export function recorderIdOf(lines: readonly string[]): string | null {
  const a = lines.find(l => l.startsWith('A'))
  const m = a?.match(/^A([A-Z0-9]{3})([A-Z0-9]{3})/i)
  return m ? `${m[1]}${m[2]}`.toUpperCase() : null
}

/**
 * The I record: "I" + the number of extensions (2 digits), then for each its start and finish
 * byte (2 digits each) and three-letter code (Appendix A, A3.4: "I033638FXA3940SIU4143ENL").
 */
export function extensionsOf(lines: readonly string[]): string[] {
  const i = lines.find(l => l.startsWith('I'))
  const m = i?.match(/^I(\d{2})/)
  if (!i || !m) return []
  const out: string[] = []
  for (let k = 0; k < Number(m[1]); k++) {
    const part = i.slice(3 + k * 7, 10 + k * 7)
    if (!/^\d{4}[A-Z0-9]{3}$/i.test(part)) break
    out.push(part.slice(4).toUpperCase())
  }
  return out
}

/**
 * The parse, as steps: it yields after every slice of lines so that a caller can give the
 * event loop its turn between slices (a 5 MB file takes a couple of seconds of CPU).
 */
function* parseSteps(text: string, sliceLines: number): Generator<void, IgcParseResult> {
  const lines = text.split('\n')
  const trimmed = lines.map(l => l.trim())
  // The same loop as IGCParser.parse in lenient mode, but keeping each error's line number.
  const parser = new IGCParser({ lenient: true }) as unknown as LineParser
  const errors: IgcLineError[] = []
  let firstContentLine = 0
  for (const [index, line] of trimmed.entries()) {
    if (index > 0 && index % sliceLines === 0) yield
    if (line && !firstContentLine) firstContentLine = index + 1
    try {
      parser.processLine(line)
    }
    catch (error) {
      errors.push({ line: index + 1, message: plainMessage(error) })
    }
  }
  // A file must open with its A record (Appendix A); binary data is not a text record at all.
  const binary = text.includes('\u0000')
  let result: IGCParser.IGCFile
  try {
    if (binary) throw new Error('Missing A record')
    result = parser.result
  }
  catch (error) {
    const message = plainMessage(error)
    // No A record: the file fails at its first line. Otherwise the first broken line says more
    // ("Missing HFDTE record before first B record", line 2) than the summary does.
    if (/A record/.test(message) || !errors[0]) return { ok: false, error: { line: Math.max(1, firstContentLine), message }, errors }
    return { ok: false, error: errors[0], errors }
  }
  return {
    ok: true,
    errors,
    header: {
      flightDate: clean(result.date),
      pilot: clean(result.pilot),
      copilot: crew(result.copilot),
      gliderType: clean(result.gliderType),
      gliderId: clean(result.registration),
      competitionId: clean(result.callsign),
      competitionClass: clean(result.competitionClass),
      recorderType: clean(result.loggerType),
      firmwareVersion: clean(result.firmwareVersion),
      recorderId: recorderIdOf(trimmed),
      extensions: extensionsOf(trimmed),
      hasGRecord: Boolean(result.security),
    },
  }
}

/** Parses the whole text at once: for small files, seeds and tests. */
export function parseIgc(text: string): IgcParseResult {
  const steps = parseSteps(text, Number.MAX_SAFE_INTEGER)
  for (;;) {
    const step = steps.next()
    if (step.done) return step.value
  }
}

/** Lines parsed between two looks at the clock. */
const SLICE_LINES = 500
/** The longest the parse holds the event loop at a time. */
const SLICE_MS = 10

/**
 * The same parse for an uploaded file: it gives the event loop back every SLICE_MS, so a
 * large file never keeps the server from answering anyone else.
 */
export async function parseIgcInSlices(text: string): Promise<IgcParseResult> {
  const steps = parseSteps(text, SLICE_LINES)
  let sliceStart = performance.now()
  for (;;) {
    const step = steps.next()
    if (step.done) return step.value
    if (performance.now() - sliceStart >= SLICE_MS) {
      await new Promise<void>(resolve => setImmediate(resolve))
      sliceStart = performance.now()
    }
  }
}
