/**
 * Probes (rays, lines, segments) against normalised paths: the hits of the contract.
 *
 * Method. The probe's implicit line is g(P) = direction × (P − origin). Along one subpath:
 * 1. every vertex (segment end point) gets g; |g| ≤ ON_PROBE_REL·|d|·L puts it on the probe;
 * 2. a line or a flat curve whose points are all on the probe is an overlap;
 * 3. every other segment gives the roots of g(P(t)) on [0, 1]: linear, or the quadratic /
 *    cubic in power basis through the closed-form solvers, or, for an exact arc, a quadratic
 *    in the probe's parameter; interior critical points where |g| is within the tolerance are
 *    added as touch candidates, so tangents through extrema are found even when rounding
 *    pushes the double root off the real axis;
 * 4. consecutive events between which the path stays within the tolerance band are one
 *    meeting point (a join is one hit; a split double root is one hit);
 * 5. each meeting point is classified by the side of the path just before and just after
 *    it: from the exact g of the nearest vertex off the probe, or from g sampled on the
 *    piece of segment in between. Crossing windings are (after − before)/2, which makes the
 *    windings telescope: their sum along any stretch equals the change of side, the reason
 *    the sum along a ray from a point is its winding number.
 */
import type { NormalisedPath } from './path-data'
import type { Point } from './segments'
import { ARC_CODE, CUBIC_CODE, LINE_CODE, QUADRATIC_CODE, arcParameterOfAngle, endIndexOf, evaluatePackedInto } from './segments'
import { intersectLineArcInto } from './arc'
import {
  findBernsteinCubicCriticalInto, solveBernsteinCubicInto, solveBernsteinQuadraticInto,
} from './internal/bernstein-roots'
import type { PreparedPath } from './internal/prepared-path'
import { preparePath } from './internal/prepared-path'
import { ON_PROBE_REL, PROBE_END_REL, ROOT_T_SLACK } from './internal/probe-tolerances'
import { refineCubicRoots } from './internal/accurate-side'

/** A probe as the API receives it. */
export type Probe =
  | { readonly type: 'ray' | 'line'; readonly origin: Point; readonly direction: Point }
  | { readonly type: 'segment'; readonly from: Point; readonly to: Point }

export type HitKind = 'crossing' | 'tangent' | 'overlap'

/** One meeting of a probe with a path, as the contract defines it. */
export interface Hit {
  readonly segment: number
  readonly t: number
  readonly s: number
  readonly point: Point
  readonly kind: HitKind
  readonly winding: -1 | 0 | 1
  readonly sEnd?: number
  readonly tEnd?: number
}

/** Origin, direction and parameter range of a probe: the form the core works on. */
export interface ProbeLine {
  readonly ox: number
  readonly oy: number
  readonly dx: number
  readonly dy: number
  readonly sMin: number
  readonly sMax: number
}

/** Origin, direction and s-range of a probe; RangeError for a zero direction or non-finite numbers. */
export function resolveProbe(probe: Probe): ProbeLine {
  let line: ProbeLine
  if (probe.type === 'segment') {
    const [fx, fy] = probe.from
    const [tx, ty] = probe.to
    line = { ox: fx, oy: fy, dx: tx - fx, dy: ty - fy, sMin: 0, sMax: 1 }
  } else if (probe.type === 'ray' || probe.type === 'line') {
    const [ox, oy] = probe.origin
    const [dx, dy] = probe.direction
    line = { ox, oy, dx, dy, sMin: probe.type === 'ray' ? 0 : -Infinity, sMax: Infinity }
  } else {
    throw new RangeError(`probe type must be ray, line or segment, got ${String((probe as { type: unknown }).type)}`)
  }
  if (![line.ox, line.oy, line.dx, line.dy].every(Number.isFinite)) throw new RangeError('probe coordinates must be finite numbers')
  if (line.dx === 0 && line.dy === 0) throw new RangeError('probe direction must not be zero (a segment probe needs two distinct points)')
  return line
}

const ROOT = 0, VERTEX = 1, OVERLAP = 2
const KIND_CROSSING = 0, KIND_TANGENT = 1, KIND_OVERLAP = 2
/** Side marker of a missing stretch (before the start or after the end of an open subpath). */
const NO_SIDE = 2

