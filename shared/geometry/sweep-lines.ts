/**
 * The lines of a sweep given by an angle in degrees, a spacing and a count, as probe sets,
 * checks and the canvas store them. Client and server build the same lines from the same
 * numbers with these functions, so hits computed on either side agree bit for bit.
 */
import type { Point } from './segments'

/** A sweep as stored: `count` parallel lines `spacing` apart at `angle` degrees from +x towards +y. */
export interface LineSweep {
  /** Degrees from +x towards +y (clockwise on screen, the path's y-down frame). */
  readonly angle: number
  readonly spacing: number
  readonly count: number
  /** A point on the first line. */
  readonly origin: Point
}

/** One line of a sweep: a point on it and its direction (a unit vector). */
export interface SweepLine {
  readonly origin: Point
  readonly direction: Point
}

/** Directions at the multiples of 45°, exact: axes are 0/±1, diagonals have |x| = |y| = √½. */
const OCTANT_DIRECTIONS: readonly Point[] = [
  [1, 0], [Math.SQRT1_2, Math.SQRT1_2], [0, 1], [-Math.SQRT1_2, Math.SQRT1_2],
  [-1, 0], [-Math.SQRT1_2, -Math.SQRT1_2], [0, -1], [Math.SQRT1_2, -Math.SQRT1_2],
]

/**
 * Unit direction (cos, sin) of an angle in degrees from +x towards +y (clockwise on screen).
 * Multiples of 90° give exact 0 and ±1, odd multiples of 45° equal |x| and |y|; other
 * angles are reduced to [0°, 360°) first (exact: fmod is exact in IEEE arithmetic), so 370°
 * and 10° give the same direction. RangeError for a non-finite angle.
 */
export function directionOfAngle(degrees: number): Point {
  if (!Number.isFinite(degrees)) throw new RangeError(`angle must be a finite number of degrees, got ${degrees}`)
  let reduced = degrees % 360
  if (reduced < 0) reduced += 360
  if (reduced === 360) reduced = 0 // a tiny negative angle rounds up to 360 when 360 is added
  const octant = reduced / 45
  if (Number.isInteger(octant)) return OCTANT_DIRECTIONS[octant]
  const radians = (reduced * Math.PI) / 180
  return [Math.cos(radians), Math.sin(radians)]
}

/**
 * The lines of a sweep: line i (0 ≤ i < count) passes through origin + i·spacing·n with
 * n = (−sin, cos) of the angle, and runs along (cos, sin). A count of 0 gives none.
 * RangeError for a count that is not a non-negative integer or non-finite numbers.
 */
export function sweepLines(sweep: LineSweep): SweepLine[] {
  const { count, spacing, origin } = sweep
  if (!Number.isInteger(count) || count < 0) throw new RangeError(`sweep count must be a non-negative integer, got ${count}`)
  if (!Number.isFinite(spacing) || !Number.isFinite(origin[0]) || !Number.isFinite(origin[1])) {
    throw new RangeError('sweep spacing and origin must be finite numbers')
  }
  const direction = directionOfAngle(sweep.angle)
  const normalX = -direction[1], normalY = direction[0]
  const lines: SweepLine[] = []
  for (let i = 0; i < count; i++) {
    const offset = i * spacing
    lines.push({ origin: [origin[0] + offset * normalX, origin[1] + offset * normalY], direction })
  }
  return lines
}
