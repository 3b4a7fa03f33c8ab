// `npm run bench`: the check engine's speed on invented data, then the live board under load.
//
//   engine  Builds 1,000 synthetic dossiers (a few with problems, a field with duplicate radio
//           IDs), then times evaluate() on one dossier (median of many runs) and on the whole
//           competition with its field (median of repeated passes). Targets: ≤ 1 ms per
//           dossier, ≤ 200 ms for 1,000 entries.
//   board   A throwaway database and the built server (scripts/lib/bench-board.ts): the time
//           from a grid check's POST to its tile on 200 pushed board screens, the same seen by
//           20 polling screens, and GET …/board of 1,000 entries. Targets: p95 ≤ 25 ms from
//           scan to board (and where that time goes), a push-to-poll ratio ≥ 60, ≤ 20 ms
//           for the snapshot.
//   pages   The demo on a throwaway database and the built server (scripts/lib/bench-pages.ts):
//           the gzipped JavaScript each of five pages loads until the network is idle, and
//           Lighthouse's mobile performance and accessibility scores (two runs, the better
//           kept). Budgets: landing 100 KB, grid and grid check 150 KB, board 120 KB; targets:
//           performance ≥ 90, accessibility 100. `npm run bench -- pages` runs this section alone.
//           `npm run bench -- board` runs the engine and board sections without it.
//
// Prints one `name: value unit` line per figure, a note under a figure that misses its target,
// and the counts of the board run (checks, samples, lost events). Exit code 1 when the board
// run itself went wrong (lost events, failed requests), 130 when interrupted.
import { performance } from 'node:perf_hooks'
import { benchBoard, benchInterrupted, type BoardBenchResult } from './lib/bench-board'
import { benchPages, pagesBenchInterrupted, type PagesBenchResult } from './lib/bench-pages'
import { reportError } from './lib/common'
import { DEFAULT_RULES } from '../shared/schemas/competition'
import { buildField } from '../shared/engine/field'
import { evaluate } from '../shared/engine/evaluate'
import type { CompetitionForEngine, Dossier, EngineUnit } from '../shared/engine/types'

/** The page section's figures, or its error; printed after the board's. */
async function pagesSection(): Promise<boolean> {
  let pages: PagesBenchResult | undefined
  try {
    pages = await benchPages()
  }
  catch (error) {
    reportError(error)
  }
  console.log('')
  if (!pages) console.error('bench: the page figures could not be taken (see above)')
  for (const line of [...pages?.lines ?? [], ...pages?.notes ?? []]) console.log(line)
  return pages !== undefined
}

if (process.argv[2] === 'pages') {
  const ok = await pagesSection()
  process.exit(pagesBenchInterrupted() ? 130 : ok ? 0 : 1)
}

const ENTRIES = 1000
const CLASSES = [
  { code: 'standard', name: 'Standard', mtom: 525 },
  { code: '18m', name: '18 Metre', mtom: 600 },
  { code: 'club', name: 'Club', mtom: 400 },
] as const
const LETTERS = 'ABCDEFGHJKLMNPRSTUVWXYZ'

const competition: CompetitionForEngine = {
  firstContestDay: '2027-07-12',
  lastContestDay: '2027-07-18',
  timeZone: 'Europe/Berlin',
  rules: DEFAULT_RULES,
  classLimits: { 'standard': { maxMtomKg: 525 }, '18m': { maxMtomKg: 600 }, 'club': { maxMtomKg: null } },
  firmwareCatalogue: [
    { family: 'Lapwing CW', version: '7.20', expiresOn: '2027-07-15' },
    { family: 'Lapwing CW', version: '7.24', expiresOn: '2028-03-31' },
    { family: 'Curlew CX', version: '3.4', expiresOn: '2028-06-30' },
  ],
}

function compId(i: number): string {
  return `${LETTERS[i % LETTERS.length]}${LETTERS[Math.floor(i / LETTERS.length) % LETTERS.length]}${i % 10}`
}