// Module-level scratch, grown on demand and reused by every call (the core is single-threaded
// and not re-entrant): per-vertex values, events, clusters, portions and the hit records.
let vertexF: Float64Array = new Float64Array(64)
let overlapOf: Uint8Array = new Uint8Array(64)
let eventSegment: Int32Array = new Int32Array(512)
let eventT: Float64Array = new Float64Array(512)
let eventType: Uint8Array = new Uint8Array(512)
let eventK: Int32Array = new Int32Array(512)
let eventPositionT: Float64Array = new Float64Array(512)
let clusterFirst: Int32Array = new Int32Array(128)
let clusterLength: Int32Array = new Int32Array(128)
let clusterRun: Uint8Array = new Uint8Array(128)
let clusterStartK: Int32Array = new Int32Array(128)
let clusterStartT: Float64Array = new Float64Array(128)
let clusterEndK: Int32Array = new Int32Array(128)
let clusterEndT: Float64Array = new Float64Array(128)
let portionStartSide: Int8Array = new Int8Array(128)
let portionEndSide: Int8Array = new Int8Array(128)

let hitCount = 0
let hitSegment: Int32Array = new Int32Array(64)
let hitT: Float64Array = new Float64Array(64)
let hitS: Float64Array = new Float64Array(64)
let hitX: Float64Array = new Float64Array(64)
let hitY: Float64Array = new Float64Array(64)
let hitSEnd: Float64Array = new Float64Array(64)
let hitTEnd: Float64Array = new Float64Array(64)
let hitKind: Uint8Array = new Uint8Array(64)
let hitWinding: Int8Array = new Int8Array(64)

type ScratchArray = Float64Array | Int32Array | Uint8Array | Int8Array

/** `array` if it holds `size` values, else a larger one of the same type (its values copied when `keep`). */
function grown<T extends ScratchArray>(array: T, size: number, keep: boolean): T {
  if (array.length >= size) return array
  const next = new (array.constructor as new (length: number) => T)(Math.max(size, array.length * 2))
  if (keep) next.set(array as ArrayLike<number> & T)
  return next
}

function ensureSubpathCapacity(segments: number): void {
  const vertices = segments + 2
  vertexF = grown(vertexF, vertices, false)
  overlapOf = grown(overlapOf, vertices, false)
  const events = 8 * segments + 8
  eventSegment = grown(eventSegment, events, false)
  eventT = grown(eventT, events, false)
  eventType = grown(eventType, events, false)
  eventK = grown(eventK, events, false)
  eventPositionT = grown(eventPositionT, events, false)
  clusterFirst = grown(clusterFirst, events, false)
  clusterLength = grown(clusterLength, events, false)
  clusterRun = grown(clusterRun, events, false)
  clusterStartK = grown(clusterStartK, events, false)
  clusterStartT = grown(clusterStartT, events, false)
  clusterEndK = grown(clusterEndK, events, false)
  clusterEndT = grown(clusterEndT, events, false)
  portionStartSide = grown(portionStartSide, events + 1, false)
  portionEndSide = grown(portionEndSide, events + 1, false)
}

function ensureHitCapacity(size: number): void {
  if (hitSegment.length >= size) return
  hitSegment = grown(hitSegment, size, true)
  hitT = grown(hitT, size, true)
  hitS = grown(hitS, size, true)
  hitX = grown(hitX, size, true)
  hitY = grown(hitY, size, true)
  hitSEnd = grown(hitSEnd, size, true)
  hitTEnd = grown(hitTEnd, size, true)
  hitKind = grown(hitKind, size, true)
  hitWinding = grown(hitWinding, size, true)
}

// The probe and subpath being processed (module-level so that helpers take scalars only).
let data: Float64Array = new Float64Array(0)
let offsets: Int32Array = new Int32Array(0)
let order: Int32Array = new Int32Array(0)
let base = 0
let segmentsInSubpath = 0
let closed = false
let ox = 0, oy = 0, dx = 0, dy = 0, directionSquared = 0
let sMin = 0, sMax = 0
let onTolerance = 0
let sTolerance = 0
const point = new Float64Array(2)
const roots = new Float64Array(4)
const critical = new Float64Array(2)

