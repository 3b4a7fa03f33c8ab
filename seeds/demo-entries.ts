// The demo competition's field: 40 invented entries with their units, and the firmware
// catalogue. Generated from fixed lists (no randomness), so every seed gives the same field.
// A few entries carry the problems a scrutineer should find (see SEEDED_PROBLEMS); the rest
// are in order. Glider types, registrations, unit families and people are all invented.
import type { EntryStatus, PaymentStatus } from '../shared/constants/entries'
import { DEMO_PEOPLE } from './demo-data'

/** Invented unit families and releases; "expires" is the first day the firmware no longer works. */
export const DEMO_FIRMWARE = [
  { family: 'Lapwing CW', version: '7.20', expiresOn: '2027-07-15' },
  { family: 'Lapwing CW', version: '7.24', expiresOn: '2028-03-31' },
  { family: 'Curlew CX', version: '3.1', expiresOn: '2027-08-05' },
  { family: 'Curlew CX', version: '3.4', expiresOn: '2028-06-30' },
] as const

const GLIDERS = {
  'club': [
    { type: 'Scree 102', spanM: 15, mtomKg: 400, emptyMassKg: 240 },
    { type: 'Fell Club', spanM: 15, mtomKg: 390, emptyMassKg: 235 },
  ],
  'standard': [
    { type: 'Tarn 15', spanM: 15, mtomKg: 525, emptyMassKg: 255 },
    { type: 'Corrie Std', spanM: 15, mtomKg: 525, emptyMassKg: 262 },
  ],
  '18m': [
    { type: 'Corrie 18', spanM: 18, mtomKg: 600, emptyMassKg: 330 },
    { type: 'Gill 18', spanM: 18, mtomKg: 600, emptyMassKg: 325 },
  ],
} as const
type DemoClassCode = keyof typeof GLIDERS

const FIRST_NAMES = ['Ansel', 'Brid', 'Cato', 'Delphine', 'Emrys', 'Fenna', 'Gideon', 'Halla', 'Ivo', 'Jessamy', 'Kasimir', 'Linnea', 'Matthias', 'Noor', 'Orla', 'Pascal', 'Quilla', 'Rasmus', 'Saoirse', 'Teodor', 'Ulla', 'Valter', 'Wenna', 'Xavi', 'Yolande', 'Zeno', 'Agathe', 'Bram', 'Cosima', 'Dario']
const LAST_NAMES = ['Achterberg', 'Blackmere', 'Castellane', 'Dunmore', 'Eskeland', 'Farrowby', 'Gallimore', 'Holmquist', 'Ingleby', 'Jarrow', 'Kettleby', 'Lindqvist', 'Marwick', 'Northcote', 'Ostrander', 'Pennywell', 'Quarrie', 'Rothwell', 'Stavanger', 'Thorne', 'Underhill', 'Voskuijlen', 'Whitlock', 'Yarrowby', 'Zandvoort', 'Ashby', 'Brightwater', 'Coldridge', 'Drummond', 'Ellery']
const NATIONS = ['NLD', 'GBR', 'DEU', 'FRA', 'DNK', 'SWE', 'AUT', 'BEL', 'IRL', 'NOR']

export interface DemoUnit {
  kind: 'collision-warning' | 'flight-recorder'
  model: string
  serial: string
  firmwareVersion: string
  radioId?: string
  firmwareExpiresOn?: string
  firmwareUpdatedOn?: string
  approvalLevel?: string
  /** A flight recorder's IGC recorder ID: the invented manufacturer code XKM and a serial id. */
  igcRecorderId?: string
  /** A flight recorder whose IGC file is not uploaded (seeds/demo-files.ts skips it). */
  noIgcFile?: boolean
}

export interface DemoEntry {
  /** The entrant's account: a demo sign-in or one of the other pilots (extraPilotEmail). */
  entrantEmail: string
  classCode: DemoClassCode
  status: EntryStatus
  decisionReason?: string
  pilotName: string
  pilotNationality: string
  pilotLicenceNumber: string
  pilotPhone: string
  emergencyContact: string
  copilotName?: string
  crewNames: string[]
  gliderType: string
  registration: string
  compId: string
  spanM: number
  mtomKg: number
  emptyMassKg: number
  motorGlider: 'none' | 'self-launching' | 'sustainer' | 'electric'
  /** The pilot's and co-pilot's mass with parachute from the registration weighing (accepted entries). */
  pilotMassKg?: number
  copilotMassKg?: number
  paymentStatus: PaymentStatus
  units: DemoUnit[]
}

