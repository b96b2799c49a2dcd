/**
 * Normalised path segments: line, quadratic Bézier, cubic Bézier and SVG elliptical arc.
 *
 * A single segment is a readonly number tuple whose length says its kind:
 *   line       [x0, y0, x1, y1]                                   (4)
 *   quadratic  [x0, y0, x1, y1, x2, y2]                           (6)
 *   cubic      [x0, y0, x1, y1, x2, y2, x3, y3]                   (8)
 *   arc        [x0, y0, x1, y1, cx, cy, rx, ry,
 *               cosRotation, sinRotation, startAngle, sweepAngle]  (12)
 * An arc keeps its exact end points (x0, y0) and (x1, y1) beside its centre
 * parametrisation P(θ) = C + R(rotation)·(rx·cos θ, ry·sin θ), θ = startAngle + t·sweepAngle,
 * so that joins stay bit-exact; angles are radians, y grows downwards as in SVG.
 *
 * Batches are packed into one Float64Array with an offsets table; the kind of a packed
 * segment is the length of its slot (offsets[i + 1] − offsets[i]), the same code as above.
 */
import { solveQuadraticInto } from './solve-quadratic'

export type LineSegment = readonly [x0: number, y0: number, x1: number, y1: number]
export type QuadraticSegment = readonly [
  x0: number, y0: number, x1: number, y1: number, x2: number, y2: number,
]
export type CubicSegment = readonly [
  x0: number, y0: number, x1: number, y1: number, x2: number, y2: number, x3: number, y3: number,
]
export type ArcSegment = readonly [
  x0: number, y0: number, x1: number, y1: number,
  cx: number, cy: number, rx: number, ry: number,
  cosRotation: number, sinRotation: number, startAngle: number, sweepAngle: number,
]
export type Segment = LineSegment | QuadraticSegment | CubicSegment | ArcSegment
export type SegmentKind = 'line' | 'quadratic' | 'cubic' | 'arc'
export type Point = readonly [x: number, y: number]
/** [minX, minY, maxX, maxY] */
export type Bounds = readonly [minX: number, minY: number, maxX: number, maxY: number]

/** Kind codes of packed segments: the number of values in the slot. */
export const LINE_CODE = 4
export const QUADRATIC_CODE = 6
export const CUBIC_CODE = 8
export const ARC_CODE = 12

/** Packed segments: segment i occupies data[offsets[i] .. offsets[i + 1]). */
export interface SegmentBatch {
  readonly data: Float64Array
  readonly offsets: Int32Array
  readonly count: number
}

const KIND_BY_CODE: Readonly<Record<number, SegmentKind>> = {
  [LINE_CODE]: 'line',
  [QUADRATIC_CODE]: 'quadratic',
  [CUBIC_CODE]: 'cubic',
  [ARC_CODE]: 'arc',
}

/** Kind of a segment tuple; RangeError when the tuple has no segment length. */
export function getSegmentKind(segment: ArrayLike<number>): SegmentKind {
  const kind = KIND_BY_CODE[segment.length]
  if (kind === undefined) {
    throw new RangeError(`a segment has 4, 6, 8 or 12 numbers, got ${segment.length}`)
  }
  return kind
}

/** Packs segment tuples into one Float64Array with offsets (segment i at offsets[i]). */
export function packSegments(segments: readonly Segment[]): SegmentBatch {
  const offsets = new Int32Array(segments.length + 1)
  let total = 0
  for (let i = 0; i < segments.length; i++) {
    getSegmentKind(segments[i])
    offsets[i] = total
    total += segments[i].length
  }
  offsets[segments.length] = total
  const data = new Float64Array(total)
  for (let i = 0; i < segments.length; i++) data.set(segments[i], offsets[i])
  return { data, offsets, count: segments.length }
}

/** Start point of the packed segment at `offset`: always its first two values. */
export function readStartInto(data: ArrayLike<number>, offset: number, out: Float64Array): void {
  out[0] = data[offset]
  out[1] = data[offset + 1]
}

/** Index of the end point's x within a slot of kind `code`. */
export function endIndexOf(code: number): number {
  return code === ARC_CODE ? 2 : code - 2
}

