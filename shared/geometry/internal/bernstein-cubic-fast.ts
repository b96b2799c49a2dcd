/**
 * The fast path of the ray–cubic hot loop: the closed form on the unscaled power-basis
 * coefficients of a cubic given by Bernstein coefficients f0..f3 (the discriminant with its
 * rounding bound and Cardano's formula exactly as in internal/cubic-resolvent.ts and
 * solve-cubic.ts; for three real roots Viète's three cosines, where the careful solver takes
 * the two smaller roots from a deflated quadratic), then at most one plain Newton step per
 * root on the Bernstein form, accepted only when it lowers |g|.
 *
 * It answers only cases its own error bounds call safe and returns {@link DELICATE_CUBIC}
 * for the rest, which the caller hands to the careful solver (solveCubicInIntervalInto:
 * scaling, multiplicity detection, compensated evaluation). Delicate means: magnitudes out
 * of the unscaled window, an end value g(0) or g(1) near zero (a root near t = 0 or 1, where
 * keeping or dropping it is a rounding decision), a negligible leading coefficient, a
 * discriminant within its rounding bound of zero (multiple or close roots), γβ ≤ 0 where the
 * discriminant says three real roots, a root in [0, 1] with a small slope (near-tangent) or
 * whose Newton correction is too large for one step to finish it, two roots closer than any
 * two simple roots can be, or a root count that the signs of f0..f3 rule out.
 *
 * Written for V8's optimizing compiler on random input, where a mispredicted branch costs
 * more than the arithmetic around it: magnitudes are measured by S = Σ|fi| (no max), and most
 * choices that depend on the data (signs, the order of roots, whether a Newton step helps)
 * are made by arithmetic on 0/1 flags (+(x > 0) is 1 or 0 without a branch; see
 * {@link selectByFlag}); branches remain where one side is rare or the work saved is large.
 * No allocation: doubles stay in locals, and the entry takes and fills typed arrays.
 */
import { DISCRIMINANT_DOUBLE_BOUND } from './cubic-resolvent'

/** Returned by {@link solveBernsteinCubicFastInto} for a case it leaves to the careful solver. */
export const DELICATE_CUBIC = -1

/**
 * The unscaled window: S = Σ|fi| within 2^±100. The closed form's largest intermediates are
 * products of four coefficients (|a|, |b|, |c|, |d| ≤ 8·S), so they stay within 2^±420 with
 * their rounding-error terms, far from overflow and underflow.
 */
const FAST_MAXIMUM = 2 ** 100
const FAST_MINIMUM = 2 ** -100
/**
 * |g(0)| = |f0| or |g(1)| = |f3| at most this times S is delicate. Derivation: |g′| ≤
 * 6·max|f| ≤ 6·S near [0, 1] (Bernstein bound), so every root within 2^-33 of t = 0 or 1 has
 * an end value below 2^-30·S; outside this band no root can sit near an end.
 */
const END_VALUE_REL = 2 ** -30
/**
 * |a| below this times S is a nearly quadratic cubic: beyond it s1 = −b/a and the roots
 * (Cauchy's bound 1 + max|coefficient/a|) reach 12·2^8, and the closed form's absolute
 * error, a few ε times those, would approach what one Newton step repairs (MAX_STEP).
 */
const LEADING_REL = 2 ** -8
/**
 * A root in [0, 1] with |g′| below this times S is near-tangent (near a double root). With
 * |g″| ≤ 24·max|f| ≤ 24·S it bounds |g″/(2g′)| by 768 < 2^10, which the step bound below
 * uses; and two roots with such slopes are at least 2^-6/24 > 2^-11 apart (g′ vanishes
 * between them), so the step cannot reorder or merge them.
 */
const SLOPE_REL = 2 ** -6
/**
 * Largest Newton correction that one step finishes: the error left after the step is at
 * most |g″/(2g′)|·step² ≤ 2^10·2^-72 = 2^-62, below an ulp of any t ≥ 2^-9. The closed-form
 * roots are off by about 2^-38 at most (see the Viète branch), usually by a few ε.
 */
