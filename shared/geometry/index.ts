/**
 * The public entry of Rootcast's geometry core: pure functions on plain data, no DOM,
 * Node, Vue or Express. Conventions (stated once in types.ts): coordinates are the path's
 * own, y down; `t` is the parameter on a segment, `s` on a probe; the winding sign of a hit
 * is sign(direction × tangent).
 */

/** A real root with its multiplicity, and the cubic solver's answer (degree, identicallyZero, discriminant, roots). */
export type { CubicSolution, Root } from './types'
/**
 * Segment tuples, kind by length: line [x0,y0,x1,y1], quadratic (6), cubic (8), and the exact
 * arc [x0,y0,x1,y1,cx,cy,rx,ry,cosRotation,sinRotation,startAngle,sweepAngle] (12); Point, Bounds.
 */
export type { Segment, SegmentKind, LineSegment, QuadraticSegment, CubicSegment, ArcSegment, Point, Bounds } from './segments'
/**
 * A normalised path (segments and subpaths with their closed flags, and the zero-length pieces
 * the parser dropped, `dropped`, present only when there were any) and the parser's result
 * and error (code invalid_path).
 */
export type { NormalisedPath, Subpath, DroppedPiece, PathDataResult, PathDataError } from './path-data'
/**
 * One diagnostic of a path (kind, segment, subpath, t, point, message; indices into the
 * normalised path, null where they do not apply) and the seven kinds, as diagnosePath defines them.
 */
export type { Diagnostic, DiagnosticKind } from './diagnostics'
/** A probe as the API receives it (ray, line, segment) and a hit as the contract defines it. */
export type { Probe, Hit, HitKind } from './intersect-probe'
/** Fill rule ('nonzero' | 'evenodd') and one point's containment (inside, winding, onBoundary). */
export type { FillRule, Containment } from './winding'
/** Sweep requests (by angle, spacing and count, or explicit rows) and their per-row answers. */
export type { AngleSweep, RowSweep, SweepRow, RowSpan } from './sweep'
/** A stored sweep (angle in degrees, spacing, count, origin) and one of its lines (origin, unit direction). */
export type { LineSweep, SweepLine } from './sweep-lines'
/** The one interface of the closed-form and numeric ray–cubic engines. */
export type { IntersectionEngine, EngineName } from './engines/types'
/** Result of converting an SVG arc command: an exact arc, a line (zero radius) or omitted (equal end points). */
export type { ArcConversion } from './arc'

/**
 * Real roots of a·t³ + b·t² + c·t + d = 0 in closed form (Cardano / Viète), shaped as
 * POST /api/v1/solve/cubic answers: degree, identicallyZero, discriminant, distinct roots
 * ascending with multiplicity. Throws RangeError for a non-finite coefficient.
 * Accuracy: each simple root within a few ULPs times its condition number (tested).
 * @example solveCubic(1, 0, 6, -20).roots // [{ t: 2, multiplicity: 1 }] (Cardano, Ars Magna, 1545)
 */
export { solveCubic } from './solve-cubic'

/**
 * Allocation-free cubic solver for hot loops: distinct real roots ascending into out
 * (length ≥ 3), returns the count; 0 also when all coefficients are 0 (check them yourself).
 * @example const out = new Float64Array(3); solveCubicInto(1, -6, 11, -6, out) // 3, out = [1, 2, 3]
 */
export { solveCubicInto } from './solve-cubic'

/**
 * Real roots of a·t² + b·t + c = 0 by the stable closed form, in the shape of solveCubic's answer.
 * @example solveQuadratic(1, -2, 1).roots // [{ t: 1, multiplicity: 2 }]
 */
export { solveQuadratic } from './solve-quadratic'

/**
 * Parses SVG path data (M L H V C S Q T A Z, absolute and relative; grammar by svgpath)
 * into normalised segments and subpaths. Z closes with a line when the end is away from the
 * start; zero-length pieces are dropped and listed in `path.dropped`; arcs stay exact (SVG 1.1 appendix F.6).
 * Malformed or truncated data → `{ ok: false, error: { code: 'invalid_path', message } }`.
 * @example parsePathData('M0 0 H10 V10 Z') // ok: 3 lines, one closed subpath
 */
export { parsePathData } from './path-data'