function segmentAt(k: number): number {
  return order[base + (((k % segmentsInSubpath) + segmentsInSubpath) % segmentsInSubpath)]
}
function vertexIndex(k: number): number {
  return closed ? ((k % segmentsInSubpath) + segmentsInSubpath) % segmentsInSubpath : k
}
function sideOf(x: number, y: number): number {
  return dx * (y - oy) - dy * (x - ox)
}
function projectionOf(x: number, y: number): number {
  return dx * (x - ox) + dy * (y - oy)
}
/** g at parameter t of the subpath's k-th segment. */
function sideAt(k: number, t: number): number {
  const segment = segmentAt(k)
  const offset = offsets[segment]
  evaluatePackedInto(data, offset, offsets[segment + 1] - offset, t, point)
  return sideOf(point[0], point[1])
}
function signOf(value: number): number {
  return value > onTolerance ? 1 : value < -onTolerance ? -1 : 0
}

/**
 * Sign of the path on the k-th segment between t = from and t = to, where g has no root:
 * the sample of largest |g| among three decides; 0 when all lie within the tolerance.
 */
function sampleSide(k: number, from: number, to: number): number {
  let best = 0
  for (let i = 1; i <= 3; i++) {
    const value = sideAt(k, from + ((to - from) * i) / 4)
    if (Math.abs(value) > Math.abs(best)) best = value
  }
  return signOf(best)
}

let eventCount = 0
function pushEvent(type: number, k: number, t: number): void {
  const i = eventCount++
  eventType[i] = type
  eventSegment[i] = k
  eventT[i] = t
  eventK[i] = t === 1 ? k + 1 : k
  eventPositionT[i] = t === 1 ? 0 : t
}

/** Roots (and touch candidates) of the subpath's k-th segment, pushed ascending in t. */
function pushSegmentEvents(k: number): void {
  const segment = segmentAt(k)
  const o = offsets[segment]
  const code = offsets[segment + 1] - o
  const f0 = vertexF[vertexIndex(k)]
  const fEnd = vertexF[vertexIndex(k + 1)]
  const first = eventCount
  candidateCount = 0
  const lowBound = (sMin - sTolerance) * directionSquared
  const highBound = (sMax + sTolerance) * directionSquared
  if (code === ARC_CODE) {
    const rx = data[o + 6], ry = data[o + 7], c = data[o + 8], s = data[o + 9]
    const centreSide = sideOf(data[o + 4], data[o + 5])
    const reach = Math.max(rx, ry) * Math.sqrt(directionSquared)
    const centreProjection = projectionOf(data[o + 4], data[o + 5])
    if (centreSide - reach > onTolerance || centreSide + reach < -onTolerance) return checkParity(k, f0, fEnd, first)
    if (centreProjection + reach < lowBound || centreProjection - reach > highBound) return
    const count = intersectLineArcInto(data, o, ox, oy, dx, dy, ROOT_T_SLACK, roots)
    for (let i = 0; i < count; i++) candidates[candidateCount++] = roots[i]
    // g(θ) = centreSide + A·cos θ + B·sin θ has its extremes at θ = atan2(B, A) and that + π.
    const cosTerm = rx * (dx * s - dy * c), sinTerm = ry * (dx * c + dy * s)
    const extreme = Math.atan2(sinTerm, cosTerm)
    for (const angle of [extreme, extreme + Math.PI]) {
      const t = arcParameterOfAngle(angle, data[o + 10], data[o + 11])
      if (t > 0 && t < 1 && Math.abs(sideAt(k, t)) <= onTolerance) candidates[candidateCount++] = t
    }
  } else if (code === LINE_CODE) {
    if ((f0 > onTolerance && fEnd > onTolerance) || (f0 < -onTolerance && fEnd < -onTolerance) || f0 === fEnd) {
      return checkParity(k, f0, fEnd, first)
    }
    const t = f0 / (f0 - fEnd)
    if (t >= -ROOT_T_SLACK && t <= 1 + ROOT_T_SLACK) candidates[candidateCount++] = Math.min(1, Math.max(0, t))
  } else {
    const f1 = sideOf(data[o + 2], data[o + 3])
    const f2 = code === QUADRATIC_CODE ? fEnd : sideOf(data[o + 4], data[o + 5])
    const f3 = fEnd
    const maximum = Math.max(f0, f1, f2, f3), minimum = Math.min(f0, f1, f2, f3)
    if (minimum > onTolerance || maximum < -onTolerance) return checkParity(k, f0, fEnd, first)
    const p0 = projectionOf(data[o], data[o + 1]), p1 = projectionOf(data[o + 2], data[o + 3])
    const p2 = projectionOf(data[o + 4], data[o + 5])
    const p3 = code === CUBIC_CODE ? projectionOf(data[o + 6], data[o + 7]) : p2
    if (Math.max(p0, p1, p2, p3) < lowBound || Math.min(p0, p1, p2, p3) > highBound) return
    let count: number
    let criticalCount: number
    if (code === QUADRATIC_CODE) {
      count = solveBernsteinQuadraticInto(f0, f1, f3, ROOT_T_SLACK, roots)
      const curvature = f0 - 2 * f1 + f3
      critical[0] = curvature === 0 ? -1 : (f0 - f1) / curvature
      criticalCount = critical[0] > 0 && critical[0] < 1 ? 1 : 0
    } else {
      count = solveBernsteinCubicInto(f0, f1, f2, f3, ROOT_T_SLACK, roots)
      refineCubicRoots(data, o, ox, oy, dx, dy, f0, f1, f2, f3, roots, count)
      criticalCount = findBernsteinCubicCriticalInto(f0, f1, f2, f3, critical)
    }
    for (let i = 0; i < count; i++) candidates[candidateCount++] = roots[i]
    for (let i = 0; i < criticalCount; i++) {
      if (Math.abs(sideAt(k, critical[i])) <= onTolerance) candidates[candidateCount++] = critical[i]
    }
  }
  pushCandidates(k)
  checkParity(k, f0, fEnd, first)
}

