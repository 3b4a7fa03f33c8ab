// The wall board's layout: how many columns each class takes and how large its tiles are, so
// that the whole field fits the area left for tiles on the screen, as large as it can be.
// Pure arithmetic on the tile counts and the measured area; the page measures, this decides.
//
// Sizes are in CSS pixels. A "reference tile" is the smallest tile still read from five metres
// on a 1080-line screen: its competition ID and readiness word at 39 px or more (Barlow's capitals are
// 0.7 em tall, so 28 px: at least 1/40 of 1080 lines; "Unchecked", the longest word, is
// 197 px wide at 40 px in Barlow bold), and the line of the last check. On other
// screens the reference scales with the screen (`unit`: 2 on a 2160-line screen).

/** The smallest readable tile on a 1080-line screen, in CSS pixels. */
export const REFERENCE_TILE = { width: 202, height: 124 } as const
/** The reference screen that `unit` 1 stands for. */
export const REFERENCE_SCREEN = { width: 1920, height: 1080 } as const
/** Tiles grow with spare room up to this many times the reference, then stop growing. */
export const MAX_TILE_SCALE = 1.7
/** Below this the field no longer fits at any size worth showing: the area scrolls instead. */
export const MIN_TILE_SCALE = 0.6

export type BoardArrangement = 'stacked' | 'side-by-side'

export interface BoardLayoutInput {
  /** The area for the classes and their tiles. */
  width: number
  height: number
  /** Tiles shown per class, in the board's order. */
  groups: readonly number[]
  /** Screen size over the reference screen (see `screenUnit`). */
  unit: number
  /** Space between tiles, between a class's heading and its tiles, and between classes. */
  gap: number
  /** Height of a class's heading line. */
  headingHeight: number
}

export interface BoardLayout {
  /** Classes one under the other (full width each), or side by side in one band. */
  arrangement: BoardArrangement
  /** Tile columns of each class. */
  columns: number[]
  /** Width of each class's block (side by side), or of the whole area (stacked). */
  groupWidths: number[]
  tileWidth: number
  tileHeight: number
  /** Tile content size over the reference (text sizes follow it), within MIN…MAX_TILE_SCALE. */
  scale: number
  /** Whether every tile fits the area at `scale` (false: the area scrolls). */
  fits: boolean
}

/** How large this screen is against the reference screen (the smaller of the two ratios). */
export function screenUnit(screenWidth: number, screenHeight: number): number {
  const unit = Math.min(screenWidth / REFERENCE_SCREEN.width, screenHeight / REFERENCE_SCREEN.height)
  return Number.isFinite(unit) && unit > 0 ? unit : 1
}

/**
 * Shares `total` columns among groups of `counts` tiles so the tallest group has as few rows
 * as possible (each group at least one column, none more than its tiles).
 */
export function shareColumns(counts: readonly number[], total: number): number[] | null {
  if (counts.length === 0 || total < counts.length) return null
  const columns = counts.map(() => 1)
  let left = total - counts.length
  while (left > 0) {
    let worst = -1
    for (let i = 0; i < counts.length; i++) {
      if (columns[i]! >= counts[i]!) continue
      const rows = Math.ceil(counts[i]! / columns[i]!)
      const better = Math.ceil(counts[i]! / (columns[i]! + 1))
      // The group whose rows would drop most; the taller group first when equal.
      if (rows === better) continue
      if (worst < 0 || rows > Math.ceil(counts[worst]! / columns[worst]!)) worst = i
    }
    if (worst < 0) break
    columns[worst]!++
    left--
  }
  return columns
}

interface Candidate {
  arrangement: BoardArrangement
  columns: number[]
  groupWidths: number[]
  cellWidth: number
  cellHeight: number
  scale: number
}

function scaleOf(cellWidth: number, cellHeight: number, unit: number): number {
  if (cellWidth <= 0 || cellHeight <= 0) return 0
  return Math.min(cellWidth / (REFERENCE_TILE.width * unit), cellHeight / (REFERENCE_TILE.height * unit))
}

