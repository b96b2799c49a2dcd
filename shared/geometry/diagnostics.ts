/**
 * Diagnostics of a normalised path: the degenerate and suspicious pieces a font or vector
 * engineer wants to hear about before probing a path (shown in the import preview and on the
 * canvas), each with a short message for people and indices, t and point for the canvas.
 *
 * Method. The path is scaled once by a power of two (exact) so that its largest |coordinate|
 * L lies in [1, 2): no difference, cross product or square can overflow or underflow, and
 * every tolerance below is relative either to L (the rounding a coordinate carries) or to
 * the size of the segment at hand (what a person can see). Cusps come from the closed-form
 * roots of each component of the derivative, loops from the closed-form pair of parameters
 * of a cubic's double point; nothing is sampled.
 */
import type { DroppedPiece, NormalisedPath } from './path-data'
import type { Segment } from './segments'
import { ARC_CODE, CUBIC_CODE, LINE_CODE, QUADRATIC_CODE, computeSegmentBounds, endIndexOf, evaluatePackedInto, getSegmentKind } from './segments'
import { solveQuadraticInto } from './solve-quadratic'
import { exponentOf, scaleByPowerOfTwo } from './internal/float'

/** What a diagnostic is about (see {@link diagnosePath} for the exact definitions). */
export type DiagnosticKind =
  | 'zero-length-segment'
  | 'degenerate-contour'
  | 'straight-curve'
  | 'cusp'
  | 'loop'
  | 'open-subpath'
  | 'coincident-points'

/**
 * One finding. `segment` and `subpath` index the normalised path's `segments` and
 * `subpaths` (null when the finding has no such index, e.g. a piece the parser dropped);
 * `t` is the parameter on `segment` and `point` the place in the path's own coordinates,
 * each null when the finding is not at one place. `message` is one short sentence for users.
 */
export interface Diagnostic {
  readonly kind: DiagnosticKind
  readonly segment: number | null
  readonly subpath: number | null
  readonly t: number | null
  readonly point: [number, number] | null
  readonly message: string
}

/**
 * Two points closer than COINCIDENT_REL · L are one point (L: the largest |coordinate| the
 * path reaches). Derivation: coordinates that went through transforms and relative-to-absolute
 * sums carry a few ε·L of rounding; 2^-40 ≈ 4096ε is far above that and still 1e-12 of the
 * drawing — the distance containsPoints uses for "on the boundary".
 */
export const COINCIDENT_REL = 2 ** -40

/**
 * A quadratic or cubic is straight when every control point lies within STRAIGHT_REL · D of
 * the line through its two farthest points (D their distance), or within the coincidence
 * distance. Derivation: the curve stays within that distance of the line (convex hull), and
 * 2^-20 ≈ 1e-6 of a glyph's 1000-unit stem is a thousandth of a unit, below a thousandth of
 * a pixel at any size text is shown, so no one drew it on purpose.
 */
export const STRAIGHT_REL = 2 ** -20

/**
 * A cusp is where the speed |dP/dt| inside a segment falls to CUSP_REL · (its longest
 * control leg) × the degree, or to the coincidence distance. Derivation: at relative speed ε
 * the curve's turn is confined to a tip of radius ≈ ε² · size (radius = speed² / |P''|), so at
 * 2^-10 the tip is under 2^-20 of the curve — it shows as a point at any zoom in use. Below the
 * coincidence distance the speed is rounding and the cusp counts as exact.
 */
export const CUSP_REL = 2 ** -10

/**
 * Double-point parameters up to LOOP_T_SLACK outside [0, 1] are clamped in. Derivation: the
 * closed-form pair is within a few hundred ε of its exact value when the loop is well
 * conditioned; 2^-40 covers that and is far below any meaningful t.
 */
export const LOOP_T_SLACK = 2 ** -40

/** Working state of one call: the path's scaling and the coincidence distance in working units. */
interface Frame {
  /** Working coordinates are path coordinates times 2^-exponent. */
  readonly exponent: number
  /** COINCIDENT_REL · L in working units. */
  readonly near: number
}