const candidates = new Float64Array(8)
let candidateCount = 0

/** Pushes the collected candidate parameters of segment k as events, ascending and distinct. */
function pushCandidates(k: number): void {
  for (let i = 1; i < candidateCount; i++) {
    const t = candidates[i]
    let j = i - 1
    while (j >= 0 && candidates[j] > t) { candidates[j + 1] = candidates[j]; j-- }
    candidates[j + 1] = t
  }
  for (let i = 0; i < candidateCount; i++) {
    if (i === 0 || candidates[i] !== candidates[i - 1]) pushEvent(ROOT, k, candidates[i])
  }
}

/**
 * A segment between two vertices off the probe on opposite sides must cross it; when
 * rounding lost that root, bisection on g restores it.
 */
function checkParity(k: number, f0: number, fEnd: number, first: number): void {
  if (eventCount > first) return
  if (!((f0 > onTolerance && fEnd < -onTolerance) || (f0 < -onTolerance && fEnd > onTolerance))) return
  let low = 0, high = 1
  const lowSign = f0 > 0
  for (let i = 0; i < 60 && high - low > Number.EPSILON; i++) {
    const middle = (low + high) / 2
    if (sideAt(k, middle) > 0 === lowSign) low = middle
    else high = middle
  }
  pushEvent(ROOT, k, (low + high) / 2)
}

/**
 * True when the path between positions (ka, ta) and (kb, tb) (kb ≥ ka, at most two
 * segments apart) stays within the tolerance band of the probe.
 */
function staysOnProbe(ka: number, ta: number, kb: number, tb: number): boolean {
  if (ka === kb && ta === tb) return true
  if (kb - ka > 2) return false
  let k = ka, t = ta
  while (k < kb || (k === kb && t < tb)) {
    const end = k < kb ? 1 : tb
    if (Math.abs(sideAt(k, (t + end) / 2)) > onTolerance) return false
    if (k < kb) {
      if (k + 1 < kb || tb > 0) {
        if (Math.abs(vertexF[vertexIndex(k + 1)]) > onTolerance) return false
      }
    }
    k++
    t = 0
    if (k === kb && tb === 0) break
  }
  return true
}

/**
 * Sides of the path just after (ka, ta) and just before (kb, tb) on the stretch between
 * them, which holds no meeting point: [startSide, endSide] as −1, 0 or 1.
 */
function stretchSides(ka: number, ta: number, kb: number, tb: number): void {
  const firstInterior = ka + 1
  const lastInterior = tb > 0 ? kb : kb - 1
  if (firstInterior > lastInterior) {
    stretchStart = stretchEnd = sampleSide(ka, ta, kb === ka ? tb : 1)
    return
  }
  stretchStart = signOf(vertexF[vertexIndex(firstInterior)])
  if (stretchStart === 0) stretchStart = sampleSide(ka, ta, 1)
  stretchEnd = signOf(vertexF[vertexIndex(lastInterior)])
  if (stretchEnd === 0) stretchEnd = tb > 0 ? sampleSide(kb, 0, tb) : sampleSide(kb - 1, 0, 1)
}
let stretchStart = 0
let stretchEnd = 0

