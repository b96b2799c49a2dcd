/**
 * SVG elliptical arcs: endpoint → centre parametrisation and line–ellipse intersection.
 *
 * Conversion follows SVG 1.1 (Second Edition), Appendix F.6 "Elliptical arc implementation
 * notes": F.6.2 (out-of-range parameters: zero radius → straight line, identical end
 * points → omitted, negative radii → absolute values), F.6.5 (conversion from endpoint to
 * centre parametrisation, steps 1–4) and F.6.6 (correction of out-of-range radii: when
 * Λ = x1′²/rx² + y1′²/ry² > 1 both radii are scaled by √Λ).
 * Arcs stay exact arcs: hits are computed on the ellipse itself, never on cubic
 * approximations.
 */
import type { ArcSegment, LineSegment } from './segments'
import { arcParameterOfAngle } from './segments'
import { solveQuadraticInto } from './solve-quadratic'

/** Result of converting one SVG arc command. */
export type ArcConversion =
  /** A true elliptical arc with its centre parametrisation; radiusScale is √Λ when F.6.6 enlarged the radii, else 1. */
  | { readonly kind: 'arc'; readonly segment: ArcSegment; readonly radiusScale: number }
  /** F.6.2: a zero radius makes the arc a straight line between its end points. */
  | { readonly kind: 'line'; readonly segment: LineSegment }
  /** F.6.2: identical end points: the arc is omitted entirely. */
  | { readonly kind: 'omitted' }

/** A sweep within 4 ulps of π (the rounding of atan2 at a half turn) after F.6.6 is exactly ±π. */
const HALF_TURN_SNAP = 4 * Number.EPSILON * Math.PI

/**
 * cos and sin of an angle in degrees, exact for multiples of 90° (so an axis-aligned
 * ellipse keeps exact zeros in its rotation).
 */
export function cosSinDegrees(degrees: number): readonly [number, number] {
  const reduced = degrees - 360 * Math.floor(degrees / 360)
  if (reduced === 0) return [1, 0]
  if (reduced === 90) return [0, 1]
  if (reduced === 180) return [-1, 0]
  if (reduced === 270) return [0, -1]
  const radians = (reduced * Math.PI) / 180
  return [Math.cos(radians), Math.sin(radians)]
}

/**
 * Converts an SVG arc command (from the current point (x1, y1) to (x2, y2)) into the centre
 * parametrisation of SVG 1.1 appendix F.6.5, with the radius correction of F.6.6 and the
 * out-of-range rules of F.6.2. Never throws; non-finite results (radii so large that the
 * centre overflows) degrade to the chord as a line.
 */