/**
 * Diagnostics of a normalised path, in path order, as stored with every revision and shown in
 * the import preview and on the canvas. The kinds:
 * - `zero-length-segment`: a drawing command whose points all coincide (the parser dropped it:
 *   segment null, point where it sat; consecutive on-curve points that coincide are this), or
 *   a kept segment whose points all lie within the coincidence distance.
 * - `degenerate-contour`: a subpath with drawing commands whose points all lie in one place
 *   (dropped by the parser: subpath null; or kept, within the coincidence distance); reported
 *   once, instead of per segment.
 * - `coincident-points`: in a quadratic or cubic with extent, two consecutive points of its
 *   control polygon coincide — a control point on its own start (t 0) or end (t 1), where the
 *   tangent is undefined, or a cubic's two control points (t null). A segment's end equal to
 *   the next one's start is normal and never reported.
 * - `straight-curve`: a quadratic or cubic whose control points lie on one line within
 *   2^-20 of its size (STRAIGHT_REL): a line drawn as a curve.
 * - `cusp`: the speed |P'(t)| vanishes at 0 < t < 1, found in closed form as the roots of one
 *   component of P' where the other vanishes too; "near-cusp" in the message when the speed is
 *   only below 2^-10 of the control legs (CUSP_REL). A straight curve that doubles back has one
 *   per turn; a control point on an end point is coincident-points, not a cusp.
 * - `loop`: a cubic that crosses itself, P(t1) = P(t2) with 0 ≤ t1 < t2 ≤ 1 in closed form
 *   (t = t1 and point the crossing; t2 in the message); ends that merely meet are no loop.
 * - `open-subpath`: a subpath not closed by Z whose end (point, t 1 of its last segment) is
 *   away from its start; one ending on its start is not reported.
 * Conventions: path coordinates; two points are one within COINCIDENT_REL·L = 2^-40·L (L the
 * largest |coordinate| the path reaches); every tolerance is relative, so scaling the path by
 * a power of two scales the points and changes nothing else (tested). Accuracy: t of a cusp or
 * loop is the closed-form root, within 2^-33 on the hand-worked fixtures and on exactly
 * constructed cusps (tested; loops also against a 256-piece polyline). Degenerate input never
 * throws (an empty path gives []); a malformed argument (not a path, segment tuples of the
 * wrong length, non-finite values, overlapping subpaths) throws RangeError.
 * @example
 * const parsed = parsePathData('M0 0 L10 0 L10 0 C20 0 20 10 10 10')
 * if (parsed.ok) diagnosePath(parsed.path).map((d) => d.kind) // ['zero-length-segment', 'open-subpath']
 */
export { diagnosePath } from './diagnostics'

/**
 * Hits of one probe (ray s ≥ 0, line, segment 0 ≤ s ≤ 1) on a path, sorted by s, exactly as
 * POST /api/v1/intersect defines them: a join is one hit; a touch is `tangent` with winding 0;
 * a piece along the probe is one `overlap` (s..sEnd, t..tEnd, s ≤ sEnd) carrying the passage.
 * "On the probe" means within 2^-46·|direction|·L of its line (L: largest |coordinate|).
 * Throws RangeError for a zero direction or non-finite probe numbers.
 * @example intersectProbe(path, { type: 'ray', origin: [-1, 5], direction: [1, 0] })
 */
export { intersectProbe } from './intersect-probe'

/**
 * Hits of many probes on one path (the path is packed once); results[i] answers probes[i].
 * The hot loop allocates only the returned hit objects.
 * @example intersectProbes(path, [{ type: 'line', origin: [0, 5], direction: [1, 0] }])[0]
 */
export { intersectProbes } from './intersect-probe'

/**
 * Winding number of a path around a point (every subpath closed, as SVG fills), the sum of
 * hit windings along the ray from the point in +x.
 * @example windingNumber(squarePath, [5, 5]) // ±1 by the square's orientation
 */
export { windingNumber } from './winding'

/**
 * Containment of points for the nonzero or evenodd fill rule, as POST /api/v1/contains
 * answers: inside, winding and onBoundary (the point lies on the path within 2^-40·L).
 * @example containsPoints(path, [[5, 5]], 'evenodd')[0].inside
 */
export { containsPoints } from './winding'

/**
 * A family of parallel line probes (by angle, spacing and count, or explicit rows y = c),
 * per row the hits, the spans between them with their winding numbers and the filled spans.
 * @example sweepPath(path, { rows: [2.5, 7.5] })[0].filled // [[x0, x1], …]
 */