/** Writes P(t) of the packed segment of kind `code` at `offset` into out[0], out[1]. */
export function evaluatePackedInto(
  data: ArrayLike<number>, offset: number, code: number, t: number, out: Float64Array,
): void {
  const o = offset
  if (t === 0 || t === 1) {
    const i = t === 0 ? o : o + endIndexOf(code)
    out[0] = data[i]
    out[1] = data[i + 1]
    return
  }
  const u = 1 - t
  if (code === LINE_CODE) {
    out[0] = u * data[o] + t * data[o + 2]
    out[1] = u * data[o + 1] + t * data[o + 3]
  } else if (code === QUADRATIC_CODE) {
    const b0 = u * u, b1 = 2 * u * t, b2 = t * t
    out[0] = b0 * data[o] + b1 * data[o + 2] + b2 * data[o + 4]
    out[1] = b0 * data[o + 1] + b1 * data[o + 3] + b2 * data[o + 5]
  } else if (code === CUBIC_CODE) {
    const b0 = u * u * u, b1 = 3 * u * u * t, b2 = 3 * u * t * t, b3 = t * t * t
    out[0] = b0 * data[o] + b1 * data[o + 2] + b2 * data[o + 4] + b3 * data[o + 6]
    out[1] = b0 * data[o + 1] + b1 * data[o + 3] + b2 * data[o + 5] + b3 * data[o + 7]
  } else {
    const angle = data[o + 10] + t * data[o + 11]
    const ex = data[o + 6] * Math.cos(angle), ey = data[o + 7] * Math.sin(angle)
    const c = data[o + 8], s = data[o + 9]
    out[0] = data[o + 4] + c * ex - s * ey
    out[1] = data[o + 5] + s * ex + c * ey
  }
}

/** Writes dP/dt of the packed segment of kind `code` at `offset` into out[0], out[1]. */
export function evaluateDerivativePackedInto(
  data: ArrayLike<number>, offset: number, code: number, t: number, out: Float64Array,
): void {
  const o = offset
  const u = 1 - t
  if (code === LINE_CODE) {
    out[0] = data[o + 2] - data[o]
    out[1] = data[o + 3] - data[o + 1]
  } else if (code === QUADRATIC_CODE) {
    out[0] = 2 * (u * (data[o + 2] - data[o]) + t * (data[o + 4] - data[o + 2]))
    out[1] = 2 * (u * (data[o + 3] - data[o + 1]) + t * (data[o + 5] - data[o + 3]))
  } else if (code === CUBIC_CODE) {
    const b0 = 3 * u * u, b1 = 6 * u * t, b2 = 3 * t * t
    out[0] = b0 * (data[o + 2] - data[o]) + b1 * (data[o + 4] - data[o + 2]) + b2 * (data[o + 6] - data[o + 4])
    out[1] = b0 * (data[o + 3] - data[o + 1]) + b1 * (data[o + 5] - data[o + 3]) + b2 * (data[o + 7] - data[o + 5])
  } else {
    const sweep = data[o + 11]
    const angle = data[o + 10] + t * sweep
    const ex = -data[o + 6] * Math.sin(angle) * sweep, ey = data[o + 7] * Math.cos(angle) * sweep
    const c = data[o + 8], s = data[o + 9]
    out[0] = c * ex - s * ey
    out[1] = s * ex + c * ey
  }
}

const pointScratch = new Float64Array(2)

/**
 * Point P(t) of a segment, 0 ≤ t ≤ 1. At t = 0 and t = 1 the stored end points are
 * returned exactly (for arcs too, not recomputed from the centre).
 */
export function evaluateSegment(segment: Segment, t: number): Point {
  evaluatePackedInto(segment, 0, segment.length, t, pointScratch)
  return [pointScratch[0], pointScratch[1]]
}

/** Derivative dP/dt of a segment at t (for an arc, sweepAngle times the angular derivative). */
export function evaluateSegmentDerivative(segment: Segment, t: number): Point {
  evaluateDerivativePackedInto(segment, 0, segment.length, t, pointScratch)
  return [pointScratch[0], pointScratch[1]]
}

const extremaScratch = new Float64Array(2)

/**
 * Tight axis-aligned bounds of a segment (end points plus interior extrema per axis).
 * Accuracy: extrema parameters come from the closed-form quadratic solver, so the bounds
 * are within a few rounding errors of the exact ones.
 */