function emitHit(
  segment: number, t: number, s: number, x: number, y: number, kind: number, winding: number, sEnd: number, tEnd: number,
): void {
  ensureHitCapacity(hitCount + 1)
  const i = hitCount++
  hitSegment[i] = segment
  hitT[i] = t
  hitS[i] = s
  hitX[i] = x
  hitY[i] = y
  hitKind[i] = kind
  hitWinding[i] = winding
  hitSEnd[i] = sEnd
  hitTEnd[i] = tEnd
}

/** Winding of a meeting point from its sides; NO_SIDE marks the open ends. */
function windingOf(before: number, after: number): number {
  if (before === NO_SIDE && after === NO_SIDE) return 0
  if (before === NO_SIDE) return after
  if (after === NO_SIDE) return -before
  return before === 0 || after === 0 || before === after ? 0 : (after - before) / 2
}

function emitPointCluster(cluster: number, winding: number): void {
  const first = clusterFirst[cluster], length = clusterLength[cluster]
  const events = eventCount
  let chosen = first + (length >> 1)
  for (let i = 0; i < length; i++) {
    const e = (first + i) % events
    if (eventType[e] === VERTEX) { chosen = e; break }
  }
  chosen %= events
  let k = eventSegment[chosen], t = eventT[chosen]
  if (eventType[chosen] === VERTEX) {
    if (!closed && k === segmentsInSubpath) { k = segmentsInSubpath - 1; t = 1 } else t = 0
  }
  const segment = segmentAt(k)
  const offset = offsets[segment]
  evaluatePackedInto(data, offset, offsets[segment + 1] - offset, t, point)
  const s = projectionOf(point[0], point[1]) / directionSquared
  if (s < sMin - sTolerance || s > sMax + sTolerance) return
  const kind = winding === 0 ? KIND_TANGENT : KIND_CROSSING
  emitHit(segment, t, Math.min(sMax, Math.max(sMin, s)), point[0], point[1], kind, winding, 0, 0)
}

/** s-extent of an overlap segment: writes s, t (lower end) and sEnd, tEnd into overlapExtent. */
const overlapExtent = new Float64Array(4)
function measureOverlap(k: number): void {
  const segment = segmentAt(k)
  const o = offsets[segment]
  const code = offsets[segment + 1] - o
  let lowS = Infinity, lowT = 0, highS = -Infinity, highT = 0
  const consider = (t: number): void => {
    evaluatePackedInto(data, o, code, t, point)
    const s = projectionOf(point[0], point[1]) / directionSquared
    if (s < lowS) { lowS = s; lowT = t }
    if (s > highS) { highS = s; highT = t }
  }
  consider(0)
  consider(1)
  if (code !== LINE_CODE) {
    const p0 = projectionOf(data[o], data[o + 1]), p1 = projectionOf(data[o + 2], data[o + 3])
    const p2 = projectionOf(data[o + 4], data[o + 5])
    if (code === QUADRATIC_CODE) {
      const curvature = p0 - 2 * p1 + p2
      if (curvature !== 0) {
        const t = (p0 - p1) / curvature
        if (t > 0 && t < 1) consider(t)
      }
    } else {
      const count = findBernsteinCubicCriticalInto(p0, p1, p2, projectionOf(data[o + 6], data[o + 7]), critical)
      for (let i = 0; i < count; i++) consider(critical[i])
    }
  }
  overlapExtent[0] = lowS
  overlapExtent[1] = lowT
  overlapExtent[2] = highS
  overlapExtent[3] = highT
}

/** Parameter t on the overlap segment k where s equals `target`, between tLow and tHigh. */
function parameterAtS(k: number, target: number, tLow: number, sLow: number, tHigh: number, sHigh: number): number {
  const segment = segmentAt(k)
  const o = offsets[segment]
  const code = offsets[segment + 1] - o
  if (code === LINE_CODE) return tLow + ((tHigh - tLow) * (target - sLow)) / (sHigh - sLow)
  let a = tLow, b = tHigh
  for (let i = 0; i < 60; i++) {
    const middle = (a + b) / 2
    evaluatePackedInto(data, o, code, middle, point)
    if (projectionOf(point[0], point[1]) / directionSquared < target) a = middle
    else b = middle
  }
  return (a + b) / 2
}

