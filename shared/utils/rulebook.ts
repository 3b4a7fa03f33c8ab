// The rulebook: every check of the engine's catalogue in catalogue order, grouped by family,
// each with the competition's settings that change it and their current values. Pure, so the
// server's route and the unit tests read the same thing. Every check id has an entry in
// CHECK_SETTINGS (an empty list where no setting of the competition changes it); the unit test
// holds the catalogue to that.
import { CHECK_FAMILIES, HARDWARE_CHECK_IDS, checkFamily } from '../constants/rulebook'
import { APPROVAL_LEVEL_LABELS, DOCUMENT_KIND_LABELS } from '../constants/entries'
import type { Check } from '../engine/types'
import type { CompetitionRules } from '../schemas/competition'
import type { RuleSetting, RulebookFamily } from '../types/api-rulebook'

/** A class as the rulebook shows its limits. */
export interface RulebookClass {
  name: string
  maxSpanM: number | null
  maxMtomKg: number | null
  waterBallast: boolean
}

/** What the settings of a competition are read from. */
export interface RulebookInputs {
  rules: CompetitionRules
  classes: readonly RulebookClass[]
  /** Releases in the competition's firmware catalogue. */
  firmwareReleaseCount: number
}

const days = (n: number) => `${n} ${n === 1 ? 'day' : 'days'}`
const number = (n: number) => String(Math.round(n * 100) / 100)

/** Whether the competition requires a collision-warning unit (a rule setting that defaults to yes). */
/** One setting per class of the competition; a single line while it has none. */
function perClass(inputs: RulebookInputs, key: string, what: string, read: (c: RulebookClass) => { value: RuleSetting['value'], text: string }): RuleSetting[] {
  if (!inputs.classes.length) return [{ key, label: `${what} of each class`, value: null, text: 'No classes are set up yet.' }]
  return inputs.classes.map(c => ({ key, label: `${c.name}: ${what}`, ...read(c) }))
}

const SETTING = {
  firmwareMarginDays: ({ rules }: RulebookInputs): RuleSetting => ({
    key: 'firmwareMarginDays',
    label: 'Days the firmware must keep working after the last contest day',
    value: rules.firmwareMarginDays,
    text: days(rules.firmwareMarginDays),
  }),
  firmwareWarningDays: ({ rules }: RulebookInputs): RuleSetting => ({
    key: 'firmwareWarningDays',
    label: 'Advise when the firmware expires this soon after the last contest day',
    value: rules.firmwareWarningDays,
    text: `within ${days(rules.firmwareWarningDays)}`,
  }),
  igcRecencyDays: ({ rules }: RulebookInputs): RuleSetting => ({
    key: 'igcRecencyDays',
    label: 'An IGC file is recent when dated this close before the first contest day',
    value: rules.igcRecencyDays,
    text: `within ${days(rules.igcRecencyDays)}`,
  }),
  requiredDocumentKinds: ({ rules }: RulebookInputs): RuleSetting => ({
    key: 'requiredDocumentKinds',
    label: 'Documents required',
    value: [...rules.requiredDocumentKinds],
    text: rules.requiredDocumentKinds.length
      ? rules.requiredDocumentKinds.map(k => DOCUMENT_KIND_LABELS[k]).join(', ')
      : 'None, so this check finds nothing',
  }),
  recordersRequired: ({ rules }: RulebookInputs): RuleSetting => ({
    key: 'recordersRequired',
    label: 'Flight recorders required',
    value: rules.recordersRequired,
    text: rules.recordersRequired === 1 ? '1 recorder' : `${rules.recordersRequired} recorders`,
  }),
  acceptedApprovalLevels: ({ rules }: RulebookInputs): RuleSetting => ({
    key: 'acceptedApprovalLevels',
    label: 'IGC approval levels accepted',
    value: [...rules.acceptedApprovalLevels],
    text: rules.acceptedApprovalLevels.map(l => APPROVAL_LEVEL_LABELS[l]).join('; '),
  }),
  collisionWarningRequired: ({ rules }: RulebookInputs): RuleSetting => {
    const required = rules.collisionWarningRequired
    return {
      key: 'collisionWarningRequired',
      label: 'A collision-warning unit is required',
      value: required,
      text: required ? 'Yes' : 'No, so this check finds nothing',
    }
  },
  firmwareReleaseCount: ({ firmwareReleaseCount: n }: RulebookInputs): RuleSetting => ({
    key: 'firmwareReleaseCount',
    label: 'Releases in the organiser’s firmware catalogue',
    value: n,
    text: n === 0 ? 'None yet, so this check has nothing to compare against' : n === 1 ? '1 release' : `${n} releases`,
  }),
  classMaxMtomKg: (inputs: RulebookInputs): RuleSetting[] => perClass(inputs, 'class.maxMtomKg', 'maximum take-off mass', c => ({
    value: c.maxMtomKg,
    text: c.maxMtomKg === null ? 'No limit set' : `${number(c.maxMtomKg)} kg`,
  })),
  classMaxSpanM: (inputs: RulebookInputs): RuleSetting[] => perClass(inputs, 'class.maxSpanM', 'maximum span', c => ({
    value: c.maxSpanM,
    text: c.maxSpanM === null ? 'No limit set' : `${number(c.maxSpanM)} m`,
  })),
  classWaterBallast: (inputs: RulebookInputs): RuleSetting[] => perClass(inputs, 'class.waterBallast', 'water ballast', c => ({
    value: c.waterBallast,
    text: c.waterBallast ? 'Allowed' : 'Not allowed: tanks must be empty',
  })),
}

