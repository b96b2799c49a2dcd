import { computed, ref, shallowRef } from 'vue'
import type { Bounds, Point } from '../../shared/geometry'

/** A view: screen = world · scale + offset, in CSS pixels; the path's y-down frame is kept. */
export interface ViewState {
  readonly scale: number
  readonly offsetX: number
  readonly offsetY: number
}

/** Zoom limits in CSS pixels per path unit: wide enough for a 2048-unit em and a 0.01-unit detail. */
export const MIN_SCALE = 1e-4
export const MAX_SCALE = 1e6
/** Empty border kept around content by "fit", in CSS pixels. */
export const FIT_MARGIN_PX = 32

export function worldToScreen(view: ViewState, p: Point): Point {
  return [p[0] * view.scale + view.offsetX, p[1] * view.scale + view.offsetY]
}

export function screenToWorld(view: ViewState, x: number, y: number): Point {
  return [(x - view.offsetX) / view.scale, (y - view.offsetY) / view.scale]
}

/** The view after multiplying the scale by `factor` while the world point under (x, y) stays put. */
export function zoomViewAt(view: ViewState, x: number, y: number, factor: number): ViewState {
  const scale = Math.min(MAX_SCALE, Math.max(MIN_SCALE, view.scale * factor))
  const [wx, wy] = screenToWorld(view, x, y)
  return { scale, offsetX: x - wx * scale, offsetY: y - wy * scale }
}

/** The view that shows `bounds` whole and centred in a width × height viewport. */
export function fitView(bounds: Bounds, width: number, height: number): ViewState {
  const [minX, minY, maxX, maxY] = bounds
  const w = Math.max(maxX - minX, Number.MIN_VALUE)
  const h = Math.max(maxY - minY, Number.MIN_VALUE)
  const availableW = Math.max(width - 2 * FIT_MARGIN_PX, 1)
  const availableH = Math.max(height - 2 * FIT_MARGIN_PX, 1)
  const scale = Math.min(MAX_SCALE, Math.max(MIN_SCALE, Math.min(availableW / w, availableH / h)))
  return {
    scale,
    offsetX: width / 2 - ((minX + maxX) / 2) * scale,
    offsetY: height / 2 - ((minY + maxY) / 2) * scale,
  }
}

/** The world rectangle a viewport shows: [minX, minY, maxX, maxY]. */
export function visibleWorld(view: ViewState, width: number, height: number): Bounds {
  const [x0, y0] = screenToWorld(view, 0, 0)
  const [x1, y1] = screenToWorld(view, width, height)
  return [x0, y0, x1, y1]
}

/**
 * A grid step in path units: 1, 2 or 5 times a power of ten, the smallest whose cells are at
 * least `minPixels` wide at this scale (a millimetre-paper look: minor lines, a major line
 * every tenth).
 */
export function gridStepFor(scale: number, minPixels = 8): number {
  const raw = minPixels / scale
  const power = 10 ** Math.floor(Math.log10(raw))
  for (const m of [1, 2, 5, 10]) if (m * power >= raw) return m * power
  return 10 * power
}

/**
 * The canvas's view transform, the only place that maps path units to screen pixels. `yUp`
 * shows coordinates with y growing upwards (font units; glyphs are stored with y flipped on
 * import, so the picture stays upright and only the numbers shown change sign).
 */
export function useViewTransform() {
  const view = shallowRef<ViewState>({ scale: 20, offsetX: 40, offsetY: 40 })
  const width = ref(800)
  const height = ref(600)
  const yUp = ref(false)

  const gridStep = computed(() => gridStepFor(view.value.scale))

  function setSize(w: number, h: number): void {
    width.value = Math.max(1, Math.round(w))
    height.value = Math.max(1, Math.round(h))
  }
  function zoomAt(x: number, y: number, factor: number): void {
    view.value = zoomViewAt(view.value, x, y, factor)
  }
  function panBy(dx: number, dy: number): void {
    view.value = { ...view.value, offsetX: view.value.offsetX + dx, offsetY: view.value.offsetY + dy }
  }
  function fit(bounds: Bounds | null): void {
    if (bounds) view.value = fitView(bounds, width.value, height.value)
  }
  function toScreen(p: Point): Point {
    return worldToScreen(view.value, p)
  }
  function toWorld(x: number, y: number): Point {
    return screenToWorld(view.value, x, y)
  }
  /** A y value as shown to people (rulers, readouts, typed numbers). */
  function shownY(y: number): number {
    return yUp.value ? (y === 0 ? 0 : -y) : y
  }

  return { view, width, height, yUp, gridStep, setSize, zoomAt, panBy, fit, toScreen, toWorld, shownY }
}

export type ViewTransform = ReturnType<typeof useViewTransform>
