// What the check engine reads and writes. Plain data only: the server builds a Dossier from
// its tables, the scrutineer's phone from its offline copy, the tests by hand.
import type { ApprovalLevel, DocumentKind, PaymentStatus } from '../constants/entries'
import type { CompetitionRules } from '../schemas/competition'

/** A calendar date, YYYY-MM-DD, in the competition's time zone. */
export type IsoDate = string

export type Severity = 'blocking' | 'advisory'

export interface EngineEntry {
  id: string
  compId: string
  registration: string
  gliderType: string
  pilotName: string
  copilotName?: string | null
  /** The class's name as the competition shows it ("18 Metre"). */
  className: string
  /** The class code (FAI_CLASSES codes where the class is an FAI one: "18m", "standard"). */
  classCode: string
  status?: string
  /** The glider's maximum take-off mass from its flight manual. */
  mtomKg?: number | null
  /** CG limits as lever arms from the datum, metres, aft positive. */
  cgForwardLimitM?: number | null
  cgAftLimitM?: number | null
  /** The wing span, metres. */
  spanM?: number | null
  /** A motor glider's means of propulsion; 'none' (or absent) for a pure glider. */
  motorGlider?: MotorGliderKind | null
  /** The pilot's and co-pilot's mass with parachute, kg, from the registration weighing (staff). */
  pilotMassKg?: number | null
  copilotMassKg?: number | null
  /** Lever arms from the flight manual, metres from the datum (aft positive): seats and water ballast. */
  pilotArmM?: number | null
  copilotArmM?: number | null
  ballastArmM?: number | null
}

/** How a glider is propelled besides soaring: none, a self-launching or sustainer engine, an electric motor. */
export type MotorGliderKind = 'none' | 'self-launching' | 'sustainer' | 'electric'

export interface CollisionWarningUnit {
  id: string
  kind: 'collision-warning'
  model: string
  serial?: string | null
  radioId: string | null
  firmwareVersion: string | null
  /** The first day the firmware no longer works. */
  firmwareExpiresOn: IsoDate | null
  firmwareUpdatedOn?: IsoDate | null
  /** The first day the obstacle database is no longer valid. */
  obstacleDbExpiresOn?: IsoDate | null
}

export interface FlightRecorderUnit {
  id: string
  kind: 'flight-recorder'
  model: string
  serial: string
  firmwareVersion?: string | null
  approvalLevel: ApprovalLevel | string | null
  /**
   * The recorder's IGC identity as its A record writes it: the three-character manufacturer
   * code and the three-character serial id ("XXXABC"), or the serial id alone ("ABC").
   */
  igcRecorderId?: string | null
}

export type EngineUnit = CollisionWarningUnit | FlightRecorderUnit

export interface EngineDocument {
  id?: string
  kind: DocumentKind
  status: 'pending' | 'accepted' | 'rejected'
  /** The last day the document is valid ("valid until"). */
  expiresOn: IsoDate | null
}

/** The header of one uploaded IGC file, as parsed on upload (H records and G record presence). */
export interface EngineIgcFile {
  id?: string
  /** The flight recorder it came from; null while the entrant has not said which. */
  unitId: string | null
  /** The name the file was uploaded under. */
  filename?: string | null
  /** The A record's manufacturer code and serial id, six characters ("XXXABC"). */
  recorderId?: string | null
  /** HFRFW: the recorder's firmware version. */
  firmwareVersion?: string | null
  /** The three-letter codes the I record declares (extensions of every fix: "FXA", "ENL", "MOP" …). */
  extensions?: string[]
  flightDate: IsoDate | null
  pilot: string | null
  copilot?: string | null
  gliderType: string | null
  gliderId: string | null
  competitionId: string | null
  competitionClass: string | null
  hasGRecord: boolean
  /** ISO timestamp of the upload; breaks ties between files of the same flight date. */
  uploadedAt: string
}

export type ReactionPoint = 'main-wheel' | 'tail-wheel' | 'tail-skid' | 'nose-wheel'

/** One scale reading: the load at a reaction point and that point's lever arm from the datum. */
export interface ScaleReading {
  point: ReactionPoint
  weight: number
  arm: number
}

/** Scale readings in kg with arms in m, or in lb with arms in inches. */
export type WeighUnits = 'kg-m' | 'lb-in'

export interface WeighInRecord {
  id?: string
  weighedOn: IsoDate
  units: WeighUnits
  readings: ScaleReading[]
  /** Water ballast declared but not in the tanks on the scales (weighed dry), kg. */
  declaredBallastKg?: number | null
}

export interface GridCheck {
  day: IsoDate
  outcome?: 'pass' | 'fail'
  /** The checklist answers of the check (the class's own items among them). */
  answers?: { itemId: string, result: string }[]
}

export interface Dossier {
  entry: EngineEntry
  units: EngineUnit[]
  documents: EngineDocument[]
  igcFiles: EngineIgcFile[]
  /**
   * The fee's state; `owedMinor` (what is still to pay, in minor units of `currency`) where the
   * loader knows it, so the finding can say how much.
   */
  payment: { status: PaymentStatus, owedMinor?: number, currency?: string }
  weighIns: WeighInRecord[]
  gridCheck?: GridCheck | null
}

export interface FirmwareRelease {
  family: string
  version: string
  expiresOn: IsoDate
}

export interface ClassLimit {
  /** Maximum take-off mass of the class; null where the class sets none. */
  maxMtomKg: number | null
  /** Maximum wing span of the class; null where the class sets none. */
  maxSpanM?: number | null
  /** Whether the class carries water ballast (the Club class does not). */
  waterBallast?: boolean
  /** Other spellings of the class name, beside the FAI ones. */
  aliases?: string[]
}

export interface CompetitionForEngine {
  firstContestDay: IsoDate
  lastContestDay: IsoDate
  timeZone: string
  rules: CompetitionRules
  /** By class code; a class missing here falls back to the FAI default. */
  classLimits: Record<string, ClassLimit>
  firmwareCatalogue?: FirmwareRelease[]
}

/** What the competition-wide checks need of every other entry, by entry id. */
export interface FieldEntry {
  compId: string
  radioIds: string[]
}
export interface Field {
  entries: Record<string, FieldEntry>
}

export interface Finding {
  checkId: string
  severity: Severity
  /** What is wrong, with the actual values, in words a pilot understands. */
  reason: string
  fixHint: string
  /** Present where the fix touches hardware. */
  caution?: string
  /** The unit the finding is about, where it is about one. */
  unitId?: string
  /** Another subject within the dossier: a document kind, an IGC file, a weigh-in. */
  subject?: string
  /**
   * Set when the finding waits on the staff, not the pilot: a document uploaded and waiting for
   * a scrutineer's review. It still keeps the glider from `ready`; the pilot has nothing to do.
   */
  awaiting?: 'review'
}

export interface CheckContext {
  dossier: Dossier
  competition: CompetitionForEngine
  field: Field
  /** The contest day being evaluated, if any (selects the weigh-in of that day or before). */
  day?: IsoDate
}

export interface Check {
  id: string
  /** `blocking / advisory` where parts of the rule block and others advise. */
  severity: Severity | 'blocking / advisory'
  source: string
  rule: string
  run: (ctx: CheckContext) => Finding[]
}
