/**
 * Geometry of the canvas's probes and sweeps: directions from angles, the lines of a
 * sweep, the canvas ↔ core probe forms, the visible piece of a probe in a rectangle, and
 * a path's extent. Pure functions on plain data; coordinates are the path's own (y down).
 */
import type { Bounds, NormalisedPath, Point, Probe, SweepLine } from '../../shared/geometry'
import { computeSegmentBounds, sweepLines as sweepLinesOf } from '../../shared/geometry'
import type { CanvasProbe, CanvasSweep } from './types'

/** Directions from angles live in the core, shared with the server. */
export { directionOfAngle } from '../../shared/geometry'

/** The lines of a canvas sweep (its id aside), built by the core exactly as the server builds them. */
export const sweepLines: (sweep: CanvasSweep) => SweepLine[] = sweepLinesOf

/** The computation contract's form of a canvas probe (the same numbers, shared). */
export function toCoreProbe(p: CanvasProbe): Probe {
  return p.type === 'segment' ? { type: 'segment', from: p.a, to: p.b } : { type: p.type, origin: p.a, direction: p.b }
}

/** The canvas form of a contract probe, with its id (the same numbers, shared). */
export function fromCoreProbe(probe: Probe, id: string): CanvasProbe {
  return probe.type === 'segment'
    ? { id, type: 'segment', a: probe.from, b: probe.to }
    : { id, type: probe.type, a: probe.origin, b: probe.direction }
}

/** Origin, direction and the s-range of a contract probe (a segment runs over s ∈ [0, 1]). */
export function describeProbe(probe: Probe): { origin: Point; direction: Point; sMin: number; sMax: number } {
  if (probe.type === 'segment') {
    return { origin: probe.from, direction: [probe.to[0] - probe.from[0], probe.to[1] - probe.from[1]], sMin: 0, sMax: 1 }
  }
  return { origin: probe.origin, direction: probe.direction, sMin: probe.type === 'ray' ? 0 : -Infinity, sMax: Infinity }
}

function clampTo(value: number, low: number, high: number): number {
  return value < low ? low : value > high ? high : value
}

/**
 * The visible piece of a probe inside the closed rectangle [minX, minY, maxX, maxY]: a ray
 * from its origin on, a line both ways, a segment between its ends (Liang–Barsky clipping,
 * Liang and Barsky, "A new concept and method for line clipping", ACM TOG 3(1), 1984). The
 * piece runs the probe's way; its ends are the probe's own points where they are inside
 * (exactly) and otherwise lie on the rectangle's edge (clamped onto it against rounding).
 * null when the probe misses the rectangle or the rectangle is empty (min > max). A piece
 * that only touches a corner is one point twice. A zero direction (or a segment from a
 * point to itself) is that point twice when inside, else null. RangeError for non-finite
 * numbers.
 */
export function clipProbeToRect(probe: Probe, rect: Bounds): [Point, Point] | null {
  const { origin, direction, sMin, sMax } = describeProbe(probe)
  const [minX, minY, maxX, maxY] = rect
  if (![origin[0], origin[1], direction[0], direction[1], minX, minY, maxX, maxY].every(Number.isFinite)) {
    throw new RangeError('probe and rectangle must be finite numbers')
  }
  if (minX > maxX || minY > maxY) return null
  if (direction[0] === 0 && direction[1] === 0) {
    const inside = origin[0] >= minX && origin[0] <= maxX && origin[1] >= minY && origin[1] <= maxY
    return inside ? [origin, origin] : null
  }
  // Each axis keeps s where min ≤ origin + s·direction ≤ max; an end set by an axis lies on
  // that axis's edge exactly (the other coordinate is computed and clamped against rounding).
  let low = sMin, high = sMax
  let lowEdge: { axis: 0 | 1; value: number } | null = null
  let highEdge: { axis: 0 | 1; value: number } | null = null
  for (const axis of [0, 1] as const) {
    const start = origin[axis], step = direction[axis]
    const min = rect[axis], max = rect[axis + 2]
    if (step === 0) {
      if (start < min || start > max) return null
      continue
    }
    const enter = step > 0 ? min : max, leave = step > 0 ? max : min
    const sEnter = (enter - start) / step, sLeave = (leave - start) / step
    if (sEnter > low) { low = sEnter; lowEdge = { axis, value: enter } }
    if (sLeave < high) { high = sLeave; highEdge = { axis, value: leave } }
  }
  if (low > high) return null
  const pointAt = (s: number, edge: { axis: 0 | 1; value: number } | null): Point => {
    if (edge === null) return s === 0 ? origin : (probe as { to: Point }).to
    const other = edge.axis === 0 ? 1 : 0
    const value = clampTo(origin[other] + s * direction[other], rect[other], rect[other + 2])
    return edge.axis === 0 ? [edge.value, value] : [value, edge.value]
  }
  return [pointAt(low, lowEdge), pointAt(high, highEdge)]
}

/** Tight bounds of a path (the union of its segments' bounds), null when it has no segments. */
export function pathBounds(path: NormalisedPath): Bounds | null {
  if (path.segments.length === 0) return null
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity
  for (const segment of path.segments) {
    const [x0, y0, x1, y1] = computeSegmentBounds(segment)
    if (x0 < minX) minX = x0
    if (y0 < minY) minY = y0
    if (x1 > maxX) maxX = x1
    if (y1 > maxY) maxY = y1
  }
  return [minX, minY, maxX, maxY]
}

/** A path's size: the diagonal of its bounds, 0 when it has no segments. */
export function pathSize(path: NormalisedPath): number {
  const bounds = pathBounds(path)
  return bounds === null ? 0 : Math.hypot(bounds[2] - bounds[0], bounds[3] - bounds[1])
}