const SEGMENT_NAMES: Readonly<Record<number, string>> = {
  [LINE_CODE]: 'line', [QUADRATIC_CODE]: 'quadratic curve', [CUBIC_CODE]: 'cubic curve', [ARC_CODE]: 'arc',
}
const COMMAND_NAMES: Readonly<Record<string, string>> = {
  L: 'line', H: 'horizontal line', V: 'vertical line', Q: 'quadratic curve', C: 'cubic curve', A: 'arc',
}

/** A number for a message: integers as they are, others to 6 significant digits. */
function formatNumber(value: number): string {
  return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)))
}

function formatPoint(point: readonly [number, number]): string {
  return `(${formatNumber(point[0])}, ${formatNumber(point[1])})`
}

function formatT(t: number): string {
  return String(Number(t.toPrecision(4)))
}

/** Throws RangeError unless `path` has the shape of a NormalisedPath with finite numbers. */
function checkPath(path: NormalisedPath): void {
  if (typeof path !== 'object' || path === null || !Array.isArray(path.segments) || !Array.isArray(path.subpaths)) {
    throw new RangeError('diagnosePath expects a normalised path { segments, subpaths }')
  }
  for (const segment of path.segments) {
    getSegmentKind(segment)
    for (const value of segment) {
      if (!Number.isFinite(value)) throw new RangeError(`diagnosePath expects finite segment values, got ${String(value)}`)
    }
  }
  let next = 0
  for (const subpath of path.subpaths) {
    const { start, count } = subpath
    if (!Number.isInteger(start) || !Number.isInteger(count) || start < next || count < 0 || start + count > path.segments.length) {
      throw new RangeError('diagnosePath expects subpaths as ascending, disjoint ranges of segments')
    }
    next = start + count
  }
  if (path.dropped === undefined) return
  if (!Array.isArray(path.dropped)) throw new RangeError('diagnosePath expects dropped to be a list when present')
  for (const piece of path.dropped) {
    if (!Array.isArray(piece.point) || !Number.isFinite(piece.point[0]) || !Number.isFinite(piece.point[1])) {
      throw new RangeError('diagnosePath expects every dropped piece to have a finite point')
    }
  }
}

/**
 * The largest |coordinate| the path reaches: control points, and arcs by their bounds (by
 * their end points should the bounds of an arc near the double range overflow).
 */
function measureMagnitude(path: NormalisedPath): number {
  let largest = 0
  for (const segment of path.segments) {
    const values: ArrayLike<number> = segment.length === ARC_CODE ? computeSegmentBounds(segment) : segment
    for (let k = 0; k < values.length; k++) {
      if (Number.isFinite(values[k])) largest = Math.max(largest, Math.abs(values[k]))
    }
    if (segment.length === ARC_CODE) largest = Math.max(largest, ...segment.slice(0, 4).map(Math.abs))
  }
  for (const piece of path.dropped ?? []) largest = Math.max(largest, Math.abs(piece.point[0]), Math.abs(piece.point[1]))
  return largest
}

/** The segment's points (arcs: its end points) in working units, x and y interleaved. */
function scaleToWorking(segment: Segment, frame: Frame): number[] {
  const count = segment.length === ARC_CODE ? 4 : segment.length
  const values: number[] = []
  for (let k = 0; k < count; k++) values.push(scaleByPowerOfTwo(segment[k], -frame.exponent))
  return values
}

/** A working-unit point back in path coordinates. */
function scaleToPath(x: number, y: number, frame: Frame): [number, number] {
  return [scaleByPowerOfTwo(x, frame.exponent) + 0, scaleByPowerOfTwo(y, frame.exponent) + 0]
}