/** Emits the overlap hits of a run cluster; the last of the run carries the passage. */
function emitRunCluster(cluster: number, passage: number): void {
  const first = clusterFirst[cluster], length = clusterLength[cluster]
  const events = eventCount
  const startHit = hitCount
  let cut = false
  let lastEmitted = -1
  for (let i = 0; i < length; i++) {
    const e = (first + i) % events
    if (eventType[e] !== OVERLAP) continue
    const k = eventSegment[e]
    measureOverlap(k)
    let lowS = overlapExtent[0], lowT = overlapExtent[1], highS = overlapExtent[2], highT = overlapExtent[3]
    if (highS < sMin - sTolerance || lowS > sMax + sTolerance) { cut = true; continue }
    let s = lowS, t = lowT, sEnd = highS, tEnd = highT
    if (lowS < sMin - sTolerance) { cut = true; t = parameterAtS(k, sMin, lowT, lowS, highT, highS); s = sMin }
    if (highS > sMax + sTolerance) { cut = true; tEnd = parameterAtS(k, sMax, lowT, lowS, highT, highS); sEnd = sMax }
    s = Math.max(sMin, s)
    sEnd = Math.min(sMax, sEnd)
    const segment = segmentAt(k)
    const o = offsets[segment]
    evaluatePackedInto(data, o, offsets[segment + 1] - o, t, point)
    lowS = s
    highT = tEnd
    emitHit(segment, t, lowS, point[0], point[1], KIND_OVERLAP, 0, sEnd, highT)
    lastEmitted = hitCount - 1
  }
  if (!cut && lastEmitted >= startHit) hitWinding[lastEmitted] = passage
}

/** Processes one subpath of the prepared path against the current probe. */
function probeSubpath(path: PreparedPath, subpath: number): void {
  base = path.subpathStart[subpath]
  segmentsInSubpath = path.subpathCount[subpath]
  closed = path.subpathClosed[subpath] === 1
  const n = segmentsInSubpath
  if (n === 0) return
  ensureSubpathCapacity(n)
  const vertices = closed ? n : n + 1
  for (let k = 0; k < n; k++) {
    const o = offsets[order[base + k]]
    vertexF[k] = sideOf(data[o], data[o + 1])
  }
  if (!closed) {
    const last = order[base + n - 1]
    const o = offsets[last]
    const end = o + endIndexOf(offsets[last + 1] - o)
    vertexF[n] = sideOf(data[end], data[end + 1])
  }
  let minimum = Infinity, maximum = -Infinity
  for (let v = 0; v < vertices; v++) {
    const f = vertexF[v]
    if (f < minimum) minimum = f
    if (f > maximum) maximum = f
  }
  const anyOn = minimum <= onTolerance && maximum >= -onTolerance
  // Overlaps: a line with both ends on the probe, or a Bézier with every control point on it.
  for (let k = 0; k < n; k++) {
    overlapOf[k] = 0
    if (!anyOn) continue
    if (Math.abs(vertexF[vertexIndex(k)]) > onTolerance || Math.abs(vertexF[vertexIndex(k + 1)]) > onTolerance) continue
    const segment = order[base + k]
    const o = offsets[segment]
    const code = offsets[segment + 1] - o
    if (code === ARC_CODE) continue
    let flat = true
    for (let i = 2; i < code - 2; i += 2) if (Math.abs(sideOf(data[o + i], data[o + i + 1])) > onTolerance) flat = false
    overlapOf[k] = flat ? 1 : 0
  }
  eventCount = 0
  for (let k = 0; k < n; k++) {
    const previousOverlap = k > 0 ? overlapOf[k - 1] === 1 : closed && overlapOf[n - 1] === 1
    if (Math.abs(vertexF[k]) <= onTolerance && !previousOverlap && overlapOf[k] === 0) pushEvent(VERTEX, k, 0)
    if (overlapOf[k] === 1) {
      pushEvent(OVERLAP, k, 0)
    } else {
      pushSegmentEvents(k)
    }
  }
  if (!closed && Math.abs(vertexF[n]) <= onTolerance && overlapOf[n - 1] === 0) {
    const i = eventCount++
    eventType[i] = VERTEX
    eventSegment[i] = n
    eventT[i] = 0
    eventK[i] = n
    eventPositionT[i] = 0
  }
  if (eventCount === 0) return
  classifyEvents(n)
}

