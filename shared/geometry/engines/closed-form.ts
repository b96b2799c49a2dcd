/**
 * The closed-form engine: the cubic g(t) = direction × (P(t) − origin) with the control
 * points' signed distances as Bernstein coefficients, solved in closed form (Cardano /
 * trigonometric form); roots near t = 0 or ill-conditioned get a Newton polish on
 * error-free control-point sides. Allocation-free.
 *
 * Staged for the hot loop: cheap rejections (control points on one side of the line, or
 * all outside the probe's s-range: convex hull), then the fast closed form of
 * internal/bernstein-cubic-fast.ts, which hands every case its error bounds call delicate to
 * the careful solver. Doubles pass between the stages in module-level Float64Arrays, since
 * a double argument to a call that V8 does not inline is boxed (an allocation).
 */
import { DELICATE_CUBIC, evaluateBernsteinCubic, selectByFlag, solveBernsteinCubicFastInto, writeFour } from '../internal/bernstein-cubic-fast'
import { solveBernsteinCubicCarefullyInto } from '../internal/bernstein-roots'
import { ROOT_T_SLACK } from '../internal/probe-tolerances'
import { refineCubicRootsOnSides } from '../internal/accurate-side'
import type { IntersectionEngine } from './types'

/** Control-point sides f0..f3 of the pair being solved (module-level scratch). */
const sides = new Float64Array(4)
/** The probe of the pair being solved: ox, oy, dx, dy, sMin, sMax. */
const probe = new Float64Array(6)
/** The fast path's window: the control points' projections p0..p3 and the widened s-range (times |d|²). */
const projectionWindow = new Float64Array(6)
/**
 * The fast path skips roots whose projection Σ pi·Bi(t) is outside the s-range by more than
 * this times Σ|pi|. Derivation: the polish moves t by at most 2^-36 (its step bound) and the
 * accurate refinement by rounding amounts, and |d/dt Σ pi·Bi| ≤ 6·max|pi|, so the projection
 * moves by under 2^-33·Σ|pi|; 2^-30 is ample, and the exact range is applied afterwards.
 */
const WINDOW_MARGIN_REL = 2 ** -30

/**
 * The entry point stays below V8's inlining size limit (460 bytecodes) on purpose: inlined
 * into a caller's loop, its double arguments are never boxed. It rejects by the convex hull
 * (control points strictly on one side of the line) and hands over through the scratch.
 * Tests on random data add 0/1 flags (+(x > 0), no branch) and branch once, not on && chains,
 * whose every link would be a poorly predicted branch.
 */
function intersectCubicClosedForm(
  data: ArrayLike<number>, o: number,
  ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number,
  out: Float64Array,
): number {
  const f0 = dx * (data[o + 1] - oy) - dy * (data[o] - ox)
  const f1 = dx * (data[o + 3] - oy) - dy * (data[o + 2] - ox)
  const f2 = dx * (data[o + 5] - oy) - dy * (data[o + 4] - ox)
  const f3 = dx * (data[o + 7] - oy) - dy * (data[o + 6] - ox)
  // all four strictly on one side: a count of 4 (bit 2) in either tally, one branch
  const positive = +(f0 > 0) + +(f1 > 0) + +(f2 > 0) + +(f3 > 0)
  const negative = +(f0 < 0) + +(f1 < 0) + +(f2 < 0) + +(f3 < 0)
  if (((positive | negative) & 4) !== 0) return 0
  writeFour(sides, f0, f1, f2, f3)
  writeFour(probe, ox, oy, dx, dy)
  probe[4] = sMin
  probe[5] = sMax
  return solvePreparedPair(data, o, out)
}

/**
 * The pair left in the scratch arrays: control points all outside the probe's s-range mean
 * no meeting (convex hull again); else the fast closed form (careful solver when delicate),
 * the accurate polish where needed, then the s-range, with s·|d|² taken as the Bernstein
 * combination of the control points' projections pi = d · (Pi − o), which is the projection
 * of P(t) up to rounding.
 */
function solvePreparedPair(data: ArrayLike<number>, o: number, out: Float64Array): number {
  const ox = probe[0]!, oy = probe[1]!, dx = probe[2]!, dy = probe[3]!
  const p0 = dx * (data[o] - ox) + dy * (data[o + 1] - oy)
  const p1 = dx * (data[o + 2] - ox) + dy * (data[o + 3] - oy)
  const p2 = dx * (data[o + 4] - ox) + dy * (data[o + 5] - oy)
  const p3 = dx * (data[o + 6] - ox) + dy * (data[o + 7] - oy)
  const directionSquared = dx * dx + dy * dy
  const low = probe[4]! * directionSquared, high = probe[5]! * directionSquared
  const below = +(p0 < low) + +(p1 < low) + +(p2 < low) + +(p3 < low)
  const above = +(p0 > high) + +(p1 > high) + +(p2 > high) + +(p3 > high)
  if (((below | above) & 4) !== 0) return 0
  const margin = WINDOW_MARGIN_REL * (Math.abs(p0) + Math.abs(p1) + Math.abs(p2) + Math.abs(p3))
  writeFour(projectionWindow, p0, p1, p2, p3)
  projectionWindow[4] = low - margin
  projectionWindow[5] = high + margin
  let count = solveBernsteinCubicFastInto(sides, projectionWindow, out)
  if (count === DELICATE_CUBIC) count = solveBernsteinCubicCarefullyInto(sides[0]!, sides[1]!, sides[2]!, sides[3]!, ROOT_T_SLACK, out)
  if (count > 0) refineCubicRootsOnSides(data, o, probe, sides, out, count)
  count = keepExactEnds(count, out)
  if (count === 0) return 0
  // keep, in order and once, the roots inside the s-range (written unconditionally, counted by flag)
  let written = 0
  let previous = -1
  for (let i = 0; i < count; i++) {
    const t = out[i]!
    const projection = evaluateBernsteinCubic(p0, p1, p2, p3, t)
    const keep = +(projection >= low) & +(projection <= high) & +(t !== previous)
    out[written] = t
    written += keep
    previous = selectByFlag(keep, t, previous)
  }
  return written
}

/**
 * An end point exactly on the line (side exactly 0) is a root whatever the solver made of
 * its neighbourhood: when the next control point lies on the line too it is a double root,
 * which rounding can turn into a complex pair or move inside (0, 1). A root within
 * ROOT_T_SLACK of that end becomes the end itself; with none there, the end is added (a
 * cubic has at most three roots, so a full list is left alone). `out` stays ascending.
 */
function keepExactEnds(count: number, out: Float64Array): number {
  // A cubic lying along the line is an overlap, not a set of roots (the engine contract).
  if (sides[0] === 0 && sides[1] === 0 && sides[2] === 0 && sides[3] === 0) return count
  if (sides[3] === 0) {
    if (count > 0 && out[count - 1]! >= 1 - ROOT_T_SLACK) out[count - 1] = 1
    else if (count < 3) out[count++] = 1
  }
  if (sides[0] === 0) {
    if (count > 0 && out[0]! <= ROOT_T_SLACK) out[0] = 0
    else if (count < 3) {
      for (let i = count; i > 0; i--) out[i] = out[i - 1]!
      out[0] = 0
      count++
    }
  }
  return count
}

/** Closed-form cubic solve of the probe's implicit line equation along the curve. */
export const closedFormEngine: IntersectionEngine = {
  name: 'closed-form',
  description: 'implicit line substituted into the cubic, fast closed form with error-bound hand-off to the careful solver, polish on exact sides where needed',
  intersectCubic: intersectCubicClosedForm,
}
