// What a board tile shows: readiness from the engine's rule (DESIGN.md, vocabulary
// "readiness"), the headline the director reads first, counts with waivers applied, and what
// changed between two evaluations. Invented data; the rule itself is Gridmark's.
import { describe, expect, it } from 'vitest'
import type { Finding } from '#shared/engine/types'
import { activeHold, buildTile, countTiles, diffFindings, findingKey, sameTile, type TileAction, type TileInput } from '#shared/utils/board-tile'

const DAY = '2027-07-13'
const entry = { id: 'e1', compId: 'K7', classId: 'c-std', className: 'Standard', pilotName: 'Piet van Oorschot', registration: 'KM-ADH', gliderType: 'Tarn 15' }
const firmware: Finding = { checkId: 'firmware.valid-through-contest', severity: 'blocking', reason: 'Firmware expires 2027-07-15.', fixHint: 'Update', unitId: 'u1' }
const soon: Finding = { checkId: 'firmware.expires-soon', severity: 'advisory', reason: 'Firmware expires soon.', fixHint: 'Update', unitId: 'u1' }
const passed = { day: DAY, at: '2027-07-13T08:10:00.000Z', initials: 'AB', name: 'Aoife Brennick', outcome: 'pass' as const, failedItems: [] }
const by = { by: 'Marguerite Sallow', at: '2027-07-13T08:20:00.000Z' }

const tile = (over: Partial<TileInput> = {}) => buildTile({ entry, findings: [], check: null, actions: [], day: DAY, ...over })

describe('buildTile', () => {
  it('starts the day unchecked, with the standing finding as its headline', () => {
    const t = tile({ findings: [firmware, soon] })
    expect(t.readiness).toBe('unchecked')
    expect(t.headline).toEqual({ kind: 'finding', text: firmware.reason, severity: 'blocking', checkId: firmware.checkId })
    expect(t.counts).toEqual({ blocking: 1, advisory: 1, waived: 0 })
    expect(t.lastCheck).toBeNull()
  })

  it('is ready after a passed check with nothing open, naming who checked and when', () => {
    const t = tile({ check: passed })
    expect(t.readiness).toBe('ready')
    expect(t.headline).toBeNull()
    expect(t.lastCheck).toEqual({ at: passed.at, initials: 'AB', name: 'Aoife Brennick', outcome: 'pass' })
  })

  it('is held after the check when a blocking finding stands; caution with advisory ones only', () => {
    expect(tile({ findings: [firmware], check: passed }).readiness).toBe('held')
    expect(tile({ findings: [soon], check: passed }).readiness).toBe('caution')
  })

  it('names the failed checklist items when the check failed', () => {
    const t = tile({ check: { ...passed, outcome: 'fail', failedItems: ['Antennas fitted', 'Tag readable'] } })
    expect(t.readiness).toBe('held')
    expect(t.headline).toEqual({ kind: 'checklist', text: 'Failed on the grid: Antennas fitted; Tag readable' })
  })

  it('shows the director’s hold with its reason, before any check, until a release of the day', () => {
    const hold: TileAction = { kind: 'hold', day: DAY, reason: 'Canopy lock', ...by }
    const held = tile({ actions: [hold] })
    expect(held.readiness).toBe('held')
    expect(held.headline).toEqual({ kind: 'hold', text: 'Canopy lock' })
    expect(held.hold).toEqual({ reason: 'Canopy lock', by: by.by, at: by.at })
    const released = tile({ actions: [hold, { kind: 'release', day: DAY, reason: 'Fixed', ...by }], check: passed })
    expect(released.readiness).toBe('ready')
    expect(released.hold).toBeNull()
  })

  it('counts a waived finding as waived, and lets the next finding lead', () => {
    const waiver: TileAction = { kind: 'waiver', day: DAY, checkId: firmware.checkId, unitId: 'u1', reason: 'Updated on the grid', ...by }
    const t = tile({ findings: [firmware, soon], check: passed, actions: [waiver] })
    expect(t.readiness).toBe('caution')
    expect(t.counts).toEqual({ blocking: 0, advisory: 1, waived: 1 })
    expect(t.headline?.checkId).toBe('firmware.expires-soon')
  })

  it('ignores a check of another day', () => {
    expect(tile({ check: { ...passed, day: '2027-07-12' } }).lastCheck).toBeNull()
  })
})

describe('activeHold', () => {
  it('is the latest hold of the day not followed by a release', () => {
    const h1: TileAction = { kind: 'hold', day: DAY, reason: 'one', ...by }
    const r: TileAction = { kind: 'release', day: DAY, reason: 'ok', ...by }
    const h2: TileAction = { kind: 'hold', day: DAY, reason: 'two', ...by }
    expect(activeHold([h1], DAY)?.reason).toBe('one')
    expect(activeHold([h1, r], DAY)).toBeNull()
    expect(activeHold([h1, r, h2], DAY)?.reason).toBe('two')
    expect(activeHold([h1], '2027-07-14')).toBeNull()
  })
})

describe('diffFindings', () => {
  it('reports what appeared and what went; a change of severity counts as both', () => {
    expect(diffFindings([firmware], [firmware])).toEqual({ added: [], removed: [] })
    const d = diffFindings([firmware], [soon])
    expect(d.added.map(f => f.checkId)).toEqual(['firmware.expires-soon'])
    expect(d.removed.map(f => f.checkId)).toEqual(['firmware.valid-through-contest'])
    const milder = diffFindings([firmware], [{ ...firmware, severity: 'advisory' }])
    expect(milder.added).toHaveLength(1)
    expect(milder.removed).toHaveLength(1)
  })

  it('tells findings of two units apart', () => {
    expect(findingKey(firmware)).not.toBe(findingKey({ ...firmware, unitId: 'u2' }))
    expect(diffFindings([firmware], [firmware, { ...firmware, unitId: 'u2' }]).added).toHaveLength(1)
  })
})

describe('sameTile and countTiles', () => {
  it('compares what a tile shows, whatever the order of its keys (jsonb reorders them)', () => {
    expect(sameTile(tile(), tile())).toBe(true)
    const reordered = JSON.parse(JSON.stringify(Object.fromEntries(Object.entries(tile({ findings: [firmware] })).reverse())))
    expect(sameTile(reordered, tile({ findings: [firmware] }))).toBe(true)
    expect(sameTile(tile(), tile({ check: passed }))).toBe(false)
  })

  it('counts readiness overall and per class', () => {
    const { overall, byClass } = countTiles([
      { readiness: 'ready', classId: 'a' },
      { readiness: 'held', classId: 'a' },
      { readiness: 'held', classId: 'b' },
      { readiness: 'unchecked', classId: 'b' },
    ])
    expect(overall).toEqual({ ready: 1, caution: 0, held: 2, unchecked: 1, total: 4 })
    expect(byClass.a).toEqual({ ready: 1, caution: 0, held: 1, unchecked: 0, total: 2 })
    expect(byClass.b).toEqual({ ready: 0, caution: 0, held: 1, unchecked: 1, total: 2 })
  })
})
