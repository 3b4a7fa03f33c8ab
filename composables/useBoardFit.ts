import type { Ref } from 'vue'
import type { BoardLayout } from '#shared/utils/board-layout'

type LayoutModule = typeof import('#shared/utils/board-layout')

/** The wall's computed size for one class. */
export interface BoardGroupFit {
  columns: number
  /** The class's block width in px, or null for the whole width. */
  width: number | null
  tileHeight: number
  headingHeight: number
  gap: number
}

export interface BoardFit {
  layout: BoardLayout
  groups: BoardGroupFit[]
  /** Style of the tiles' area: the tile scale and the classes' arrangement. */
  areaStyle: Record<string, string>
}

// The wall board in full screen: measures the area left for the tiles (what the header,
// counters and reason strip leave of the screen) and lays the field out to fill it
// (shared/utils/board-layout.ts). Null while not enabled or not measured, so the page keeps
// its ordinary flowing layout on a laptop or a phone. The layout's arithmetic is loaded when the
// wall is first shown: a phone or a laptop never needs it (the board's JavaScript budget).
export function useBoardFit(area: Ref<HTMLElement | null>, counts: Ref<number[]>, enabled: Ref<boolean>) {
  const size = ref<{ width: number, height: number, screenWidth: number, screenHeight: number } | null>(null)
  const lib = shallowRef<LayoutModule | null>(null)
  let observer: ResizeObserver | null = null
  watch(enabled, (on) => {
    if (on && import.meta.client && !lib.value) void import('#shared/utils/board-layout').then((m) => { lib.value = m })
  }, { immediate: true })

  const measure = () => {
    const el = area.value
    if (!el) return
    // Measured on the area, the screen from the window (the same in full screen).
    size.value = { width: el.clientWidth, height: el.clientHeight, screenWidth: window.innerWidth, screenHeight: window.innerHeight }
  }
  watch([area, enabled], ([el, on]) => {
    observer?.disconnect()
    observer = null
    size.value = null
    if (!el || !on || typeof ResizeObserver === 'undefined') return
    observer = new ResizeObserver(measure)
    observer.observe(el)
    measure()
  }, { flush: 'post' })
  onBeforeUnmount(() => observer?.disconnect())

  // The reason strip and counters follow the screen, not the field: their base size in px.
  const stripPx = computed(() => Math.round(30 * (size.value && lib.value ? lib.value.screenUnit(size.value.screenWidth, size.value.screenHeight) : 1)))

  const fit = computed<BoardFit | null>(() => {
    const s = size.value
    const m = lib.value
    if (!enabled.value || !s || !m) return null
    const u = m.screenUnit(s.screenWidth, s.screenHeight)
    const gap = Math.round(6 * u)
    const headingHeight = Math.round(38 * u)
    const layout = m.boardLayout({ width: s.width, height: s.height, groups: counts.value, unit: u, gap, headingHeight })
    return {
      layout,
      groups: layout.columns.map((columns, i) => ({
        columns,
        width: layout.arrangement === 'side-by-side' ? layout.groupWidths[i]! : null,
        tileHeight: layout.tileHeight,
        headingHeight,
        gap,
      })),
      areaStyle: {
        '--tile-k': String(Math.round(layout.scale * u * 1000) / 1000),
        'display': 'flex',
        'flexDirection': layout.arrangement === 'side-by-side' ? 'row' : 'column',
        'alignItems': 'flex-start',
        'gap': `${gap * 2}px`,
        'overflowY': layout.fits ? 'hidden' : 'auto',
      },
    }
  })
  return { fit, stripPx }
}
