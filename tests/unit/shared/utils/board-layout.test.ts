// The wall board's layout: the whole field fits the area at the largest tile it can, and tiles
// keep at least the reference size (ID and word capitals ≥ 1/40 of the screen's height) for the
// demo's field of forty at 1920 × 1080 and 3840 × 2160 in full screen. The areas below are what
// the full-screen board leaves for its tiles (header, counters and reason strip taken).
import { describe, expect, it } from 'vitest'
import { boardLayout, MAX_TILE_SCALE, MIN_TILE_SCALE, REFERENCE_TILE, screenUnit, shareColumns, type BoardLayout } from '../../../../shared/utils/board-layout'

const hd = { width: 1893, height: 742, unit: 1, gap: 6, headingHeight: 38 }
const uhd = { width: 3786, height: 1484, unit: 2, gap: 12, headingHeight: 76 }

/** Total height and width the layout takes, as the page arranges it. */
function extent(l: BoardLayout, groups: number[], gap: number, heading: number) {
  const rows = groups.map((n, i) => Math.ceil(n / l.columns[i]!))
  const block = (r: number) => heading + gap + r * l.tileHeight + (r - 1) * gap
  if (l.arrangement === 'side-by-side') {
    return { height: Math.max(...rows.map(block)), width: l.groupWidths.reduce((a, b) => a + b, 0) + (groups.length - 1) * gap * 2 }
  }
  return { height: rows.reduce((a, r) => a + block(r), 0) + (groups.length - 1) * gap * 2, width: l.columns[0]! * l.tileWidth + (l.columns[0]! - 1) * gap }
}

describe('boardLayout', () => {
  it('fits the demo field of forty in three classes at 1920 × 1080 at least at the reference size', () => {
    const groups = [14, 13, 13]
    const l = boardLayout({ ...hd, groups })
    expect(l.fits).toBe(true)
    // Reference size or more: ID and word at ≥ 39 px, capitals ≥ 27.3 px ≥ 1080 / 40 (Barlow's
    // capitals are 0.7 em: from memory of its font metrics; the browser test measures them).
    expect(l.scale).toBeGreaterThanOrEqual(1)
    expect(l.tileWidth).toBeGreaterThanOrEqual(REFERENCE_TILE.width)
    const e = extent(l, groups, hd.gap, hd.headingHeight)
    expect(e.height).toBeLessThanOrEqual(hd.height)
    expect(e.width).toBeLessThanOrEqual(hd.width)
    expect(l.columns.reduce((a, b, i) => a + b * Math.ceil(groups[i]! / b), 0)).toBeGreaterThanOrEqual(40)
  })

  it('scales the same field to a screen of twice the lines', () => {
    const groups = [14, 13, 13]
    const a = boardLayout({ ...hd, groups })
    const b = boardLayout({ ...uhd, groups })
    expect(b.columns).toEqual(a.columns)
    expect(b.scale).toBeCloseTo(a.scale, 2)
    expect(b.tileWidth).toBeGreaterThanOrEqual(2 * a.tileWidth - 1)
    const e = extent(b, groups, uhd.gap, uhd.headingHeight)
    expect(e.height).toBeLessThanOrEqual(uhd.height)
  })

  it('gives a small field larger tiles, up to the largest scale', () => {
    const small = boardLayout({ ...hd, groups: [6, 6] })
    const large = boardLayout({ ...hd, groups: [14, 13, 13] })
    expect(small.tileWidth).toBeGreaterThan(large.tileWidth)
    expect(small.scale).toBeGreaterThan(large.scale)
    expect(small.scale).toBeLessThanOrEqual(MAX_TILE_SCALE)
    expect(boardLayout({ ...hd, groups: [1] }).scale).toBe(MAX_TILE_SCALE)
  })

  it('keeps the smallest readable size and says it does not fit when the field is too large', () => {
    const l = boardLayout({ ...hd, height: 300, groups: [60, 60] })
    expect(l.fits).toBe(false)
    expect(l.scale).toBe(MIN_TILE_SCALE)
    expect(l.tileWidth).toBeGreaterThanOrEqual(Math.floor(REFERENCE_TILE.width * MIN_TILE_SCALE))
  })

  it('lays out a phone-sized area too, and an empty board', () => {
    const l = boardLayout({ width: 360, height: 600, groups: [5, 3], unit: screenUnit(360, 740), gap: 4, headingHeight: 20 })
    expect(l.columns.every(c => c >= 1)).toBe(true)
    expect(l.tileWidth).toBeGreaterThan(0)
    expect(boardLayout({ ...hd, groups: [] })).toMatchObject({ columns: [], fits: true })
    expect(boardLayout({ ...hd, groups: [0, 4] }).columns).toHaveLength(1)
  })
})

describe('shareColumns', () => {
  it('gives columns where they save the most rows', () => {
    expect(shareColumns([14, 13, 13], 9)).toEqual([3, 3, 3])
    expect(shareColumns([20, 5], 6)).toEqual([5, 1])
    expect(shareColumns([2, 2], 10)).toEqual([2, 2])
    expect(shareColumns([3, 3, 3], 2)).toBeNull()
  })
})

describe('screenUnit', () => {
  it('is 1 on the reference screen and 2 on one of twice its lines', () => {
    expect(screenUnit(1920, 1080)).toBe(1)
    expect(screenUnit(3840, 2160)).toBe(2)
    expect(screenUnit(1366, 900)).toBeCloseTo(1366 / 1920)
    expect(screenUnit(0, 0)).toBe(1)
  })
})
