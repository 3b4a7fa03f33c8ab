// The rulebook: every check in the order findings are listed. Add a check here and in its
// family's file under checks/; DEVELOPERS.md, "Add a check".
import { ballastClassRule } from './checks/ballast'
import { cgWithinLimits } from './checks/cg'
import { collisionWarningPresent } from './checks/collision-warning'
import { competitionIdUnique } from './checks/competition-id'
import { declarationMatchesEntry, declarationRecent } from './checks/declaration'
import { documentsRequired } from './checks/documents'
import { firmwareCatalogueMismatch, firmwareExpiresSoon, firmwareValidThroughContest, firmwareYearlyUpdate } from './checks/firmware'
import { igcSecurityRecord } from './checks/igc'
import { massClassLimit, massFlightManual } from './checks/mass'
import { motorGliderEngineRecording } from './checks/motor-glider'
import { obstaclesCurrent } from './checks/obstacles'
import { entryPaid } from './checks/payment'
import { radioIdFormat, radioIdRegistration, radioIdUnique } from './checks/radio-id'
import { recorderIdentity, recorderIgcFile, recorderPresent } from './checks/recorders'
import { spanClassLimit } from './checks/span'
import type { Check } from './types'

export const CATALOGUE: readonly Check[] = [
  // Collision-warning units
  firmwareValidThroughContest,
  firmwareExpiresSoon,
  firmwareYearlyUpdate,
  firmwareCatalogueMismatch,
  obstaclesCurrent,
  radioIdFormat,
  radioIdUnique,
  radioIdRegistration,
  // The glider's identity in the competition
  competitionIdUnique,
  // Papers
  documentsRequired,
  // Flight recorders and their IGC files
  recorderPresent,
  declarationMatchesEntry,
  declarationRecent,
  igcSecurityRecord,
  // Weighing
  massClassLimit,
  massFlightManual,
  cgWithinLimits,
  // The office
  entryPaid,
  // The checks a scrutineering team adds (DESIGN.md's table, in its order)
  spanClassLimit,
  ballastClassRule,
  recorderIgcFile,
  recorderIdentity,
  collisionWarningPresent,
  motorGliderEngineRecording,
]

export function checkById(id: string): Check | undefined {
  return CATALOGUE.find(c => c.id === id)
}

/**
 * The checks that read other entries (the field): a change to one entry's dossier can change
 * their findings on the entries that share its competition ID or radio ID (see `fieldNeighbours`).
 */
export const FIELD_CHECK_IDS: readonly string[] = [competitionIdUnique.id, radioIdUnique.id]