/** Largest distance between two of the points (x, y interleaved), with the pair's indices. */
function measureDiameter(points: readonly number[]): { size: number; first: number; second: number } {
  let size = 0, first = 0, second = 0
  for (let i = 0; i < points.length; i += 2) {
    for (let j = i + 2; j < points.length; j += 2) {
      const distance = Math.hypot(points[j] - points[i], points[j + 1] - points[i + 1])
      if (distance > size) { size = distance; first = i; second = j }
    }
  }
  return { size, first, second }
}

const pointScratch = new Float64Array(2)

/** P(t) of a quadratic or cubic given by working points (x, y interleaved), by the core's evaluation. */
function evaluateWorking(points: readonly number[], t: number): [number, number] {
  evaluatePackedInto(points, 0, points.length, t, pointScratch)
  return [pointScratch[0], pointScratch[1]]
}

/** Whether every point lies within STRAIGHT_REL of the diameter (or the coincidence distance) of the line through the farthest pair. */
function isStraight(points: readonly number[], frame: Frame): boolean {
  const { size, first, second } = measureDiameter(points)
  const dx = points[second] - points[first], dy = points[second + 1] - points[first + 1]
  const allowed = Math.max(STRAIGHT_REL * size, frame.near)
  for (let k = 0; k < points.length; k += 2) {
    const offset = Math.abs(dx * (points[k + 1] - points[first + 1]) - dy * (points[k] - points[first])) / size
    if (offset > allowed) return false
  }
  return true
}

/**
 * The speed vector v(t) = a·t² + b·t + c of a quadratic (P'/2) or cubic (P'/3) from its legs
 * d_k = P_{k+1} − P_k: coefficients [ax, ay, bx, by, cx, cy] and the longest leg.
 */
function measureSpeed(points: readonly number[]): { coefficients: number[]; longestLeg: number } {
  const legs: number[] = []
  let longestLeg = 0
  for (let k = 0; k + 2 < points.length; k += 2) {
    const lx = points[k + 2] - points[k], ly = points[k + 3] - points[k + 1]
    legs.push(lx, ly)
    longestLeg = Math.max(longestLeg, Math.hypot(lx, ly))
  }
  const coefficients = legs.length === 4
    ? [0, 0, legs[2] - legs[0], legs[3] - legs[1], legs[0], legs[1]]
    : [legs[0] - 2 * legs[2] + legs[4], legs[1] - 2 * legs[3] + legs[5], 2 * (legs[2] - legs[0]), 2 * (legs[3] - legs[1]), legs[0], legs[1]]
  return { coefficients, longestLeg }
}

function measureSpeedAt(coefficients: readonly number[], t: number): number {
  return Math.hypot((coefficients[0] * t + coefficients[2]) * t + coefficients[4], (coefficients[1] * t + coefficients[3]) * t + coefficients[5])
}

const rootScratch = new Float64Array(2)

/**
 * Cusps inside a quadratic or cubic: the roots in (0, 1) of each component of v(t) where the
 * whole of v is within the cusp tolerance, away from the end points, one per cluster (a
 * straight curve that doubles back may have two). Each with t and whether it is exact (speed
 * within the coincidence distance).
 */
function findCusps(points: readonly number[], frame: Frame): { t: number; exact: boolean }[] {
  const { coefficients, longestLeg } = measureSpeed(points)
  const allowed = Math.max(CUSP_REL * longestLeg, frame.near)
  const end = points.length - 2
  const candidates: { t: number; speed: number }[] = []
  for (let axis = 0; axis < 2; axis++) {
    const a = coefficients[axis], b = coefficients[2 + axis], c = coefficients[4 + axis]
    if (a === 0 && b === 0 && c === 0) continue
    const count = solveQuadraticInto(a, b, c, rootScratch)
    for (let i = 0; i < count; i++) {
      const t = rootScratch[i]
      if (!(t > 0 && t < 1)) continue
      const speed = measureSpeedAt(coefficients, t)
      if (speed > allowed) continue
      const [x, y] = evaluateWorking(points, t)
      if (Math.hypot(x - points[0], y - points[1]) <= frame.near || Math.hypot(x - points[end], y - points[end + 1]) <= frame.near) continue
      candidates.push({ t, speed })
    }
  }
  candidates.sort((p, q) => p.t - q.t)
  const cusps: { t: number; speed: number }[] = []
  for (const candidate of candidates) {
    const last = cusps[cusps.length - 1]
    if (last !== undefined && measureSpeedAt(coefficients, (last.t + candidate.t) / 2) <= allowed) {
      if (candidate.speed < last.speed) cusps[cusps.length - 1] = candidate
    } else {
      cusps.push(candidate)
    }
  }
  return cusps.map(({ t, speed }) => ({ t, exact: speed <= frame.near }))
}

