// Hand-built dossiers for the engine's tests: one glider in order, and a competition like the
// demo's (contest days 2027-07-12 … 2027-07-18). Each test changes only what it is about.
import { DEFAULT_RULES } from '#shared/schemas/competition'
import { buildField } from '#shared/engine/field'
import type { CompetitionForEngine, Dossier, EngineIgcFile, EngineUnit, Field } from '#shared/engine/types'
import type { CompetitionRules } from '#shared/schemas/competition'

export const FIRST_DAY = '2027-07-12'
export const LAST_DAY = '2027-07-18'

export function competition(rules: Partial<CompetitionRules> = {}, extra: Partial<CompetitionForEngine> = {}): CompetitionForEngine {
  return {
    firstContestDay: FIRST_DAY,
    lastContestDay: LAST_DAY,
    timeZone: 'Europe/Berlin',
    rules: { ...DEFAULT_RULES, ...rules },
    classLimits: { 'standard': { maxMtomKg: 525, maxSpanM: 15, waterBallast: true }, '18m': { maxMtomKg: 600, maxSpanM: 18, waterBallast: true }, 'club': { maxMtomKg: null, maxSpanM: null, waterBallast: false } },
    ...extra,
  }
}

export function collisionWarning(over: Partial<Extract<EngineUnit, { kind: 'collision-warning' }>> = {}): EngineUnit {
  return {
    id: 'cw-1',
    kind: 'collision-warning',
    model: 'Lapwing CW',
    serial: 'LW-41000',
    radioId: '3D002A',
    firmwareVersion: '7.24',
    firmwareExpiresOn: '2028-03-31',
    firmwareUpdatedOn: '2027-03-10',
    ...over,
  }
}

export function recorder(over: Partial<Extract<EngineUnit, { kind: 'flight-recorder' }>> = {}): EngineUnit {
  return { id: 'fr-1', kind: 'flight-recorder', model: 'Plover FR-2', serial: 'FR7300', firmwareVersion: '2.08', approvalLevel: 'all-flights', igcRecorderId: 'XPL-FR7', ...over }
}

/** The current IGC file of recorder fr-1, declared for the entry the builder makes. */
export function igcFile(over: Partial<EngineIgcFile> = {}): EngineIgcFile {
  return {
    id: 'igc-1',
    unitId: 'fr-1',
    filename: '7C1XXXA1.IGC',
    recorderId: 'XPLFR7',
    firmwareVersion: '2.08',
    extensions: ['FXA', 'SIU'],
    flightDate: '2027-06-20',
    pilot: 'Linnea Holmquist',
    copilot: null,
    gliderType: 'Tarn 15',
    gliderId: 'KM-ABC',
    competitionId: 'A1',
    competitionClass: 'Standard',
    hasGRecord: true,
    uploadedAt: '2027-06-21T10:00:00.000Z',
    ...over,
  }
}

export function dossier(over: Partial<Dossier> = {}, entry: Partial<Dossier['entry']> = {}): Dossier {
  return {
    entry: {
      id: 'entry-1',
      compId: 'A1',
      registration: 'KM-ABC',
      gliderType: 'Tarn 15',
      pilotName: 'Linnea Holmquist',
      copilotName: null,
      className: 'Standard',
      classCode: 'standard',
      status: 'accepted',
      mtomKg: 525,
      cgForwardLimitM: null,
      cgAftLimitM: null,
      ...entry,
    },
    units: [collisionWarning(), recorder()],
    documents: (['airworthiness', 'insurance', 'licence', 'medical'] as const).map(kind => ({ kind, status: 'accepted' as const, expiresOn: '2028-01-31' })),
    igcFiles: [igcFile()],
    payment: { status: 'paid' },
    weighIns: [],
    gridCheck: null,
    ...over,
  }
}

export function fieldOf(...dossiers: Dossier[]): Field {
  return buildField(dossiers)
}

export function ctx(d: Dossier = dossier(), comp: CompetitionForEngine = competition(), field: Field = fieldOf(d), day?: string) {
  return { dossier: d, competition: comp, field, day }
}