const MAX_STEP = 2 ** -36
/**
 * A closed-form root within this of t = 0 or 1 (on either side) is delicate: far above the
 * closed form's error (2^-36, the step bound), and far below the distance 2^-33 from the ends
 * within which the end-value test guarantees no root lies. Outside this band a candidate is
 * inside or outside [0, 1] before and after its polish alike.
 */
const CANDIDATE_MARGIN = 2 ** -34
/**
 * Two closed-form roots closer than this are delicate: by the slope bound above simple roots
 * are over 2^-11 apart, so only a failed closed form puts two candidates this close.
 */
const MIN_SEPARATION = 2 ** -20
/**
 * The `wanted` window that takes every root (projections 0, bounds ∓∞), for callers
 * without a probe range; see {@link solveBernsteinCubicFastInto}.
 */
export const OPEN_WINDOW = new Float64Array([0, 0, 0, 0, Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY])

/**
 * 1/3 as a double: multiplying by it instead of dividing by 3 shortens the closed form's
 * latency (a division is several times slower) for at most an ulp, which the polish removes.
 */
const ONE_THIRD = 1 / 3
/** √3, for the cosines of θ and θ ± 2π/3 from those of φ = θ − π/6 (see the Viète branch). */
const SQRT3 = Math.sqrt(3)

/**
 * whenOne when flag is 1, whenZero when it is 0, by arithmetic instead of a branch: exact for
 * finite values (one product is the value itself, the other ±0).
 */
export function selectByFlag(flag: number, whenOne: number, whenZero: number): number {
  return flag * whenOne + (1 - flag) * whenZero
}

/**
 * target[0..4) = (first, second, third, fourth): how the hot path hands four doubles to a
 * call through module-level scratch without boxing them (small enough for V8 to inline).
 */
export function writeFour(target: Float64Array, first: number, second: number, third: number, fourth: number): void {
  target[0] = first
  target[1] = second
  target[2] = third
  target[3] = fourth
}

/** g(t) = Σ fi·Bi(t), the cubic in Bernstein form (error ≤ about 5ε·max|f|). */
export function evaluateBernsteinCubic(f0: number, f1: number, f2: number, f3: number, t: number): number {
  const u = 1 - t
  return u * u * u * f0 + 3 * u * t * (u * f1 + t * f2) + t * t * t * f3
}

/** g′(t) of {@link evaluateBernsteinCubic}: 3·Σ (fi+1 − fi)·Bi(t) over the quadratic basis. */
export function evaluateBernsteinCubicSlope(f0: number, f1: number, f2: number, f3: number, t: number): number {
  const u = 1 - t
  return 3 * (u * u * (f1 - f0) + 2 * u * t * (f2 - f1) + t * t * (f3 - f2))
}

/** Closed-form root candidates, ascending (module-level scratch). */
const candidates = new Float64Array(3)

/**
 * Roots t ∈ [0, 1] of the cubic with Bernstein coefficients sides[0..4) = f0..f3, ascending
 * and distinct, into out; returns the count, or {@link DELICATE_CUBIC} (out then holds
 * nothing meaningful) when the careful solver must decide. Same roots as the careful path
 * up to its rounding: both are closed forms of the same cubic, polished.
 *
 * wanted = (w0, w1, w2, w3, low, high) names the roots the caller wants: those where
 * Σ wi·Bi(t) ∈ [low, high] (the engine: the probe's s-range, wi the control points'
 * projections). The others are not polished and not written; the caller widens the bounds
 * by what the polish can move that sum and applies the exact range to the roots it gets.
 *
 * Besides the bounds above, the number of roots in [0, 1] (wanted or not) is checked against
 * what the Bernstein coefficients allow: its parity is that of the sign change between f0
 * and f3, and it is at most the number of sign changes among f0..f3 (Descartes' rule in the
 * Bernstein basis).
 */