function crossProduct(ax: number, ay: number, bx: number, by: number): number {
  return ax * by - ay * bx
}

/**
 * The double point of a cubic: t1 < t2 in [0, 1] with P(t1) = P(t2), or null. With the power
 * form P(t) = A·t³ + B·t² + C·t + P0, dividing P(t1) − P(t2) by t1 − t2 leaves
 * A·(σ² − π) + B·σ + C = 0 for σ = t1 + t2, π = t1·t2; crossing with A and with B gives
 * σ = −(A×C)/(A×B) and σ² − π = (B×C)/(A×B), and t1, t2 are the roots of τ² − σ·τ + π.
 * A×B = 0 (a parabola-like or straight cubic) has no double point; straight cubics are not
 * asked (their "crossings" would be rounding). The pair (0, 1) — the two ends meeting — is no
 * loop. Checked against a fine polyline in the tests; on 200,000 seeded near-degenerate cubics
 * (elevated quadratics, near-straight, near-cusp) no pair missed P(t1) = P(t2) by 2^-20 of its
 * loop's size, so no further acceptance test is made.
 */
function findLoop(points: readonly number[], frame: Frame): readonly [number, number] | null {
  const [x0, y0, x1, y1, x2, y2, x3, y3] = points
  const cx = 3 * (x1 - x0), cy = 3 * (y1 - y0)
  const bx = 3 * (x2 - 2 * x1 + x0), by = 3 * (y2 - 2 * y1 + y0)
  const ax = x3 - 3 * x2 + 3 * x1 - x0, ay = y3 - 3 * y2 + 3 * y1 - y0
  const k = crossProduct(ax, ay, bx, by)
  if (k === 0) return null
  const sum = -crossProduct(ax, ay, cx, cy) / k
  const product = sum * sum - crossProduct(bx, by, cx, cy) / k
  if (!Number.isFinite(sum) || !Number.isFinite(product)) return null
  if (solveQuadraticInto(1, -sum, product, rootScratch) !== 2) return null
  const first = rootScratch[0], second = rootScratch[1]
  if (first < -LOOP_T_SLACK || second > 1 + LOOP_T_SLACK) return null
  if (first <= LOOP_T_SLACK && second >= 1 - LOOP_T_SLACK) return null
  const t1 = Math.max(first, 0), t2 = Math.min(second, 1)
  // At a cusp, rounding may split the double root into a pair enclosing a loop of rounding size: no loop.
  const [px, py] = evaluateWorking(points, t1)
  const [mx, my] = evaluateWorking(points, (t1 + t2) / 2)
  if (Math.hypot(mx - px, my - py) <= frame.near) return null
  return [t1, t2]
}

function makeDiagnostic(
  kind: DiagnosticKind, segment: number | null, subpath: number | null,
  t: number | null, point: [number, number] | null, message: string,
): Diagnostic {
  return { kind, segment, subpath, t, point, message }
}

/** The diagnostic of a piece the parser dropped. */
function describeDropped(piece: DroppedPiece): Diagnostic {
  const point: [number, number] = [piece.point[0] + 0, piece.point[1] + 0]
  if (piece.kind === 'contour') {
    return makeDiagnostic('degenerate-contour', null, null, null, point,
      `Contour at ${formatPoint(point)} has all its points in one place; it draws nothing and was left out.`)
  }
  return makeDiagnostic('zero-length-segment', null, piece.subpath, null, point,
    `Zero-length ${COMMAND_NAMES[piece.command] ?? 'segment'} at ${formatPoint(point)}: its points coincide, so it was left out.`)
}

