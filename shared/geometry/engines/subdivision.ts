/**
 * Recursive subdivision: halve the curve (de Casteljau) while its control polygon straddles
 * the line and is not yet flat; a flat piece is replaced by its chord, whose crossing with
 * the line gives t. Tangent touches whose chord does not cross are missed, by design of the
 * method. Allocation-free (an explicit stack in a module-level buffer).
 */
import type { IntersectionEngine } from './types'
import { keepInProbeRange } from './probe-range'

/** Default flatness: control points within 2^-24 (≈ 6e-8, single precision) of the curve's size from the chord. */
export const DEFAULT_FLATNESS_REL = 2 ** -24
/** Depth limit: 2^-52 of the parameter range, below which halving cannot progress. */
const MAX_DEPTH = 52
/** Roots found twice across a split point (both halves see it) are merged within this t distance. */
const DUPLICATE_T = 2 ** -40
const ENTRY = 11
const stack = new Float64Array((MAX_DEPTH + 2) * ENTRY)

/** A subdivision engine with flatness tolerance `flatnessRel` relative to the curve's size. */
export function createSubdivisionEngine(flatnessRel: number = DEFAULT_FLATNESS_REL): IntersectionEngine {
  function intersectCubicSubdivision(
    data: ArrayLike<number>, o: number,
    ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number,
    out: Float64Array,
  ): number {
    let size = 0
    for (let i = 2; i < 8; i++) size = Math.max(size, Math.abs(data[o + i] - data[o + (i & 1)]))
    const flatness = flatnessRel * size
    for (let i = 0; i < 8; i++) stack[i] = data[o + i]
    stack[8] = 0
    stack[9] = 1
    stack[10] = 0
    let top = 1
    let count = 0
    while (top > 0) {
      top--
      const b = top * ENTRY
      const x0 = stack[b], y0 = stack[b + 1], x1 = stack[b + 2], y1 = stack[b + 3]
      const x2 = stack[b + 4], y2 = stack[b + 5], x3 = stack[b + 6], y3 = stack[b + 7]
      const t0 = stack[b + 8], t1 = stack[b + 9], depth = stack[b + 10]
      const f0 = dx * (y0 - oy) - dy * (x0 - ox), f1 = dx * (y1 - oy) - dy * (x1 - ox)
      const f2 = dx * (y2 - oy) - dy * (x2 - ox), f3 = dx * (y3 - oy) - dy * (x3 - ox)
      if ((f0 > 0 && f1 > 0 && f2 > 0 && f3 > 0) || (f0 < 0 && f1 < 0 && f2 < 0 && f3 < 0)) continue
      const chordX = x3 - x0, chordY = y3 - y0
      const chord = Math.hypot(chordX, chordY)
      const d1 = chord === 0 ? Math.hypot(x1 - x0, y1 - y0) : Math.abs(chordX * (y1 - y0) - chordY * (x1 - x0)) / chord
      const d2 = chord === 0 ? Math.hypot(x2 - x0, y2 - y0) : Math.abs(chordX * (y2 - y0) - chordY * (x2 - x0)) / chord
      if ((d1 <= flatness && d2 <= flatness) || depth >= MAX_DEPTH) {
        if ((f0 <= 0 && f3 >= 0) || (f0 >= 0 && f3 <= 0)) {
          const t = f0 === f3 ? t0 : t0 + ((t1 - t0) * f0) / (f0 - f3)
          if (count === 0 || t - out[count - 1] > DUPLICATE_T) {
            if (count < out.length) out[count++] = t
          }
        }
        continue
      }
      // Split at ½; push the right half first so that the left one is processed first.
      const ax = (x0 + x1) / 2, ay = (y0 + y1) / 2, bx = (x1 + x2) / 2, by = (y1 + y2) / 2
      const cx = (x2 + x3) / 2, cy = (y2 + y3) / 2
      const abx = (ax + bx) / 2, aby = (ay + by) / 2, bcx = (bx + cx) / 2, bcy = (by + cy) / 2
      const mx = (abx + bcx) / 2, my = (aby + bcy) / 2, tm = (t0 + t1) / 2
      let r = top * ENTRY
      stack[r] = mx; stack[r + 1] = my; stack[r + 2] = bcx; stack[r + 3] = bcy
      stack[r + 4] = cx; stack[r + 5] = cy; stack[r + 6] = x3; stack[r + 7] = y3
      stack[r + 8] = tm; stack[r + 9] = t1; stack[r + 10] = depth + 1
      top++
      r = top * ENTRY
      stack[r] = x0; stack[r + 1] = y0; stack[r + 2] = ax; stack[r + 3] = ay
      stack[r + 4] = abx; stack[r + 5] = aby; stack[r + 6] = mx; stack[r + 7] = my
      stack[r + 8] = t0; stack[r + 9] = tm; stack[r + 10] = depth + 1
      top++
    }
    return keepInProbeRange(data, o, ox, oy, dx, dy, sMin, sMax, out, count)
  }
  return {
    name: 'subdivision',
    description: `recursive de Casteljau halving to flatness ${flatnessRel.toExponential(1)} of the curve size, then chord crossing`,
    intersectCubic: intersectCubicSubdivision,
  }
}

/** Subdivision engine with the default flatness tolerance. */
export const subdivisionEngine: IntersectionEngine = createSubdivisionEngine()