/** What is wrong on purpose, by competition ID, for README and the scrutineers' demo. */
export const SEEDED_PROBLEMS: Record<string, string> = {
  K7: 'collision-warning firmware expires during the contest (Lapwing CW 7.20, 2027-07-15)',
  T3: 'collision-warning firmware expires soon after the contest (Curlew CX 3.1, 2027-08-05)',
  B2: 'radio ID 3E91C4, the same as M5',
  M5: 'radio ID 3E91C4, the same as B2',
  F9: 'submitted but unpaid',
  R4: 'no flight recorder declared',
  H8: 'firmware last updated more than a year before the contest',
  C4: 'insurance rejected by a scrutineer (seeds/demo-files.ts)',
  G5: 'the IGC file declares another glider ID and competition ID (seeds/demo-files.ts)',
  D6: 'an 18 m span entered in the Standard class (15 m)',
  E2: 'a sustainer motor glider whose IGC file records no engine use',
  S2: 'its second flight recorder has no IGC file',
  N1: 'no collision-warning unit declared',
  P6: 'overweight at the registration weigh-in with the pilot aboard (452 kg on the scales + pilot 91 kg = 543 kg; Standard allows 525 kg)',
}

/** Motor gliders of the demo: E2 without engine recording (a seeded problem), L8 recording it. */
export const DEMO_MOTOR_GLIDERS: Record<string, DemoEntry['motorGlider']> = { E2: 'sustainer', L8: 'self-launching' }

/**
 * The weigh-in of P6 (seeds/demo-files.ts) at the organisers' weighing day when registration
 * opened — before any day the demo plays, so every screen reads the same latest weigh-in: the
 * glider alone on the scales, kg and m.
 */
export const DEMO_WEIGH_IN = { compId: 'P6', weighedOn: '2026-11-01', readings: [{ point: 'main-wheel', weight: 420, arm: 0.21 }, { point: 'tail-wheel', weight: 32, arm: 4.6 }] } as const

const ENTRY_COUNT = 40
const DEMO_ENTRANTS = DEMO_PEOPLE.filter(p => p.roles.includes('entrant'))
const COMP_IDS = ['K7', 'T3', 'B2', 'M5', 'F9', 'R4', 'H8', 'A1', 'C4', 'D6', 'E2', 'G5', 'J3', 'L8', 'N1', 'P6', 'Q9', 'S2', 'U7', 'V4', 'W1', 'X8', 'Y3', 'Z5', 'AB', 'CD', 'EF', 'GH', 'JK', 'LM', 'NP', 'QR', 'ST', 'UV', 'WX', 'YZ', '11', '22', '33', '44']
const CLASS_CYCLE: DemoClassCode[] = ['standard', '18m', 'club']
const LETTERS = 'ABCDEFGHJKLMNPRSTUVWXYZ'

function status(i: number, compId: string): EntryStatus {
  if (compId === 'F9') return 'submitted'
  if (i === 35 || i === 36) return 'draft'
  if (i >= 30) return 'submitted'
  if (i === 29) return 'rejected'
  if (i === 28) return 'withdrawn'
  return 'accepted'
}

/** A six-hex-digit radio ID derived from the index, away from 000000 and FFFFFF. */
function radioId(i: number): string {
  return (0x3D0000 + i * 0x1F3B + 0x2A).toString(16).toUpperCase().padStart(6, '0')
}

function collisionWarning(i: number, compId: string): DemoUnit {
  const lapwing = i % 2 === 0
  let version = lapwing ? '7.24' : '3.4'
  if (compId === 'K7') version = '7.20'
  if (compId === 'T3') version = '3.1'
  const family = lapwing || compId === 'K7' ? 'Lapwing CW' : 'Curlew CX'
  const release = DEMO_FIRMWARE.find(f => f.family === family && f.version === version)!
  return {
    kind: 'collision-warning',
    model: family,
    serial: `${family.startsWith('Lapwing') ? 'LW' : 'CX'}-${String(41000 + i * 37)}`,
    firmwareVersion: version,
    radioId: compId === 'B2' || compId === 'M5' ? '3E91C4' : radioId(i),
    firmwareExpiresOn: release.expiresOn,
    firmwareUpdatedOn: compId === 'H8' ? '2026-02-10' : `2027-0${3 + (i % 4)}-1${i % 10}`,
  }
}

