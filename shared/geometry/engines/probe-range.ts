/** Shared by the engines: signed distances of control points and the probe-range filter. */
import { CUBIC_CODE, evaluatePackedInto } from '../segments'

const point = new Float64Array(2)

/**
 * g(t) = direction × (P(t) − origin) of a cubic in power basis: out = [a, b, c, d] with
 * g = a·t³ + b·t² + c·t + d, from the signed distances f0..f3 of the control points.
 */
export function computeSidePolynomialInto(
  data: ArrayLike<number>, offset: number, ox: number, oy: number, dx: number, dy: number, out: Float64Array,
): void {
  const f0 = dx * (data[offset + 1] - oy) - dy * (data[offset] - ox)
  const f1 = dx * (data[offset + 3] - oy) - dy * (data[offset + 2] - ox)
  const f2 = dx * (data[offset + 5] - oy) - dy * (data[offset + 4] - ox)
  const f3 = dx * (data[offset + 7] - oy) - dy * (data[offset + 6] - ox)
  out[0] = f3 - 3 * f2 + 3 * f1 - f0
  out[1] = 3 * (f2 - 2 * f1 + f0)
  out[2] = 3 * (f1 - f0)
  out[3] = f0
}

/**
 * Keeps, in place and in order, the parameters ts[0 .. count) whose point on the cubic
 * projects into [sMin, sMax] on the probe, dropping repeats; returns the new count.
 */
export function keepInProbeRange(
  data: ArrayLike<number>, offset: number,
  ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number,
  ts: Float64Array, count: number,
): number {
  const directionSquared = dx * dx + dy * dy
  let written = 0
  for (let i = 0; i < count; i++) {
    evaluatePackedInto(data, offset, CUBIC_CODE, ts[i], point)
    const s = (dx * (point[0] - ox) + dy * (point[1] - oy)) / directionSquared
    if (s >= sMin && s <= sMax && (written === 0 || ts[i] !== ts[written - 1])) ts[written++] = ts[i]
  }
  return written
}

/** Sorts ts[0 .. count) ascending in place (insertion sort: at most a handful of values). */
export function sortSmall(ts: Float64Array, count: number): void {
  for (let i = 1; i < count; i++) {
    const t = ts[i]
    let j = i - 1
    while (j >= 0 && ts[j] > t) { ts[j + 1] = ts[j]; j-- }
    ts[j + 1] = t
  }
}
