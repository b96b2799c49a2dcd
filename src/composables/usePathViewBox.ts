import svgpath from 'svgpath'
import { computed, onMounted, ref, watch, type Ref } from 'vue'

export interface Box {
  x: number
  y: number
  width: number
  height: number
}

/**
 * Margin around a thumbnail's outline, as a share of its larger side: leaves room for the
 * half of the 1 px stroke that lies outside the geometry at thumbnail sizes (≥ 24 px).
 */
export const THUMBNAIL_MARGIN_RATIO = 0.06

/**
 * The box around every end and control point of SVG path data, arcs turned into cubics
 * first. A Bézier curve lies inside its control points' hull, so the drawing fits in this
 * box, possibly with room to spare. Null when the data has no drawable point.
 */
export function measurePathHull(data: string): Box | null {
  let minX = Infinity
  let minY = Infinity
  let maxX = -Infinity
  let maxY = -Infinity
  const include = (x: number, y: number) => {
    if (!Number.isFinite(x) || !Number.isFinite(y)) return
    minX = Math.min(minX, x)
    minY = Math.min(minY, y)
    maxX = Math.max(maxX, x)
    maxY = Math.max(maxY, y)
  }

  // After abs().unarc().unshort() only M, L, H, V, C, Q and Z remain; (x, y) is the current point.
  svgpath(data)
    .abs()
    .unarc()
    .unshort()
    .iterate((segment, _index, x, y) => {
      const [command, ...values] = segment
      if (command === 'H') include(values[0] ?? NaN, y)
      else if (command === 'V') include(x, values[0] ?? NaN)
      else for (let i = 0; i + 1 < values.length; i += 2) include(values[i], values[i + 1])
    })

  if (minX > maxX) return null
  return { x: minX, y: minY, width: maxX - minX, height: maxY - minY }
}

/** A viewBox attribute showing `box` with a margin; a single point gets a unit-sized view. */
export function formatViewBox(box: Box, marginRatio = THUMBNAIL_MARGIN_RATIO): string {
  const larger = Math.max(box.width, box.height)
  const margin = larger > 0 ? larger * marginRatio : 0.5
  return [box.x - margin, box.y - margin, box.width + 2 * margin, box.height + 2 * margin].join(' ')
}

/**
 * viewBox for drawing one path's data: the control-point hull at first, then the browser's
 * exact geometry box (getBBox) of the rendered `<path>` once it is in the page.
 */
export function usePathViewBox(data: () => string, pathElement: Ref<SVGGraphicsElement | null>) {
  const measured = ref<Box | null>(null)
  const hull = computed(() => measurePathHull(data()))

  function measureRendered(): void {
    measured.value = null
    const element = pathElement.value
    if (element === null || typeof element.getBBox !== 'function') return
    try {
      const { x, y, width, height } = element.getBBox()
      if ([x, y, width, height].every(Number.isFinite) && (width > 0 || height > 0)) {
        measured.value = { x, y, width, height }
      }
    } catch {
      // Not rendered (display: none) or no layout engine: the hull stays in use.
    }
  }

  onMounted(measureRendered)
  watch(data, measureRendered, { flush: 'post' })

  const box = computed(() => measured.value ?? hull.value)
  const viewBox = computed(() => (box.value === null ? undefined : formatViewBox(box.value)))
  return { viewBox, isEmpty: computed(() => box.value === null) }
}