function stacked(input: BoardLayoutInput, columns: number): Candidate {
  const { width, height, groups, gap, headingHeight, unit } = input
  const rows = groups.reduce((n, count) => n + Math.ceil(count / columns), 0)
  const fixed = groups.length * (headingHeight + gap) + (groups.length - 1) * gap * 2 + (rows - groups.length) * gap
  const cellHeight = (height - fixed) / rows
  const cellWidth = (width - (columns - 1) * gap) / columns
  return {
    arrangement: 'stacked',
    columns: groups.map(count => Math.min(columns, count)),
    groupWidths: groups.map(() => width),
    cellWidth,
    cellHeight,
    scale: scaleOf(cellWidth, cellHeight, unit),
  }
}

function sideBySide(input: BoardLayoutInput, total: number): Candidate | null {
  const { width, height, groups, gap, headingHeight, unit } = input
  const columns = shareColumns(groups, total)
  if (!columns) return null
  const used = columns.reduce((a, b) => a + b, 0)
  const rows = Math.max(...groups.map((count, i) => Math.ceil(count / columns[i]!)))
  // Classes are kept apart by twice the gap between tiles.
  const cellWidth = (width - (used - groups.length) * gap - (groups.length - 1) * gap * 2) / used
  const cellHeight = (height - headingHeight - gap - (rows - 1) * gap) / rows
  return {
    arrangement: 'side-by-side',
    columns,
    groupWidths: columns.map(c => c * cellWidth + (c - 1) * gap),
    cellWidth,
    cellHeight,
    scale: scaleOf(cellWidth, cellHeight, unit),
  }
}

/**
 * The layout that shows every tile at the largest size: each column count, with the classes
 * stacked or side by side; the larger tile wins, stacked when equal (it reads like the list).
 */
export function boardLayout(input: BoardLayoutInput): BoardLayout {
  const groups = input.groups.filter(n => n > 0)
  const tiles = groups.reduce((a, b) => a + b, 0)
  const unit = input.unit > 0 ? input.unit : 1
  const safe = { ...input, groups, unit, width: Math.max(0, input.width), height: Math.max(0, input.height) }
  let best: Candidate | null = null
  for (let columns = 1; columns <= Math.max(1, tiles); columns++) {
    const options = [tiles > 0 ? stacked(safe, columns) : null, groups.length > 1 ? sideBySide(safe, columns) : null]
    for (const option of options) {
      if (option && (!best || option.scale > best.scale + 1e-9)) best = option
    }
  }
  if (!best || tiles === 0) {
    return { arrangement: 'stacked', columns: [], groupWidths: [], tileWidth: 0, tileHeight: 0, scale: 1, fits: true }
  }
  if (best.scale < MIN_TILE_SCALE) {
    // Too many for the area: the smallest readable tiles, as many across as the width takes.
    const across = Math.max(1, Math.floor((safe.width + safe.gap) / (REFERENCE_TILE.width * unit * MIN_TILE_SCALE + safe.gap)))
    best = { ...stacked(safe, Math.min(across, tiles)), scale: MIN_TILE_SCALE }
  }
  const fits = best.scale >= MIN_TILE_SCALE && best.cellHeight >= REFERENCE_TILE.height * unit * MIN_TILE_SCALE - 0.5
  const scale = Math.min(MAX_TILE_SCALE, Math.max(MIN_TILE_SCALE, best.scale))
  // A tile fills its cell's width; it is no taller than its content needs (a little spare), or
  // its reference height when the area must scroll.
  const tileHeight = fits ? Math.min(best.cellHeight, REFERENCE_TILE.height * unit * scale * 1.25) : REFERENCE_TILE.height * unit * scale
  return {
    arrangement: best.arrangement,
    columns: best.columns,
    groupWidths: best.groupWidths,
    tileWidth: Math.floor(best.cellWidth),
    tileHeight: Math.floor(tileHeight),
    scale: Math.floor(scale * 1000) / 1000,
    fits,
  }
}