function startK(e: number): number { return eventK[e] }
function startT(e: number): number { return eventPositionT[e] }
function endK(e: number): number { return eventType[e] === OVERLAP ? eventSegment[e] + 1 : eventK[e] }
function endT(e: number): number { return eventType[e] === OVERLAP ? 0 : eventPositionT[e] }

function classifyEvents(n: number): void {
  // Clusters of events between which the path stays on the probe.
  let clusters = 0
  for (let e = 0; e < eventCount; e++) {
    if (clusters > 0) {
      const c = clusters - 1
      const joined = staysOnProbe(clusterEndK[c], clusterEndT[c], startK(e), startT(e))
      if (joined) {
        clusterLength[c]++
        clusterEndK[c] = endK(e)
        clusterEndT[c] = endT(e)
        if (eventType[e] === OVERLAP) clusterRun[c] = 1
        continue
      }
    }
    const c = clusters++
    clusterFirst[c] = e
    clusterLength[c] = 1
    clusterRun[c] = eventType[e] === OVERLAP ? 1 : 0
    clusterStartK[c] = startK(e)
    clusterStartT[c] = startT(e)
    clusterEndK[c] = endK(e)
    clusterEndT[c] = endT(e)
  }
  if (closed && clusters >= 2) {
    const last = clusters - 1
    if (staysOnProbe(clusterEndK[last], clusterEndT[last], clusterStartK[0] + n, clusterStartT[0])) {
      clusterFirst[0] = clusterFirst[last]
      clusterLength[0] += clusterLength[last]
      clusterRun[0] = clusterRun[0] | clusterRun[last]
      clusterStartK[0] = clusterStartK[last] - n
      clusterStartT[0] = clusterStartT[last]
      clusters--
    }
  }
  // Sides of the stretches between clusters: stretch i lies before cluster i; for a closed
  // subpath stretch 0 wraps from the last cluster, for an open one stretch `clusters` ends it.
  const stretches = closed ? clusters : clusters + 1
  for (let i = 0; i < stretches; i++) {
    let ka: number, ta: number, kb: number, tb: number
    if (closed) {
      const previous = i === 0 ? clusters - 1 : i - 1
      ka = clusterEndK[previous]
      ta = clusterEndT[previous]
      kb = clusterStartK[i] + (i === 0 ? n : 0)
      tb = clusterStartT[i]
    } else {
      ka = i === 0 ? 0 : clusterEndK[i - 1]
      ta = i === 0 ? 0 : clusterEndT[i - 1]
      kb = i === clusters ? n : clusterStartK[i]
      tb = i === clusters ? 0 : clusterStartT[i]
    }
    if (kb < ka || (kb === ka && tb <= ta)) {
      portionStartSide[i] = NO_SIDE
      portionEndSide[i] = NO_SIDE
      continue
    }
    stretchSides(ka, ta, kb, tb)
    portionStartSide[i] = stretchStart
    portionEndSide[i] = stretchEnd
  }
  fillZeroSides(stretches)
  for (let c = 0; c < clusters; c++) {
    const before = portionEndSide[c]
    const after = closed ? portionStartSide[(c + 1) % stretches] : portionStartSide[c + 1]
    const winding = windingOf(closed && before === NO_SIDE ? 0 : before, closed && after === NO_SIDE ? 0 : after)
    if (clusterRun[c] === 1) emitRunCluster(c, winding)
    else emitPointCluster(c, winding)
  }
}

/**
 * Stretches that lie within the tolerance band (side 0) take the side of the stretch before
 * them (cyclically for closed subpaths), so that every meeting point sees real sides.
 */