/** Largest distance from (x, y), in working units, of the segment's points (arcs: the corners of its bounds). */
function measureReach(segment: Segment, x: number, y: number, frame: Frame): number {
  let values: ArrayLike<number> = segment
  if (segment.length === ARC_CODE) {
    const [minX, minY, maxX, maxY] = computeSegmentBounds(segment)
    values = [minX, minY, maxX, minY, minX, maxY, maxX, maxY]
  }
  let reach = 0
  for (let k = 0; k < values.length; k += 2) {
    const px = scaleByPowerOfTwo(values[k], -frame.exponent), py = scaleByPowerOfTwo(values[k + 1], -frame.exponent)
    reach = Math.max(reach, Math.hypot(px - x, py - y))
  }
  return reach
}

/** Diagnostics of one kept segment of a subpath that is not degenerate as a whole. */
function diagnoseSegment(segment: Segment, index: number, subpath: number | null, frame: Frame, out: Diagnostic[]): void {
  const code = segment.length
  const name = SEGMENT_NAMES[code]
  const points = scaleToWorking(segment, frame)
  const start = scaleToPath(points[0], points[1], frame)
  const extent = code === ARC_CODE ? measureReach(segment, points[0], points[1], frame) : measureDiameter(points).size
  if (extent <= frame.near) {
    out.push(makeDiagnostic('zero-length-segment', index, subpath, null, start,
      `The ${name} at ${formatPoint(start)} has practically zero length: its points lie within rounding distance of each other.`))
    return
  }
  if (code === LINE_CODE || code === ARC_CODE) return
  const last = points.length - 2
  for (let k = 0; k < last; k += 2) {
    if (Math.hypot(points[k + 2] - points[k], points[k + 3] - points[k + 1]) > frame.near) continue
    const atStart = k === 0, atEnd = k + 2 === last
    const at = atEnd ? last : k
    const point = scaleToPath(points[at], points[at + 1], frame)
    const which = atStart ? 'its start point' : atEnd ? 'its end point' : 'the other control point'
    out.push(makeDiagnostic('coincident-points', index, subpath, atStart ? 0 : atEnd ? 1 : null, point,
      `A control point of the ${name} coincides with ${which} at ${formatPoint(point)}${atStart || atEnd ? '; the tangent there is undefined' : ''}.`))
  }
  const straight = isStraight(points, frame)
  if (straight) {
    const end = scaleToPath(points[last], points[last + 1], frame)
    out.push(makeDiagnostic('straight-curve', index, subpath, null, null,
      `The ${name} from ${formatPoint(start)} to ${formatPoint(end)} is straight: its control points lie on one line.`))
  }
  for (const { t, exact } of findCusps(points, frame)) {
    const [x, y] = evaluateWorking(points, t)
    const point = scaleToPath(x, y, frame)
    out.push(makeDiagnostic('cusp', index, subpath, t, point, exact
      ? `Cusp at ${formatPoint(point)} (t = ${formatT(t)}): the ${name} stops and turns back.`
      : `Near-cusp at ${formatPoint(point)} (t = ${formatT(t)}): the ${name} almost stops and turns sharply.`))
  }
  if (code === CUBIC_CODE && !straight) {
    const loop = findLoop(points, frame)
    if (loop !== null) {
      const [x, y] = evaluateWorking(points, loop[0])
      const point = scaleToPath(x, y, frame)
      out.push(makeDiagnostic('loop', index, subpath, loop[0], point,
        `Loop: the cubic curve crosses itself at ${formatPoint(point)} (t = ${formatT(loop[0])} and ${formatT(loop[1])}).`))
    }
  }
}

