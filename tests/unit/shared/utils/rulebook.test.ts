// The rulebook's two maps: every check of the catalogue has a family (read from its id's
// prefix) and an entry in the settings map, and each setting shows the competition's own value.
import { existsSync, readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { CATALOGUE } from '#shared/engine/catalogue'
import { DEFAULT_RULES, type CompetitionRules } from '#shared/schemas/competition'
import { CHECK_FAMILIES, HARDWARE_CHECK_IDS, checkFamily } from '#shared/constants/rulebook'
import { RULEBOOK_CHECK_IDS, buildRulebook, checkSettings, rulebookPath, type RulebookInputs } from '#shared/utils/rulebook'

const DESIGN = new URL('../../../../../shared/DESIGN.md', import.meta.url)

function inputs(rules: Partial<CompetitionRules> = {}, over: Partial<RulebookInputs> = {}): RulebookInputs {
  return {
    rules: { ...DEFAULT_RULES, ...rules },
    classes: [
      { name: 'Standard', maxSpanM: 15, maxMtomKg: 525, waterBallast: true },
      { name: 'Club', maxSpanM: null, maxMtomKg: null, waterBallast: false },
    ],
    firmwareReleaseCount: 3,
    ...over,
  }
}
const setting = (checkId: string, key: string, i = inputs()) => checkSettings(checkId, i).find(s => s.key === key)

describe('the family map', () => {
  it('gives every check of the catalogue a family', () => {
    expect(CATALOGUE.filter(c => !checkFamily(c.id)).map(c => c.id)).toEqual([])
  })

  it('gives a family to the checks being added beside it', () => {
    expect(checkFamily('span.class-limit')).toBe('weighing')
    expect(checkFamily('ballast.class-rule')).toBe('weighing')
    expect(checkFamily('recorder.igc-file')).toBe('recorders')
    expect(checkFamily('recorder.identity')).toBe('recorders')
    expect(checkFamily('collision-warning.present')).toBe('collision-warning')
    expect(checkFamily('motor-glider.engine-recording')).toBe('recorders')
    expect(checkFamily('nothing.known')).toBeUndefined()
  })

  it.skipIf(!existsSync(DESIGN))('gives every check of DESIGN.md’s table a family and a settings entry', () => {
    const ids = [...readFileSync(DESIGN, 'utf8').matchAll(/^\| `([a-z.-]+)` \|/gm)].map(m => m[1]!)
    expect(ids.length).toBeGreaterThanOrEqual(CATALOGUE.length)
    expect(ids.filter(id => !checkFamily(id))).toEqual([])
    expect(ids.filter(id => !RULEBOOK_CHECK_IDS.includes(id))).toEqual([])
  })

  it('lists every check once, families in their order, checks in catalogue order within each', () => {
    const book = buildRulebook(CATALOGUE, inputs())
    const listed = book.flatMap(f => f.checks.map(c => c.id))
    expect([...listed].sort()).toEqual(CATALOGUE.map(c => c.id).sort())
    const familyOrder = CHECK_FAMILIES.map(f => f.id)
    expect(book.map(f => familyOrder.indexOf(f.id))).toEqual([...book.map(f => familyOrder.indexOf(f.id))].sort((a, b) => a - b))
    for (const f of book) {
      const positions = f.checks.map(c => CATALOGUE.findIndex(k => k.id === c.id))
      expect(positions).toEqual([...positions].sort((a, b) => a - b))
    }
    const firmware = book[0]!.checks[0]!
    expect(firmware).toMatchObject({ id: 'firmware.valid-through-contest', severity: 'blocking', touchesHardware: true })
    expect(firmware.rule).toContain('margin')
    expect(firmware.source).toContain('common practice')
  })

  it('flags the checks whose findings carry the hardware caution, as the engine writes them', () => {
    // A check's findings carry the caution where its run() names HARDWARE_CAUTION
    // (shared/engine/checks/*.ts); the rulebook's flag must say the same.
    for (const c of CATALOGUE) {
      expect(HARDWARE_CHECK_IDS.includes(c.id), c.id).toBe(c.run.toString().includes('HARDWARE_CAUTION'))
    }
  })
})

describe('the settings map', () => {
  it('has an entry for every check of the catalogue', () => {
    expect(CATALOGUE.filter(c => !RULEBOOK_CHECK_IDS.includes(c.id)).map(c => c.id)).toEqual([])
  })

  it('shows the firmware margin and warning window the competition set', () => {
    const i = inputs({ firmwareMarginDays: 7, firmwareWarningDays: 45 })
    expect(setting('firmware.valid-through-contest', 'firmwareMarginDays', i)).toMatchObject({ value: 7, text: '7 days' })
    expect(checkSettings('firmware.expires-soon', i).map(s => [s.key, s.value])).toEqual([['firmwareWarningDays', 45], ['firmwareMarginDays', 7]])
    expect(setting('firmware.valid-through-contest', 'firmwareMarginDays', inputs({ firmwareMarginDays: 1 }))!.text).toBe('1 day')
    // The defaults, where the competition set nothing (common practice: 0 and 30 days).
    expect(setting('firmware.valid-through-contest', 'firmwareMarginDays')!.value).toBe(0)
    expect(setting('firmware.expires-soon', 'firmwareWarningDays')!.text).toBe('within 30 days')
  })

  it('shows the IGC recency window, the documents and the recorders the competition asks for', () => {
    const i = inputs({ igcRecencyDays: 90, requiredDocumentKinds: ['insurance'], recordersRequired: 2, acceptedApprovalLevels: ['all-flights'] })
    expect(setting('declaration.recent', 'igcRecencyDays', i)).toMatchObject({ value: 90, text: 'within 90 days' })
    expect(setting('documents.required', 'requiredDocumentKinds', i)).toMatchObject({ value: ['insurance'], text: 'Insurance' })
    expect(setting('recorder.present', 'recordersRequired', i)).toMatchObject({ value: 2, text: '2 recorders' })
    expect(setting('recorder.present', 'acceptedApprovalLevels', i)).toMatchObject({ value: ['all-flights'], text: 'All flights, including records' })
    expect(setting('documents.required', 'requiredDocumentKinds', inputs({ requiredDocumentKinds: [] }))!.text).toMatch(/^None/)
  })

  it('shows each class’s limits for the mass, span and ballast checks', () => {
    expect(checkSettings('mass.class-limit', inputs()).map(s => [s.label, s.value, s.text])).toEqual([
      ['Standard: maximum take-off mass', 525, '525 kg'],
      ['Club: maximum take-off mass', null, 'No limit set'],
    ])
    expect(checkSettings('span.class-limit', inputs({}, { classes: [{ name: '13.5 Metre', maxSpanM: 13.5, maxMtomKg: null, waterBallast: true }] }))
      .map(s => s.text)).toEqual(['13.5 m'])
    expect(checkSettings('ballast.class-rule', inputs()).map(s => [s.key, s.value])).toEqual([['class.waterBallast', true], ['class.waterBallast', false]])
    expect(checkSettings('mass.class-limit', inputs({}, { classes: [] }))[0]!.text).toMatch(/No classes/)
  })

  it('shows the size of the firmware catalogue and whether a collision-warning unit is required', () => {
    expect(setting('firmware.catalogue-mismatch', 'firmwareReleaseCount')).toMatchObject({ value: 3, text: '3 releases' })
    expect(setting('firmware.catalogue-mismatch', 'firmwareReleaseCount', inputs({}, { firmwareReleaseCount: 0 }))!.text).toMatch(/^None yet/)
    // The rule defaults to required; a competition may turn it off.
    expect(setting('collision-warning.present', 'collisionWarningRequired')).toMatchObject({ value: true, text: 'Yes' })
    const off = { ...DEFAULT_RULES, collisionWarningRequired: false } as CompetitionRules
    expect(setting('collision-warning.present', 'collisionWarningRequired', inputs(off))!.value).toBe(false)
  })

  it('names no setting where none of the competition changes the check', () => {
    for (const id of ['radio-id.format', 'mass.flight-manual', 'entry.paid', 'unknown.check']) expect(checkSettings(id, inputs())).toEqual([])
  })
})

describe('rulebookPath', () => {
  it('points at the check’s anchor on the competition’s rulebook page', () => {
    expect(rulebookPath('c-1', 'mass.class-limit')).toBe('/competitions/c-1/checks#mass.class-limit')
  })
})
