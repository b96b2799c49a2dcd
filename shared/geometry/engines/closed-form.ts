/**
 * The closed-form engine: the cubic g(t) = direction × (P(t) − origin) in power basis,
 * solved by the closed-form cubic solver (Cardano / trigonometric form); roots near t = 0 or
 * ill-conditioned get a Newton polish on error-free control-point sides. Allocation-free.
 */
import { solveBernsteinCubicInto } from '../internal/bernstein-roots'
import { ROOT_T_SLACK } from '../internal/probe-tolerances'
import { refineCubicRoots } from '../internal/accurate-side'
import type { IntersectionEngine } from './types'
import { keepInProbeRange } from './probe-range'

function intersectCubicClosedForm(
  data: ArrayLike<number>, o: number,
  ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number,
  out: Float64Array,
): number {
  const x0 = data[o] - ox, y0 = data[o + 1] - oy, x1 = data[o + 2] - ox, y1 = data[o + 3] - oy
  const x2 = data[o + 4] - ox, y2 = data[o + 5] - oy, x3 = data[o + 6] - ox, y3 = data[o + 7] - oy
  const f0 = dx * y0 - dy * x0, f1 = dx * y1 - dy * x1, f2 = dx * y2 - dy * x2, f3 = dx * y3 - dy * x3
  // Convex hull: control points strictly on one side, or all outside the s-range, mean no meeting.
  if ((f0 > 0 && f1 > 0 && f2 > 0 && f3 > 0) || (f0 < 0 && f1 < 0 && f2 < 0 && f3 < 0)) return 0
  const p0 = dx * x0 + dy * y0, p1 = dx * x1 + dy * y1, p2 = dx * x2 + dy * y2, p3 = dx * x3 + dy * y3
  const directionSquared = dx * dx + dy * dy
  const low = sMin * directionSquared, high = sMax * directionSquared
  if ((p0 < low && p1 < low && p2 < low && p3 < low) || (p0 > high && p1 > high && p2 > high && p3 > high)) return 0
  const count = solveBernsteinCubicInto(f0, f1, f2, f3, ROOT_T_SLACK, out)
  if (count === 0) return 0
  refineCubicRoots(data, o, ox, oy, dx, dy, f0, f1, f2, f3, out, count)
  if (sMin === -Infinity && sMax === Infinity) return count
  return keepInProbeRange(data, o, ox, oy, dx, dy, sMin, sMax, out, count)
}

/** Closed-form cubic solve of the probe's implicit line equation along the curve. */
export const closedFormEngine: IntersectionEngine = {
  name: 'closed-form',
  description: 'implicit line substituted into the cubic, power basis, closed-form cubic solver, polish on exact sides where needed',
  intersectCubic: intersectCubicClosedForm,
}