/**
 * Diagnostics of one kept subpath, pushed onto `out`: one degenerate-contour when all its
 * points lie within the coincidence distance of its start, else its segments' and open-subpath.
 * Returns whether it was degenerate.
 */
function diagnoseSubpath(path: NormalisedPath, subpath: number, frame: Frame, out: Diagnostic[]): boolean {
  const { start, count, closed } = path.subpaths[subpath]
  const first = path.segments[start]
  const x0 = scaleByPowerOfTwo(first[0], -frame.exponent), y0 = scaleByPowerOfTwo(first[1], -frame.exponent)
  let reach = 0
  for (let i = start; i < start + count; i++) reach = Math.max(reach, measureReach(path.segments[i], x0, y0, frame))
  if (reach <= frame.near) {
    const point = scaleToPath(x0, y0, frame)
    out.push(makeDiagnostic('degenerate-contour', null, subpath, null, point,
      `Contour at ${formatPoint(point)} has all its points in one place (within rounding distance); it draws nothing.`))
    return true
  }
  for (let i = start; i < start + count; i++) diagnoseSegment(path.segments[i], i, subpath, frame, out)
  const last = path.segments[start + count - 1]
  const end = endIndexOf(last.length)
  const x1 = scaleByPowerOfTwo(last[end], -frame.exponent), y1 = scaleByPowerOfTwo(last[end + 1], -frame.exponent)
  if (!closed && Math.hypot(x1 - x0, y1 - y0) > frame.near) {
    const point = scaleToPath(x1, y1, frame)
    out.push(makeDiagnostic('open-subpath', start + count - 1, subpath, 1, point,
      `Open subpath: it ends at ${formatPoint(point)}, away from its start ${formatPoint(scaleToPath(x0, y0, frame))}; a fill closes it with a straight line.`))
  }
  return false
}

/**
 * Diagnostics of a normalised path in path order: by the segment they concern, a dropped
 * piece where it sat (before the segment that followed it), a subpath's open-subpath right
 * after its last segment's. See the export's JSDoc in index.ts for the kinds.
 * Throws RangeError only for a malformed argument.
 */
export function diagnosePath(path: NormalisedPath): Diagnostic[] {
  checkPath(path)
  const magnitude = measureMagnitude(path)
  const exponent = magnitude > 0 && Number.isFinite(magnitude) ? exponentOf(magnitude) : 0
  const frame: Frame = { exponent, near: COINCIDENT_REL * scaleByPowerOfTwo(magnitude, -exponent) }
  // Sort keys: 2i + 1 for what concerns segment i, 2s for a piece dropped before segment s.
  const keyed: { key: number; diagnostic: Diagnostic }[] = []
  const degenerateSubpaths = new Set<number>()
  let segment = 0
  // Segments outside every subpath (only in hand-made paths) are diagnosed alone.
  const diagnoseLoose = (until: number): void => {
    for (; segment < until; segment++) {
      const found: Diagnostic[] = []
      diagnoseSegment(path.segments[segment], segment, null, frame, found)
      for (const diagnostic of found) keyed.push({ key: 2 * segment + 1, diagnostic })
    }
  }
  path.subpaths.forEach((subpath, index) => {
    diagnoseLoose(subpath.start)
    if (subpath.count === 0) return
    const found: Diagnostic[] = []
    if (diagnoseSubpath(path, index, frame, found)) degenerateSubpaths.add(index)
    for (const diagnostic of found) keyed.push({ key: 2 * (diagnostic.segment ?? subpath.start) + 1, diagnostic })
    segment = subpath.start + subpath.count
  })
  diagnoseLoose(path.segments.length)
  for (const piece of path.dropped ?? []) {
    if (piece.kind === 'segment' && degenerateSubpaths.has(piece.subpath)) continue
    keyed.push({ key: 2 * piece.segmentsBefore, diagnostic: describeDropped(piece) })
  }
  // Array.prototype.sort is stable: equal keys keep the order they were found in.
  return keyed.sort((p, q) => p.key - q.key).map(({ diagnostic }) => diagnostic)
}
