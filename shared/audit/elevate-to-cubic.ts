/**
 * The engines take cubics only: lines and quadratics are raised to cubics by exact degree
 * elevation (the same curve with the same parameter t, so a root's t is the segment's own),
 * arcs are left out and counted as skipped.
 */
import type { NormalisedPath } from '../geometry/path-data'
import { ARC_CODE, LINE_CODE, QUADRATIC_CODE } from '../geometry/segments'
import type { CubicSegment, Segment } from '../geometry/segments'

/**
 * The cubic of a line or quadratic (a cubic as it is), null for an arc. Line: controls at ⅓
 * and ⅔ of the chord; quadratic (P0, Q, P2): controls P0 + ⅔(Q − P0) and P2 + ⅔(Q − P2)
 * (common practice). Exact in exact arithmetic; each control is rounded once (≤ ½ ulp per
 * coordinate, none where the coordinates are equal), and the reference and every engine see
 * the same rounded cubic.
 */
export function elevateToCubic(segment: Segment): CubicSegment | null {
  if (segment.length === ARC_CODE) return null
  if (segment.length === LINE_CODE) {
    const [x0, y0, x1, y1] = segment
    return [x0, y0, x0 + (x1 - x0) / 3, y0 + (y1 - y0) / 3, x1 - (x1 - x0) / 3, y1 - (y1 - y0) / 3, x1, y1]
  }
  if (segment.length === QUADRATIC_CODE) {
    const [x0, y0, qx, qy, x2, y2] = segment
    return [x0, y0, x0 + (2 * (qx - x0)) / 3, y0 + (2 * (qy - y0)) / 3, x2 + (2 * (qx - x2)) / 3, y2 + (2 * (qy - y2)) / 3, x2, y2]
  }
  return segment as CubicSegment
}

/** A path's cubics packed 8 values each, with the index of the segment each came from. */
export interface PackedCubics {
  /** Cubic k occupies data[8k .. 8k + 8). */
  readonly data: Float64Array
  /** segment[k]: index in path.segments of cubic k. */
  readonly segment: Int32Array
  readonly count: number
  /** Arc segments, left out. */
  readonly skipped: number
  /** Largest |coordinate| of the packed cubics. */
  readonly magnitude: number
}

/** Packs the cubics of a path (lines and quadratics elevated, arcs skipped). */
export function packPathCubics(path: NormalisedPath): PackedCubics {
  const cubics: CubicSegment[] = []
  const from: number[] = []
  path.segments.forEach((segment, index) => {
    const cubic = elevateToCubic(segment)
    if (cubic === null) return
    cubics.push(cubic)
    from.push(index)
  })
  const data = new Float64Array(8 * cubics.length)
  let magnitude = 0
  cubics.forEach((cubic, k) => {
    data.set(cubic, 8 * k)
    for (const value of cubic) magnitude = Math.max(magnitude, Math.abs(value))
  })
  return { data, segment: Int32Array.from(from), count: cubics.length, skipped: path.segments.length - cubics.length, magnitude }
}