export { sweepPath } from './sweep'

/**
 * Unit direction (cos, sin) of an angle in degrees from +x towards +y (clockwise on screen).
 * Multiples of 90° are exact 0 and ±1, odd multiples of 45° have |x| = |y| exactly; angles
 * are reduced to [0°, 360°) first, so whole turns change nothing (tested). RangeError for a
 * non-finite angle.
 * @example directionOfAngle(90) // [0, 1]
 */
export { directionOfAngle } from './sweep-lines'

/**
 * The lines of a stored sweep, as probe sets, checks and the canvas keep them: line i
 * (0 ≤ i < count) passes through origin + i·spacing·(−sin, cos) and runs along (cos, sin) of
 * the angle in degrees. Client and server build identical lines. Count 0 gives none;
 * RangeError for a fractional or negative count or non-finite numbers.
 * @example sweepLines({ angle: 0, spacing: 2, count: 2, origin: [1, 5] }) // lines through (1, 5) and (1, 7) along +x
 */
export { sweepLines } from './sweep-lines'

/**
 * Point P(t) of a segment; t = 0 and t = 1 return the stored end points exactly.
 * @example evaluateSegment([0, 0, 10, 0], 0.5) // [5, 0]
 */
export { evaluateSegment } from './segments'

/**
 * Derivative dP/dt of a segment at t (the tangent whose sign gives the winding).
 * @example evaluateSegmentDerivative([0, 0, 10, 0], 0.3) // [10, 0]
 */
export { evaluateSegmentDerivative } from './segments'

/**
 * Tight axis-aligned bounds [minX, minY, maxX, maxY] of a segment, interior extrema included.
 * @example computeSegmentBounds([0, 0, 1, 2, 3, 2, 4, 0]) // [0, 0, 4, 1.5]
 */
export { computeSegmentBounds } from './segments'

/**
 * Splits a segment at 0 < t < 1 into two of the same kind (de Casteljau; arcs by angle).
 * @example splitSegment([0, 0, 10, 0], 0.5) // [[0, 0, 5, 0], [5, 0, 10, 0]]
 */
export { splitSegment } from './segments'

/**
 * Kind of a segment tuple from its length: 4 line, 6 quadratic, 8 cubic, 12 arc.
 * @example getSegmentKind([0, 0, 1, 1]) // 'line'
 */
export { getSegmentKind } from './segments'

/**
 * SVG arc command → centre parametrisation (SVG 1.1 appendix F.6.5, radii corrected per
 * F.6.6, out-of-range rules of F.6.2): an exact arc segment, a line, or omitted.
 * @example convertArcToCentre(0, 0, 1, 1, 0, false, true, 2, 0) // arc centred at (1, 0), sweep +π
 */
export { convertArcToCentre } from './arc'

/**
 * Closed-form engine: implicit line substituted into the cubic, closed-form solver; allocation-free.
 * @example closedFormEngine.intersectCubic(cubic, 0, ox, oy, dx, dy, 0, Infinity, out)
 */
export { closedFormEngine } from './engines/closed-form'

/**
 * Numeric engine: recursive subdivision to a flatness tolerance (default 2^-24 of the curve size), chord crossing.
 * @example subdivisionEngine.intersectCubic(cubic, 0, ox, oy, dx, dy, -Infinity, Infinity, out)
 */
export { subdivisionEngine } from './engines/subdivision'

/**
 * Numeric engine: sign changes at 16 samples refined by safeguarded Newton iteration.
 * @example newtonEngine.intersectCubic(cubic, 0, ox, oy, dx, dy, 0, 1, out)
 */
export { newtonEngine } from './engines/newton'

/**
 * Adapter engine for bezier-js's `Bezier.prototype.lineIntersects`.
 * @example bezierJsEngine.intersectCubic(cubic, 0, ox, oy, dx, dy, 0, Infinity, out)
 */
export { bezierJsEngine } from './engines/bezier-js'

/**
 * Adapter engine for mathjs `polynomialRoot` (real roots of the power-basis cubic).
 * @example mathjsEngine.intersectCubic(cubic, 0, ox, oy, dx, dy, 0, Infinity, out)
 */
export { mathjsEngine } from './engines/mathjs'