function dossier(i: number): Dossier {
  const cls = CLASSES[i % CLASSES.length]!
  const lapwing = i % 2 === 0
  const units: EngineUnit[] = [
    {
      id: `u${i}-cw`,
      kind: 'collision-warning',
      model: lapwing ? 'Lapwing CW' : 'Curlew CX',
      serial: `S${10000 + i}`,
      // Every 97th entry shares its radio ID with the next one.
      radioId: (0x3D0000 + (i % 97 === 0 ? i + 1 : i) * 0x1F3).toString(16).toUpperCase().padStart(6, '0'),
      firmwareVersion: lapwing ? (i % 50 === 0 ? '7.20' : '7.24') : '3.4',
      firmwareExpiresOn: lapwing ? (i % 50 === 0 ? '2027-07-15' : '2028-03-31') : '2028-06-30',
      firmwareUpdatedOn: i % 40 === 0 ? '2026-02-10' : '2027-03-15',
      obstacleDbExpiresOn: '2027-12-31',
    },
  ]
  if (i % 60 !== 0) units.push({ id: `u${i}-fr`, kind: 'flight-recorder', model: 'Plover FR-2', serial: `FR${7000 + i}`, approvalLevel: 'all-flights' })
  const registration = i % 25 === 0 ? `N${100 + i}` : `KM-${LETTERS[i % 23]}${LETTERS[(i * 5) % 23]}${LETTERS[(i * 11) % 23]}`
  return {
    entry: {
      id: `entry-${i}`,
      compId: compId(i),
      registration,
      gliderType: 'Tarn 15',
      pilotName: `Pilot ${i} Surname`,
      className: cls.name,
      classCode: cls.code,
      status: 'accepted',
      mtomKg: cls.mtom,
      cgForwardLimitM: 0.2,
      cgAftLimitM: 0.4,
    },
    units,
    documents: (['airworthiness', 'insurance', 'licence', 'medical'] as const).map(kind => ({ kind, status: i % 33 === 0 && kind === 'insurance' ? 'pending' as const : 'accepted' as const, expiresOn: '2028-01-31' })),
    igcFiles: i % 60 === 0
      ? []
      : [{ unitId: `u${i}-fr`, flightDate: '2027-05-20', pilot: `Surname Pilot ${i}`, gliderType: 'Tarn-15', gliderId: registration, competitionId: compId(i), competitionClass: i % 3 === 1 ? '18m' : cls.name, hasGRecord: i % 70 !== 0, uploadedAt: '2027-05-21T08:00:00Z' }],
    payment: { status: i % 45 === 0 ? 'unpaid' : 'paid' },
    weighIns: [{ weighedOn: '2027-07-12', units: 'kg-m', readings: [{ point: 'main-wheel', weight: 380 + (i % 40), arm: 0.1 }, { point: 'tail-wheel', weight: 22, arm: 4.1 }] }],
    gridCheck: null,
  }
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  const mid = Math.floor(s.length / 2)
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}

const dossiers = Array.from({ length: ENTRIES }, (_, i) => dossier(i))

// Warm up the JIT on the whole field before timing anything.
let findings = 0
for (let pass = 0; pass < 5; pass++) {
  const field = buildField(dossiers)
  for (const d of dossiers) findings += evaluate(d, competition, field).length
}

// One dossier: the median of many single evaluations against a ready field.
const readyField = buildField(dossiers)
const single: number[] = []
for (let run = 0; run < 5000; run++) {
  const d = dossiers[(run * 7919) % ENTRIES]!
  const t0 = performance.now()
  evaluate(d, competition, readyField)
  single.push(performance.now() - t0)
}

// The whole competition: build the field (uniqueness index included) and evaluate every entry.
const whole: number[] = []
for (let run = 0; run < 21; run++) {
  const t0 = performance.now()
  const field = buildField(dossiers)
  let n = 0
  for (const d of dossiers) n += evaluate(d, competition, field).length
  whole.push(performance.now() - t0)
  findings += n
}

const engineLines = [
  `engine_per_dossier_ms: ${median(single).toFixed(3)} ms`,
  `engine_1000_entries_ms: ${median(whole).toFixed(1)} ms`,
]
if (findings === 0) console.error('bench: the synthetic field produced no findings; check the generator')

// The board run prints its progress; all figures follow together at the end.
let board: BoardBenchResult | undefined
let boardError: unknown
try {
  board = await benchBoard()
}
catch (error) {
  boardError = error
}

console.log('')
for (const line of engineLines) console.log(line)
if (board) {
  for (const f of board.figures) console.log(`${f.name}: ${f.value.toFixed(f.digits)} ${f.unit}`)
  for (const line of [...board.notes, ...board.counts]) console.log(line)
}
else {
  reportError(boardError)
  console.error('bench: the board figures could not be taken (see above)')
}
const pagesOk = benchInterrupted() || process.argv[2] === 'board' ? true : await pagesSection()
process.exit(benchInterrupted() || pagesBenchInterrupted() ? 130 : board && !board.failed && pagesOk ? 0 : 1)