export function convertArcToCentre(
  x1: number, y1: number,
  rx: number, ry: number, rotationDegrees: number,
  largeArc: boolean, sweep: boolean,
  x2: number, y2: number,
): ArcConversion {
  if (x1 === x2 && y1 === y2) return { kind: 'omitted' }
  let radiusX = Math.abs(rx)
  let radiusY = Math.abs(ry)
  if (radiusX === 0 || radiusY === 0) return { kind: 'line', segment: [x1, y1, x2, y2] }
  const [cos, sin] = cosSinDegrees(rotationDegrees)
  // F.6.5 step 1: (x1', y1') is the half chord in the ellipse's rotated frame.
  const hx = (x1 - x2) / 2, hy = (y1 - y2) / 2
  const px = cos * hx + sin * hy
  const py = -sin * hx + cos * hy
  // F.6.6: Λ from the unit-circle coordinates (x1'/rx, y1'/ry), which cannot overflow.
  const ux = px / radiusX, uy = py / radiusY
  const lambda = ux * ux + uy * uy
  let radiusScale = 1
  if (lambda > 1) {
    radiusScale = Math.sqrt(lambda)
    radiusX *= radiusScale
    radiusY *= radiusScale
  }
  // F.6.5 step 2: the radicand (rx²ry² − rx²y1'² − ry²x1'²)/(rx²y1'² + ry²x1'²) equals
  // (1 − Λ)/Λ; it is exactly 0 once the radii were scaled.
  const radicand = lambda >= 1 ? 0 : (1 - lambda) / lambda
  const coefficient = (largeArc !== sweep ? 1 : -1) * Math.sqrt(radicand)
  const cxPrime = (coefficient * radiusX * py) / radiusY
  const cyPrime = (-coefficient * radiusY * px) / radiusX
  // Step 3: back to user space.
  const cx = cos * cxPrime - sin * cyPrime + (x1 + x2) / 2
  const cy = sin * cxPrime + cos * cyPrime + (y1 + y2) / 2
  // Step 4: θ1 = angle((1, 0), u) and Δθ = angle(u, v), reduced by the sweep flag.
  const vx1 = (px - cxPrime) / radiusX, vy1 = (py - cyPrime) / radiusY
  const vx2 = (-px - cxPrime) / radiusX, vy2 = (-py - cyPrime) / radiusY
  const startAngle = Math.atan2(vy1, vx1)
  let sweepAngle = Math.atan2(vx1 * vy2 - vy1 * vx2, vx1 * vx2 + vy1 * vy2)
  if (!sweep && sweepAngle > 0) sweepAngle -= 2 * Math.PI
  else if (sweep && sweepAngle < 0) sweepAngle += 2 * Math.PI
  if (radicand === 0 && Math.abs(Math.abs(sweepAngle) - Math.PI) < HALF_TURN_SNAP) {
    // A half ellipse: the sign of ±π is fixed by the sweep flag alone.
    sweepAngle = sweep ? Math.PI : -Math.PI
  }
  const values = [cx, cy, radiusX, radiusY, startAngle, sweepAngle]
  if (!values.every(Number.isFinite)) return { kind: 'line', segment: [x1, y1, x2, y2] }
  return {
    kind: 'arc',
    segment: [x1, y1, x2, y2, cx, cy, radiusX, radiusY, cos, sin, startAngle, sweepAngle],
    radiusScale,
  }
}

const quadraticRoots = new Float64Array(2)

/**
 * Parameters t where the line through (ox, oy) with direction (dx, dy) meets the packed
 * arc at `offset`, written ascending into out (at most 2); returns the count. The line is
 * mapped into the ellipse's unit-circle frame, where |a + s·b|² = 1 is a quadratic in s;
 * each root s gives an angle and thus t. Roots are kept for −slack ≤ t ≤ 1 + slack and
 * clamped to [0, 1]; a tangent line gives the solver's double root once.
 */
export function intersectLineArcInto(
  data: ArrayLike<number>, offset: number,
  ox: number, oy: number, dx: number, dy: number,
  slack: number, out: Float64Array,
): number {
  const o = offset
  const cx = data[o + 4], cy = data[o + 5], rx = data[o + 6], ry = data[o + 7]
  const c = data[o + 8], s = data[o + 9]
  const qx = ox - cx, qy = oy - cy
  const ax = (c * qx + s * qy) / rx, ay = (-s * qx + c * qy) / ry
  const bx = (c * dx + s * dy) / rx, by = (-s * dx + c * dy) / ry
  const count = solveQuadraticInto(bx * bx + by * by, 2 * (ax * bx + ay * by), ax * ax + ay * ay - 1, quadraticRoots)
  let written = 0
  for (let i = 0; i < count; i++) {
    const root = quadraticRoots[i]
    const angle = Math.atan2(ay + root * by, ax + root * bx)
    const t = arcParameterOfAngle(angle, data[o + 10], data[o + 11])
    if (t >= -slack && t <= 1 + slack) out[written++] = Math.min(1, Math.max(0, t))
  }
  if (written === 2 && out[0] > out[1]) {
    const first = out[0]
    out[0] = out[1]
    out[1] = first
  }
  return written
}