export function solveBernsteinCubicFastInto(sides: Float64Array, wanted: Float64Array, out: Float64Array): number {
  const f0 = sides[0]!, f1 = sides[1]!, f2 = sides[2]!, f3 = sides[3]!
  const scale = Math.abs(f0) + Math.abs(f1) + Math.abs(f2) + Math.abs(f3)
  if (!(scale <= FAST_MAXIMUM && scale >= FAST_MINIMUM)) return DELICATE_CUBIC
  const endLimit = END_VALUE_REL * scale
  const a = f3 - 3 * f2 + 3 * f1 - f0
  if (Math.abs(f0) <= endLimit || Math.abs(f3) <= endLimit || !(Math.abs(a) > LEADING_REL * scale)) return DELICATE_CUBIC
  const b = 3 * (f2 - 2 * f1 + f0)
  const c = 3 * (f1 - f0)
  const d = f0
  // Discriminant 4PS − R² (= 3a⁴Δ₁) and its bound, exactly as the careful solver's classification.
  const bb = b * b, ac = a * c, bc = b * c, ad = a * d, cc = c * c, bd = b * d
  const p = bb - 3 * ac, r = bc - 9 * ad, s = cc - 3 * bd
  const rSize = Math.abs(bc) + 9 * Math.abs(ad)
  const size = 4 * (bb + 3 * Math.abs(ac)) * (cc + 3 * Math.abs(bd)) + rSize * rSize
  const discriminant = 4 * p * s - r * r
  if (!(Math.abs(discriminant) > DISCRIMINANT_DOUBLE_BOUND * size)) return DELICATE_CUBIC
  const oddCount = +(f0 * f3 < 0)
  // One real root (simple) and g(0), g(1) of one sign: it lies outside [0, 1].
  if (discriminant < 0 && oddCount === 0) return 0
  const reciprocal = 1 / a
  const sum1 = -b * reciprocal
  const cubeSum = (2 * sum1 * sum1 - 9 * c * reciprocal) * sum1 - 27 * d * reciprocal
  const product = p * reciprocal * reciprocal
  let found: number
  if (discriminant < 0) {
    // Cardano: γ³ the larger-magnitude root of z² − (γ³+β³)z + (γβ)³ (sign of γ³+β³), β = γβ/γ;
    // γ + β as (γ³+β³)/(γ² − γβ + β²) when γβ < 0; the root (s1 + γ + β)/3, or s3/|complex
    // root|² when s1 and γ + β differ in sign (as insertCardanoRoot in solve-cubic.ts).
    const root = 3 * Math.sqrt(-discriminant) * reciprocal * reciprocal
    const cubeSumSign = 2 * +(cubeSum >= 0) - 1
    const gamma = Math.cbrt(0.5 * (cubeSum + cubeSumSign * root))
    const beta = product / gamma
    const sum = product >= 0 ? gamma + beta : cubeSum / (gamma * gamma - product + beta * beta)
    if (sum1 * sum > 0) {
      candidates[0] = ONE_THIRD * (sum1 + sum)
    } else {
      const half = sum1 - 0.5 * sum
      const difference = gamma - beta
      candidates[0] = (-9 * d * reciprocal) / (half * half + 0.75 * difference * difference)
    }
    found = 1
  } else {
    // Viète: γ = ρ·e^{iθ}, β = ρ·e^{−iθ} with ρ = √(γβ) and cos 3θ = (γ³+β³)/(2ρ³), θ ∈ [0, π/3];
    // the roots (s1 + 2ρ·cos(θ + 2πk/3))/3, ascending for k = 1, 2, 0. Each is within a few
    // ε·(|s1| + 2ρ) ≤ 2^-38 of exact (LEADING_REL bounds s1 and the roots), which the Newton
    // step below removes; rounding near cos 3θ = ±1 (close roots) shows up as a small slope or
    // a large step, both delicate.
    if (!(product > 0)) return DELICATE_CUBIC // γβ = s1² − 3s2 > 0 with three real roots, unless rounding says otherwise
    const modulus = Math.sqrt(product)
    const cosine = cubeSum / (2 * product * modulus)
    // φ = θ − π/6 ∈ [−π/6, π/6]: cos θ = (√3 cos φ − sin φ)/2, cos(θ − 2π/3) = sin φ and
    // cos(θ + 2π/3) = −(√3 cos φ + sin φ)/2, with |φ| < π/4 inside the libraries' cheapest range
    const shifted = ONE_THIRD * Math.acos(cosine > 1 ? 1 : cosine < -1 ? -1 : cosine) - Math.PI / 6
    const cosineTerm = SQRT3 * modulus * Math.cos(shifted), sineTerm = modulus * Math.sin(shifted)
    candidates[0] = ONE_THIRD * (sum1 - cosineTerm - sineTerm)
    candidates[1] = ONE_THIRD * (sum1 + 2 * sineTerm)
    candidates[2] = ONE_THIRD * (sum1 + cosineTerm - sineTerm)
    found = 3
  }
  const minimumSlope = SLOPE_REL * scale
  const w0 = wanted[0]!, w1 = wanted[1]!, w2 = wanted[2]!, w3 = wanted[3]!, low = wanted[4]!, high = wanted[5]!
  let inside = 0
  let count = 0
  for (let i = 0; i < found; i++) {
    const t = candidates[i]!
    if (!(t > CANDIDATE_MARGIN && t < 1 - CANDIDATE_MARGIN)) {
      // within the margin of an end: no root is there (END_VALUE_REL), so the closed form erred
      if (t >= -CANDIDATE_MARGIN && t <= 1 + CANDIDATE_MARGIN) return DELICATE_CUBIC
      continue
    }
    if (inside > 0 && !(t - candidates[i - 1]! > MIN_SEPARATION)) return DELICATE_CUBIC
    inside++
    // a root the caller does not want (outside its window) is counted but not polished
    const projection = evaluateBernsteinCubic(w0, w1, w2, w3, t)
    if (!(projection >= low && projection <= high)) continue
    const polished = polishCandidate(f0, f1, f2, f3, t, minimumSlope)
    if (polished !== polished) return DELICATE_CUBIC // NaN: near-tangent, or the step too large
    out[count++] = polished
  }
  const signChanges = +(f0 * f1 < 0) + +(f1 * f2 < 0) + +(f2 * f3 < 0)
  if ((inside & 1) !== oddCount || inside > signChanges) return DELICATE_CUBIC
  return count
}

/**
 * One Newton step on the Bernstein form from the closed-form root t, kept only when it
 * lowers |g|; NaN when the root is delicate there (|g′| below minimumSlope, or a step beyond
 * MAX_STEP). Called only for t within CANDIDATE_MARGIN of [0, 1]. (Bernstein sums rather
 * than de Casteljau: the sums' terms are independent, so their latency is shorter, which
 * measurably matters here.)
 */
function polishCandidate(f0: number, f1: number, f2: number, f3: number, t: number, minimumSlope: number): number {
  const slope = evaluateBernsteinCubicSlope(f0, f1, f2, f3, t)
  const value = evaluateBernsteinCubic(f0, f1, f2, f3, t)
  const step = value / slope
  const next = t - step
  const better = +(Math.abs(evaluateBernsteinCubic(f0, f1, f2, f3, next)) < Math.abs(value))
  const safe = +(Math.abs(slope) >= minimumSlope) & +(Math.abs(step) <= MAX_STEP)
  // a zero or tiny slope makes next non-finite; the safe flag then turns the result into NaN
  return safe === 1 ? selectByFlag(better, next, t) : Number.NaN
}
