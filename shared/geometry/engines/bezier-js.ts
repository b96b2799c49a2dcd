/**
 * Adapter for bezier-js: `Bezier.prototype.lineIntersects`, which aligns the curve with the
 * line and solves the cubic of the aligned y coordinates, keeping roots whose point lies in
 * the line's bounding box. Rays and lines are given to it as a segment long enough to reach
 * past the curve.
 */
import { Bezier } from 'bezier-js'
import type { IntersectionEngine } from './types'
import { keepInProbeRange, sortSmall } from './probe-range'

/** A line segment, as bezier-js takes it, covering the probe's part that can reach the curve. */
export function describeProbeForBezierJs(
  data: ArrayLike<number>, o: number,
  ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number,
): { p1: { x: number; y: number }; p2: { x: number; y: number } } {
  let reach = 0
  for (let i = 0; i < 4; i++) reach = Math.max(reach, Math.hypot(data[o + 2 * i] - ox, data[o + 2 * i + 1] - oy))
  const extent = (2 * reach) / Math.hypot(dx, dy) + 1
  const from = Math.max(sMin, -extent), to = Math.min(sMax, extent)
  return { p1: { x: ox + from * dx, y: oy + from * dy }, p2: { x: ox + to * dx, y: oy + to * dy } }
}

/** Writes bezier-js's roots, sorted and filtered to the probe's range, into out. */
export function collectBezierJsRoots(
  found: readonly number[], data: ArrayLike<number>, o: number,
  ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number, out: Float64Array,
): number {
  const count = Math.min(found.length, out.length)
  for (let i = 0; i < count; i++) out[i] = found[i]
  sortSmall(out, count)
  return keepInProbeRange(data, o, ox, oy, dx, dy, sMin, sMax, out, count)
}

function intersectCubicBezierJs(
  data: ArrayLike<number>, o: number,
  ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number,
  out: Float64Array,
): number {
  const curve = new Bezier(data[o], data[o + 1], data[o + 2], data[o + 3], data[o + 4], data[o + 5], data[o + 6], data[o + 7])
  const found = curve.lineIntersects(describeProbeForBezierJs(data, o, ox, oy, dx, dy, sMin, sMax))
  return collectBezierJsRoots(found, data, o, ox, oy, dx, dy, sMin, sMax, out)
}

/** bezier-js line intersection behind the engine interface (builds a Bezier per call). */
export const bezierJsEngine: IntersectionEngine = {
  name: 'bezier-js',
  description: 'bezier-js 6 Bezier.lineIntersects (curve aligned to the line, its own cubic root finder)',
  intersectCubic: intersectCubicBezierJs,
}
