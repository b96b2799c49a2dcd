/**
 * Slow exact twin of the ray–cubic intersection: roots of g(t) = d × (P(t) − o) with the
 * double inputs taken exactly, in mathjs BigNumber arithmetic at 60 significant digits.
 * Unlike cubic-bignumber.ts (the twin of the solver, which takes double coefficients), it
 * starts from the curve and the probe themselves, so it also measures the rounding of the
 * coefficients that every engine forms; it converts doubles with that file's exact toBig.
 * The control-point sides f_i are exact (products of doubles need ≤ 106 bits, ~32 digits);
 * [0, 1] is cut at the critical points of g (quadratic formula in BigNumber) into monotone
 * pieces, and each piece with a sign change is solved by bisection, finished by Newton
 * steps kept inside the bracket (bisection where a step would leave it), to 60 digits.
 */
import type { BigNumber } from 'mathjs'
import { toBig } from './cubic-bignumber'

/** Exact BigNumber of a double (m·2^e, not its shortest decimal), from the cubic solver's twin. */
const big = (x: number): BigNumber => toBig(x)
const ZERO = big(0)
const ONE = big(1)
/** Bisection steps before Newton: 2^-40 ≈ 1e-12 puts a simple root in Newton's quadratic range. */
const BISECTION_STEPS = 40
/** Refinement steps after bisection: quadratic convergence from 1e-12 reaches 1e-60 in 3; 12 with bisection fallback. */
const REFINE_STEPS = 12
/** A Newton step below 1e-58 of the root means it is settled at 60 digits. */
const TINY_STEP = big(1e-58)

/** Exact roots t ∈ [0, 1] (as doubles, correctly rounded from 60 digits) of the cubic meeting the line. */
export function referenceLineCubicRoots(cubic: ArrayLike<number>, offset: number, ox: number, oy: number, dx: number, dy: number): number[] {
  const f: BigNumber[] = []
  for (let i = 0; i < 4; i++) {
    const x = big(cubic[offset + 2 * i]).minus(big(ox))
    const y = big(cubic[offset + 2 * i + 1]).minus(big(oy))
    f.push(big(dx).times(y).minus(big(dy).times(x)))
  }
  // Power basis: a t³ + b t² + c t + d.
  const a = f[3].minus(f[2].times(3)).plus(f[1].times(3)).minus(f[0])
  const b = f[2].minus(f[1].times(2)).plus(f[0]).times(3)
  const c = f[1].minus(f[0]).times(3)
  const d = f[0]
  const g = (t: BigNumber): BigNumber => a.times(t).plus(b).times(t).plus(c).times(t).plus(d)
  const cuts: BigNumber[] = [ZERO]
  // g'(t) = 3a t² + 2b t + c.
  const qa = a.times(3), qb = b.times(2)
  if (!qa.isZero()) {
    const disc = qb.times(qb).minus(qa.times(c).times(4))
    if (disc.isPositive()) {
      const root = disc.sqrt()
      for (const t of [qb.neg().minus(root).div(qa.times(2)), qb.neg().plus(root).div(qa.times(2))]) {
        if (t.greaterThan(ZERO) && t.lessThan(ONE)) cuts.push(t)
      }
    }
  } else if (!qb.isZero()) {
    const t = c.neg().div(qb)
    if (t.greaterThan(ZERO) && t.lessThan(ONE)) cuts.push(t)
  }
  cuts.push(ONE)
  cuts.sort((p, q) => p.comparedTo(q))
  const roots: number[] = []
  for (let i = 0; i + 1 < cuts.length; i++) {
    let low = cuts[i], high = cuts[i + 1]
    const gLow = g(low), gHigh = g(high)
    if (gLow.isZero()) { roots.push(low.toNumber()); continue }
    if (gHigh.isZero() || gLow.isNegative() === gHigh.isNegative()) continue
    const lowNegative = gLow.isNegative()
    const gPrime = (t: BigNumber): BigNumber => qa.times(t).plus(qb).times(t).plus(c)
    for (let step = 0; step < BISECTION_STEPS; step++) {
      const middle = low.plus(high).div(2)
      if (g(middle).isNegative() === lowNegative) low = middle
      else high = middle
    }
    let x = low.plus(high).div(2)
    for (let step = 0; step < REFINE_STEPS; step++) {
      const value = g(x)
      if (value.isZero()) break
      if (value.isNegative() === lowNegative) low = x
      else high = x
      const slope = gPrime(x)
      const newton = slope.isZero() ? x : x.minus(value.div(slope))
      // A Newton step below the working resolution means x is the root to 60 digits.
      if (newton.equals(x) || newton.minus(x).abs().lessThan(x.abs().times(TINY_STEP))) break
      x = newton.greaterThan(low) && newton.lessThan(high) ? newton : low.plus(high).div(2)
    }
    roots.push(x.toNumber())
  }
  if (g(ONE).isZero()) roots.push(1)
  return roots.filter((t, i) => i === 0 || t !== roots[i - 1])
}