export function computeSegmentBounds(segment: Segment): Bounds {
  const code = segment.length
  getSegmentKind(segment)
  const end = endIndexOf(code)
  let minX = Math.min(segment[0], segment[end]), maxX = Math.max(segment[0], segment[end])
  let minY = Math.min(segment[1], segment[end + 1]), maxY = Math.max(segment[1], segment[end + 1])
  const include = (t: number): void => {
    if (!(t > 0 && t < 1)) return
    evaluatePackedInto(segment, 0, code, t, pointScratch)
    minX = Math.min(minX, pointScratch[0]); maxX = Math.max(maxX, pointScratch[0])
    minY = Math.min(minY, pointScratch[1]); maxY = Math.max(maxY, pointScratch[1])
  }
  if (code === QUADRATIC_CODE) {
    for (let axis = 0; axis < 2; axis++) {
      const p0 = segment[axis], p1 = segment[2 + axis], p2 = segment[4 + axis]
      const denominator = p0 - 2 * p1 + p2
      if (denominator !== 0) include((p0 - p1) / denominator)
    }
  } else if (code === CUBIC_CODE) {
    for (let axis = 0; axis < 2; axis++) {
      const p0 = segment[axis], p1 = segment[2 + axis], p2 = segment[4 + axis], p3 = segment[6 + axis]
      const count = solveQuadraticInto(p3 - 3 * p2 + 3 * p1 - p0, 2 * (p2 - 2 * p1 + p0), p1 - p0, extremaScratch)
      for (let i = 0; i < count; i++) include(extremaScratch[i])
    }
  } else if (code === ARC_CODE) {
    const rx = segment[6], ry = segment[7], c = segment[8], s = segment[9]
    const start = segment[10], sweep = segment[11]
    const xAngle = Math.atan2(-ry * s, rx * c)
    const yAngle = Math.atan2(ry * c, rx * s)
    for (const angle of [xAngle, xAngle + Math.PI, yAngle, yAngle + Math.PI]) {
      include(arcParameterOfAngle(angle, start, sweep))
    }
  }
  return [minX, minY, maxX, maxY]
}

const TWO_PI = 2 * Math.PI

/**
 * Parameter t of the angle `angle` on an arc sweeping from `start` by `sweep`: the
 * representative of angle − start (mod 2π) counted in the sweep's direction, shifted by
 * one turn backwards when that lands nearer to t = 0 than the forward one does to t = 1.
 * The result may lie outside [0, 1]: the angle is then off the arc.
 */
export function arcParameterOfAngle(angle: number, start: number, sweep: number): number {
  const magnitude = Math.abs(sweep)
  let delta = sweep >= 0 ? angle - start : start - angle
  delta -= TWO_PI * Math.floor(delta / TWO_PI)
  const forward = delta / magnitude
  const backward = (delta - TWO_PI) / magnitude
  return forward - 1 <= -backward ? forward : backward
}

/** Splits a segment at 0 < t < 1 into two segments of the same kind (de Casteljau for Béziers). */
export function splitSegment(segment: Segment, t: number): readonly [Segment, Segment] {
  const code = segment.length
  getSegmentKind(segment)
  if (!(t > 0 && t < 1)) throw new RangeError(`split parameter must lie in (0, 1), got ${t}`)
  evaluatePackedInto(segment, 0, code, t, pointScratch)
  const mx = pointScratch[0], my = pointScratch[1]
  const s: readonly number[] = segment
  const lerp = (a: number, b: number): number => a + t * (b - a)
  if (code === LINE_CODE) {
    return [[s[0], s[1], mx, my], [mx, my, s[2], s[3]]] as const
  }
  if (code === QUADRATIC_CODE) {
    const ax = lerp(s[0], s[2]), ay = lerp(s[1], s[3]), bx = lerp(s[2], s[4]), by = lerp(s[3], s[5])
    return [[s[0], s[1], ax, ay, mx, my], [mx, my, bx, by, s[4], s[5]]] as const
  }
  if (code === CUBIC_CODE) {
    const ax = lerp(s[0], s[2]), ay = lerp(s[1], s[3])
    const bx = lerp(s[2], s[4]), by = lerp(s[3], s[5])
    const cx = lerp(s[4], s[6]), cy = lerp(s[5], s[7])
    const abx = lerp(ax, bx), aby = lerp(ay, by), bcx = lerp(bx, cx), bcy = lerp(by, cy)
    return [
      [s[0], s[1], ax, ay, abx, aby, mx, my],
      [mx, my, bcx, bcy, cx, cy, s[6], s[7]],
    ] as const
  }
  const first = t * s[11]
  return [
    [s[0], s[1], mx, my, s[4], s[5], s[6], s[7], s[8], s[9], s[10], first],
    [mx, my, s[2], s[3], s[4], s[5], s[6], s[7], s[8], s[9], s[10] + first, s[11] - first],
  ] as const
}