function fillZeroSides(stretches: number): void {
  let anchor = -1
  for (let i = 0; i < stretches && anchor < 0; i++) {
    if (portionEndSide[i] !== 0 && portionEndSide[i] !== NO_SIDE) anchor = i
  }
  if (anchor < 0) return
  let side = portionEndSide[anchor]
  const last = closed ? anchor + stretches : stretches - 1
  for (let step = anchor + 1; step <= last; step++) {
    const i = step % stretches
    if (portionStartSide[i] === NO_SIDE) continue
    if (portionStartSide[i] === 0) portionStartSide[i] = side
    if (portionEndSide[i] === 0) portionEndSide[i] = portionStartSide[i]
    side = portionEndSide[i]
  }
  if (closed) return
  let following = portionStartSide[anchor] !== 0 ? portionStartSide[anchor] : portionEndSide[anchor]
  if (portionStartSide[anchor] === 0) portionStartSide[anchor] = following
  for (let i = anchor - 1; i >= 0; i--) {
    if (portionEndSide[i] === NO_SIDE) continue
    if (portionEndSide[i] === 0) portionEndSide[i] = following
    if (portionStartSide[i] === 0) portionStartSide[i] = portionEndSide[i]
    following = portionStartSide[i]
  }
}

/**
 * Runs one probe line against a prepared path; the hits are left in the module-level
 * records (unsorted) and their count is returned.
 */
export function collectHits(path: PreparedPath, probe: ProbeLine): number {
  data = path.data
  offsets = path.offsets
  order = path.order
  ox = probe.ox
  oy = probe.oy
  // The direction is scaled by a power of two into [1, 2) (exact), so that no product with
  // it overflows or underflows; s is scaled back on the way out.
  const directionScale = 2 ** -Math.floor(Math.log2(Math.max(Math.abs(probe.dx), Math.abs(probe.dy))))
  dx = probe.dx * directionScale
  dy = probe.dy * directionScale
  sMin = probe.sMin / directionScale
  sMax = probe.sMax / directionScale
  directionSquared = dx * dx + dy * dy
  const length = Math.sqrt(directionSquared)
  const scale = Math.max(path.scale, Math.abs(ox), Math.abs(oy), Number.MIN_VALUE)
  onTolerance = ON_PROBE_REL * length * scale
  sTolerance = (PROBE_END_REL * scale) / length
  hitCount = 0
  const subpaths = path.subpathStart.length
  for (let j = 0; j < subpaths; j++) probeSubpath(path, j)
  if (directionScale !== 1) {
    for (let i = 0; i < hitCount; i++) {
      hitS[i] *= directionScale
      hitSEnd[i] *= directionScale
    }
  }
  return hitCount
}

const KIND_NAMES: readonly HitKind[] = ['crossing', 'tangent', 'overlap']

/** The hits left by collectHits as contract objects, sorted by s (stable). */
export function readHits(count: number): Hit[] {
  const indices = Array.from({ length: count }, (_, i) => i)
  indices.sort((a, b) => hitS[a] - hitS[b] || a - b)
  return indices.map((i): Hit => {
    const base = {
      segment: hitSegment[i],
      t: hitT[i],
      s: hitS[i],
      point: [hitX[i], hitY[i]] as const,
      kind: KIND_NAMES[hitKind[i]],
      winding: hitWinding[i] as -1 | 0 | 1,
    }
    return hitKind[i] === KIND_OVERLAP ? { ...base, sEnd: hitSEnd[i], tEnd: hitTEnd[i] } : base
  })
}

/** Sum of windings and boundary flag of the hits left by collectHits, for containment. */
export function summariseHits(count: number, boundarySlack: number): { winding: number; onBoundary: boolean } {
  let winding = 0
  let onBoundary = false
  for (let i = 0; i < count; i++) {
    const low = hitS[i]
    const high = hitKind[i] === KIND_OVERLAP ? hitSEnd[i] : low
    if (low <= boundarySlack && high >= -boundarySlack) onBoundary = true
    else if (low > boundarySlack) winding += hitWinding[i]
  }
  return { winding, onBoundary }
}

/**
 * Hits of one probe on a path, sorted by s (see the contract of /intersect).
 */
export function intersectProbe(path: NormalisedPath, probe: Probe): Hit[] {
  return intersectProbes(path, [probe])[0]
}

/** Hits of each probe on a path; results[i] answers probes[i]. The path is packed once. */
export function intersectProbes(path: NormalisedPath, probes: readonly Probe[]): Hit[][] {
  const lines = probes.map(resolveProbe)
  const prepared = preparePath(path, false)
  return lines.map((line) => readHits(collectHits(prepared, line)))
}