/** The settings that change each check, by check id, in the catalogue's order of families. */
const CHECK_SETTINGS: Readonly<Record<string, (inputs: RulebookInputs) => RuleSetting[]>> = {
  'firmware.valid-through-contest': i => [SETTING.firmwareMarginDays(i)],
  'firmware.expires-soon': i => [SETTING.firmwareWarningDays(i), SETTING.firmwareMarginDays(i)],
  'firmware.yearly-update': () => [],
  'firmware.catalogue-mismatch': i => [SETTING.firmwareReleaseCount(i)],
  'obstacles.current': () => [],
  'radio-id.format': () => [],
  'radio-id.unique': () => [],
  'radio-id.registration': () => [],
  'collision-warning.present': i => [SETTING.collisionWarningRequired(i)],
  'competition-id.unique': () => [],
  'documents.required': i => [SETTING.requiredDocumentKinds(i)],
  'recorder.present': i => [SETTING.recordersRequired(i), SETTING.acceptedApprovalLevels(i)],
  'recorder.igc-file': () => [],
  'recorder.identity': () => [],
  'declaration.matches-entry': () => [],
  'declaration.recent': i => [SETTING.igcRecencyDays(i)],
  'igc.security-record': () => [],
  'motor-glider.engine-recording': () => [],
  'mass.class-limit': i => SETTING.classMaxMtomKg(i),
  'mass.flight-manual': () => [],
  'cg.within-limits': () => [],
  'span.class-limit': i => SETTING.classMaxSpanM(i),
  'ballast.class-rule': i => SETTING.classWaterBallast(i),
  'entry.paid': () => [],
}

/** Every check id the rulebook knows (some may not be in the catalogue yet). */
export const RULEBOOK_CHECK_IDS: readonly string[] = Object.keys(CHECK_SETTINGS)

/** The competition's settings that change one check, with their current values ([] when none does). */
export function checkSettings(checkId: string, inputs: RulebookInputs): RuleSetting[] {
  return CHECK_SETTINGS[checkId]?.(inputs) ?? []
}

/** The place of a check on the competition's rulebook page. */
export function rulebookPath(competitionId: string, checkId: string): string {
  return `/competitions/${encodeURIComponent(competitionId)}/checks#${encodeURIComponent(checkId)}`
}

/**
 * The catalogue as the rulebook page lists it: families in their fixed order, each check in
 * catalogue order within its family. A check of no known family is listed with the office
 * rather than left out (the unit test keeps that from happening).
 */
export function buildRulebook(catalogue: readonly Check[], inputs: RulebookInputs): RulebookFamily[] {
  return CHECK_FAMILIES.map(family => ({
    id: family.id,
    title: family.title,
    lead: family.lead,
    checks: catalogue
      .filter(c => (checkFamily(c.id) ?? 'office') === family.id)
      .map(c => ({
        id: c.id,
        severity: c.severity,
        rule: c.rule,
        source: c.source,
        touchesHardware: HARDWARE_CHECK_IDS.includes(c.id),
        settings: checkSettings(c.id, inputs),
      })),
  })).filter(f => f.checks.length)
}
