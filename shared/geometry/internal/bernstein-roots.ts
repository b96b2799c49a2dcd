/**
 * Roots on [0, 1] of polynomials given by Bernstein coefficients (the signed distances of
 * a Bézier's control points from a line), through the closed-form solvers in power basis.
 * Allocation-free: results go into caller-supplied buffers.
 */
import { solveCubicInIntervalInto } from '../solve-cubic'
import { solveQuadraticInto } from '../solve-quadratic'
import { DELICATE_CUBIC, OPEN_WINDOW, solveBernsteinCubicFastInto, writeFour } from './bernstein-cubic-fast'

const scratch = new Float64Array(4)
/** Bernstein coefficients handed to the fast path (module-level scratch). */
const sides = new Float64Array(4)

function keepInUnitInterval(count: number, source: Float64Array, slack: number, out: Float64Array): number {
  let written = 0
  for (let i = 0; i < count; i++) {
    const t = source[i]
    if (t >= -slack && t <= 1 + slack) {
      const clamped = t < 0 ? 0 : t > 1 ? 1 : t
      if (written === 0 || clamped !== out[written - 1]) out[written++] = clamped
    }
  }
  return written
}

/**
 * Roots t ∈ [−slack, 1 + slack] (clamped to [0, 1]) of the cubic with Bernstein
 * coefficients f0..f3, ascending and distinct, written into out; returns the count.
 * An identically zero polynomial has no roots reported (the caller treats it as lying
 * along the line), nor has one whose coefficients overflowed.
 * Staged: the fast closed form of internal/bernstein-cubic-fast.ts answers the cases its
 * error bounds call safe (no root near t = 0 or 1 there, so the slack never matters); the
 * rest goes to the careful solver {@link solveCubicInIntervalInto}.
 */
export function solveBernsteinCubicInto(
  f0: number, f1: number, f2: number, f3: number, slack: number, out: Float64Array,
): number {
  writeFour(sides, f0, f1, f2, f3)
  const fast = solveBernsteinCubicFastInto(sides, OPEN_WINDOW, out)
  if (fast !== DELICATE_CUBIC) return fast
  return solveBernsteinCubicCarefullyInto(f0, f1, f2, f3, slack, out)
}

/**
 * The careful path of {@link solveBernsteinCubicInto} alone (the closed-form solver with
 * scaling, multiplicities and compensated polish), for delicate cases and for tests that
 * compare the two paths.
 */
export function solveBernsteinCubicCarefullyInto(
  f0: number, f1: number, f2: number, f3: number, slack: number, out: Float64Array,
): number {
  const a = f3 - 3 * f2 + 3 * f1 - f0
  const b = 3 * (f2 - 2 * f1 + f0)
  const c = 3 * (f1 - f0)
  if ((a === 0 && b === 0 && c === 0 && f0 === 0) || !Number.isFinite(a + b + c + f0)) return 0
  return keepInUnitInterval(solveCubicInIntervalInto(a, b, c, f0, -slack, 1 + slack, scratch), scratch, slack, out)
}

/** As solveBernsteinCubicInto, for the quadratic with Bernstein coefficients f0, f1, f2. */
export function solveBernsteinQuadraticInto(
  f0: number, f1: number, f2: number, slack: number, out: Float64Array,
): number {
  const a = f0 - 2 * f1 + f2
  const b = 2 * (f1 - f0)
  if ((a === 0 && b === 0 && f0 === 0) || !Number.isFinite(a + b + f0)) return 0
  return keepInUnitInterval(solveQuadraticInto(a, b, f0, scratch), scratch, slack, out)
}

/**
 * Interior critical points t ∈ (0, 1) of the cubic with Bernstein coefficients f0..f3
 * (roots of its derivative), ascending, into out; returns the count (≤ 2).
 */
export function findBernsteinCubicCriticalInto(
  f0: number, f1: number, f2: number, f3: number, out: Float64Array,
): number {
  // g'(t)/3 has Bernstein coefficients (f1 − f0, f2 − f1, f3 − f2).
  const e0 = f1 - f0, e1 = f2 - f1, e2 = f3 - f2
  const a = e0 - 2 * e1 + e2, b = 2 * (e1 - e0)
  if ((a === 0 && b === 0) || !Number.isFinite(a + b + e0)) return 0
  const count = solveQuadraticInto(a, b, e0, scratch)
  let written = 0
  for (let i = 0; i < count; i++) if (scratch[i] > 0 && scratch[i] < 1) out[written++] = scratch[i]
  return written
}