function recorders(i: number, compId: string): DemoUnit[] {
  if (compId === 'R4') return []
  const serial = `FR${String(7300 + i * 11)}`
  const first: DemoUnit = {
    kind: 'flight-recorder',
    model: i % 3 === 0 ? 'Plover FR-2' : 'Dotterel Logger',
    serial,
    firmwareVersion: i % 3 === 0 ? '2.08' : '5.1',
    approvalLevel: 'all-flights',
    igcRecorderId: `XKM${serial.slice(-3)}`,
  }
  if (i % 4 !== 1) return [first]
  const second = `FR${String(9100 + i * 7)}`
  return [first, { kind: 'flight-recorder', model: 'Dotterel Logger', serial: second, firmwareVersion: '5.1', approvalLevel: 'badges-up-to-diamonds', igcRecorderId: `XKM${second.slice(-3)}`, noIgcFile: compId === 'S2' }]
}

export const DEMO_ENTRIES: DemoEntry[] = Array.from({ length: ENTRY_COUNT }, (_, i) => {
  const compId = COMP_IDS[i]!
  const classCode = CLASS_CYCLE[i % CLASS_CYCLE.length]!
  // D6 entered an 18 m glider in the Standard class (a seeded problem).
  const glider = compId === 'D6' ? GLIDERS['18m'][0] : GLIDERS[classCode][i % 2]!
  // The first nine entries belong to the demo entrant sign-ins entrant@ … entrant9@; the
  // tenth sign-in (entrant10@) has no entry, to register one from scratch.
  const account = i < 9 ? DEMO_ENTRANTS[i]! : { email: extraPilotEmail(i - 9), name: `${FIRST_NAMES[i % FIRST_NAMES.length]} ${LAST_NAMES[(i * 7) % LAST_NAMES.length]}` }
  const last = account.name.split(' ').at(-1)!
  const entryStatus = status(i, compId)
  const paid = entryStatus === 'accepted' || (entryStatus === 'submitted' && compId !== 'F9' && i % 2 === 0)
  return {
    entrantEmail: account.email,
    classCode,
    status: entryStatus,
    decisionReason: entryStatus === 'rejected' ? 'The glider type is not eligible for the Club class handicap list of this competition.' : undefined,
    pilotName: account.name,
    pilotNationality: NATIONS[i % NATIONS.length]!,
    pilotLicenceNumber: `SPL-${NATIONS[i % NATIONS.length]!.slice(0, 2)}-${String(20450 + i * 13)}`,
    pilotPhone: `+49 151 ${String(5550100 + i * 17)}`,
    emergencyContact: `${FIRST_NAMES[(i + 11) % FIRST_NAMES.length]} ${last}, +49 160 ${String(5550200 + i * 19)}`,
    copilotName: classCode === '18m' && i % 6 === 1 ? `${FIRST_NAMES[(i + 5) % FIRST_NAMES.length]} ${LAST_NAMES[(i + 3) % LAST_NAMES.length]}` : undefined,
    crewNames: i % 3 === 0 ? [`${FIRST_NAMES[(i + 3) % FIRST_NAMES.length]} ${last}`] : [],
    gliderType: glider.type,
    // KM- stands for an invented state of registry, so no real aircraft is named.
    registration: `KM-${LETTERS[i % LETTERS.length]}${LETTERS[(i * 5 + 3) % LETTERS.length]}${LETTERS[(i * 11 + 7) % LETTERS.length]}`,
    compId,
    spanM: glider.spanM,
    mtomKg: glider.mtomKg,
    emptyMassKg: glider.emptyMassKg + (i % 5),
    motorGlider: DEMO_MOTOR_GLIDERS[compId] ?? 'none',
    pilotMassKg: entryStatus === 'accepted' ? (compId === 'P6' ? 91 : 68 + ((i * 7) % 27)) : undefined,
    copilotMassKg: entryStatus === 'accepted' && classCode === '18m' && i % 6 === 1 ? 64 + ((i * 5) % 20) : undefined,
    paymentStatus: entryStatus === 'withdrawn' ? 'refunded' : paid ? 'paid' : 'unpaid',
    units: compId === 'N1' ? recorders(i, compId) : [collisionWarning(i, compId), ...recorders(i, compId)],
  }
})

/** Pilots beyond the demo entrant sign-ins: their own accounts, same demo password. */
export function extraPilotEmail(index: number): string {
  return `pilot${String(index + 1).padStart(2, '0')}@kestrel-moor.example`
}

/** The other pilots' accounts (name as on their entry). */
export const DEMO_EXTRA_PILOTS = DEMO_ENTRIES
  .filter(e => !DEMO_ENTRANTS.some(p => p.email === e.entrantEmail))
  .map(e => ({ email: e.entrantEmail, name: e.pilotName }))
