/**
 * Real roots of a·t³ + b·t² + c·t + d = 0 in closed form: Cardano's formula where there is
 * one real root, the trigonometric form of Viète where there are three, chosen by the sign of
 * the discriminant, on the general (non-monic, non-depressed) cubic.
 *
 * Stages (each documented where it happens):
 * 1. Exact zeros: d = 0 gives the root 0 exactly and a lower-degree factor; a = 0 is a quadratic.
 * 2. Scaling: coefficients within 2^±120 are used as they are; others (and the double-root
 *    branch) go through the cubic in u = t/2^k divided by 2^m, whose largest root has |u| in
 *    [1/48, 2), by powers of two (internal/cubic-resolvent.ts). Roots far below the largest
 *    are taken from the coefficients themselves, through product relations and the quadratic
 *    factor, so they keep their precision where they would underflow in the scaled cubic.
 * 3. The discriminant with its rounding-error bound picks the branch; zero within the bound
 *    is a double root (triple when b² − 3ac is zero within its bound too).
 * 4. Closed form without cancellation: Cardano takes the cube root of the larger-magnitude
 *    resolvent term and the other from the product relation; the real root is (s1 + γ + β)/3,
 *    or s3 divided by the squared modulus of the complex pair when s1 and γ + β have opposite
 *    signs. Viète gives the largest-magnitude root L, where s1 and the cosine term agree in
 *    sign; the other two come from the exact quadratic factor p(t) = (1 − t/L)·(d + e·t + f·t²)
 *    (e = c + d/L, f = b + e/L: deflation from the constant end, stable for the largest root)
 *    by the stable quadratic formula. A double root is the critical point (root of p') where
 *    |p| is smaller; the simple root beside it is s3/(double root)², a product relation.
 * 5. Polish: at most two Newton steps per simple root, with p from the compensated Horner
 *    scheme, each accepted only when it lowers |p| and keeps the root strictly between its
 *    neighbours.
 * 6. Roots beyond ±Number.MAX_VALUE are left out and lower the reported degree (see solveCubic).
 */
import type { CubicSolution } from './types'
import { ZERO_EXPONENT, evaluateCubicCompensated, exponentOf, scaleByPowerOfTwo } from './internal/float'
import {
  ANGLE,
  BETA,
  DISCRIMINANT_TIMES_THREE,
  DOUBLE_ROOT,
  GAMMA,
  ONE_REAL_ROOT,
  SCALED_A,
  SCALED_B,
  SCALED_C,
  SCALED_D,
  SUM1,
  THREE_REAL_ROOTS,
  VARIABLE_EXPONENT,
  classifyCubic,
  computeResolvent,
  cubicDiscriminant,
  gammaPlusBeta,
  isModerateCubic,
  resolvent,
} from './internal/cubic-resolvent'
import {
  checkFiniteCoefficients,
  collectRoots,
  noteDroppedRoot,
  peekDroppedMultiplicity,
  quadraticDiscriminant,
  takeDroppedMultiplicity,
  writeQuadraticLikeRoots,
  writeQuadraticRoots,
} from './solve-quadratic'

/** Newton steps allowed per root: the closed form gives the roots, the steps only polish. */
const MAX_NEWTON_STEPS = 2
/** Relative size of an accepted Newton step below which no second step is tried (see polishRoot). */
const LAST_STEP_SIZE = 2 ** -30
/**
 * When the quadratic factor's coefficients overflow (possible only for coefficients within a
 * factor of about 3 of Number.MAX_VALUE), the factor is recomputed from b, c, d scaled by
 * this power of two, which leaves its roots unchanged.
 */
const FACTOR_RESCALE = 2 ** -8
/**
 * Polishing evaluates p directly on the coefficients when their exponents are within ±250
 * and the root's within ±120: every term and its error term (×2^-53, ×2^27 in the split)
 * then stays between 2^-700 and 2^700, far from overflow and underflow.
 */
const DIRECT_COEFFICIENT_EXPONENT = 250
const DIRECT_ROOT_MAXIMUM = 2 ** 120
const DIRECT_ROOT_MINIMUM = 2 ** -120
/**
 * With a zero discriminant, the close pair counts as far below the largest root when the
 * scaled |C| and |D| are at most this: the pair then has |u| ≤ 2^-20 while the largest root
 * has |u| ≥ 1/48, so (s1 + 2γ)/3 is within O(2^-20) of it and two Newton steps reach 2^-80.
 * Above it the pair sits within 2^20 of the largest root's scale, where a separation below
 * rounding at that scale is below 2^-33 relative: a double root within its condition.
 */
const SEPARATED_PAIR_SIZE = 2 ** -40

/** Below this, 3a and 2b of p' cannot overflow. */
const CRITICAL_POINT_LIMIT = Number.MAX_VALUE / 4

/** Relative widening of the polish window of solveCubicInIntervalInto beyond its bounds. */
const INTERVAL_MARGIN = 2 ** -20

/** Roots under assembly (ascending, distinct) and their multiplicities: module-level scratch. */
const assembled = new Float64Array(3)
const assembledMultiplicities = new Uint8Array(3)
let assembledCount = 0
/** Scratch for the quadratic factors. */
const pairRoots = new Float64Array(2)
const pairMultiplicities = new Uint8Array(2)

/**
 * The coefficients with their binary exponents, and (slots 8…12) the local evaluation set of
 * {@link prepareLocalEvaluation}. A Float64Array: writing a double into it allocates nothing.
 */
const coefficients = new Float64Array(13)
const A = 0
const B = 1
const C = 2
const D = 3
const EXPONENT_A = 4
const EXPONENT_B = 5
const EXPONENT_C = 6
const EXPONENT_D = 7
const LOCAL_A = 8
const LOCAL_B = 9
const LOCAL_C = 10
const LOCAL_D = 11
const LOCAL_EXPONENT = 12
/** True when the coefficients' exponents allow direct evaluation (see DIRECT_COEFFICIENT_EXPONENT). */
let directCoefficients = false
/** False on the moderate path until a rare step needs the exponents (see ensureExponents). */
let exponentsKnown = false

/** Inserts a root keeping the list ascending; equal values merge (multiplicities add, at most 3). */
function insertRoot(t: number, multiplicity: number): void {
  if (t === Number.POSITIVE_INFINITY || t === Number.NEGATIVE_INFINITY) {
    noteDroppedRoot(multiplicity)
    return
  }
  const value = t + 0 // −0 → +0
  let at = assembledCount
  while (at > 0 && assembled[at - 1]! > value) at--
  if (at > 0 && assembled[at - 1] === value) {
    assembledMultiplicities[at - 1] = Math.min(3, assembledMultiplicities[at - 1]! + multiplicity)
    return
  }
  for (let i = assembledCount; i > at; i--) {
    assembled[i] = assembled[i - 1]!
    assembledMultiplicities[i] = assembledMultiplicities[i - 1]!
  }
  assembled[at] = value
  assembledMultiplicities[at] = multiplicity
  assembledCount++
}

/** Inserts the first count roots of the quadratic scratch. */
function insertPair(count: number): void {
  for (let i = 0; i < count; i++) insertRoot(pairRoots[i]!, pairMultiplicities[i]!)
}

/** Stores the coefficients with their binary exponents and decides whether direct evaluation is safe. */
function prepareCoefficients(a: number, b: number, c: number, d: number): void {
  coefficients[A] = a
  coefficients[B] = b
  coefficients[C] = c
  coefficients[D] = d
  ensureExponents(false)
  directCoefficients = isWithinDirectWindow(coefficients[EXPONENT_A]!) && isWithinDirectWindow(coefficients[EXPONENT_B]!) &&
    isWithinDirectWindow(coefficients[EXPONENT_C]!) && isWithinDirectWindow(coefficients[EXPONENT_D]!)
}

/** Computes the coefficients' binary exponents unless known already (the moderate path defers them). */
function ensureExponents(onlyIfUnknown: boolean): void {
  if (onlyIfUnknown && exponentsKnown) return
  coefficients[EXPONENT_A] = exponentOf(coefficients[A]!)
  coefficients[EXPONENT_B] = exponentOf(coefficients[B]!)
  coefficients[EXPONENT_C] = exponentOf(coefficients[C]!)
  coefficients[EXPONENT_D] = exponentOf(coefficients[D]!)
  exponentsKnown = true
}

function isWithinDirectWindow(exponent: number): boolean {
  return (exponent >= -DIRECT_COEFFICIENT_EXPONENT && exponent <= DIRECT_COEFFICIENT_EXPONENT) || exponent === ZERO_EXPONENT
}

/** (−d/a)·factor·2^-shift from the mantissas of a and d, so −d/a itself may lie beyond the range. */
function productRoot(factor: number, shift: number): number {
  if (!exponentsKnown) return scaleByPowerOfTwo(-(coefficients[D]! / coefficients[A]!) * factor, -shift) // moderate: d/a is safe
  const ea = coefficients[EXPONENT_A]!
  const ed = coefficients[EXPONENT_D]!
  const ratio = scaleByPowerOfTwo(coefficients[D]!, -ed) / scaleByPowerOfTwo(coefficients[A]!, -ea)
  return scaleByPowerOfTwo(-ratio * factor, ed - ea - shift)
}

/**
 * Sets up p near t ≠ 0 as LOCAL_A·x³ + … + LOCAL_D with t = x·2^LOCAL_EXPONENT: directly
 * when the coefficients and t are within the direct window, else scaled so |x| ∈ [1, 2) and
 * the largest term is about 1. Returns x.
 */
function prepareLocalEvaluation(t: number): number {
  const magnitude = Math.abs(t)
  if (directCoefficients && magnitude <= DIRECT_ROOT_MAXIMUM && magnitude >= DIRECT_ROOT_MINIMUM) {
    coefficients[LOCAL_A] = coefficients[A]!
    coefficients[LOCAL_B] = coefficients[B]!
    coefficients[LOCAL_C] = coefficients[C]!
    coefficients[LOCAL_D] = coefficients[D]!
    coefficients[LOCAL_EXPONENT] = 0
    return t
  }
  ensureExponents(true)
  const e = exponentOf(t)
  let top = coefficients[EXPONENT_A]! + 3 * e
  const fromB = coefficients[EXPONENT_B]! + 2 * e
  const fromC = coefficients[EXPONENT_C]! + e
  if (fromB > top) top = fromB
  if (fromC > top) top = fromC
  if (coefficients[EXPONENT_D]! > top) top = coefficients[EXPONENT_D]!
  coefficients[LOCAL_A] = scaleByPowerOfTwo(coefficients[A]!, 3 * e - top)
  coefficients[LOCAL_B] = scaleByPowerOfTwo(coefficients[B]!, 2 * e - top)
  coefficients[LOCAL_C] = scaleByPowerOfTwo(coefficients[C]!, e - top)
  coefficients[LOCAL_D] = scaleByPowerOfTwo(coefficients[D]!, -top)
  coefficients[LOCAL_EXPONENT] = e
  return scaleByPowerOfTwo(t, -e)
}

/** |p(t)| relative to the size of its terms, Σ|coefficient|·|t|^i (p(0) = d ≠ 0 counts as 1). */
function relativeResidual(t: number): number {
  if (t === 0) return 1
  const x = prepareLocalEvaluation(t)
  const a = coefficients[LOCAL_A]!
  const b = coefficients[LOCAL_B]!
  const c = coefficients[LOCAL_C]!
  const d = coefficients[LOCAL_D]!
  const size = ((Math.abs(a) * Math.abs(x) + Math.abs(b)) * Math.abs(x) + Math.abs(c)) * Math.abs(x) + Math.abs(d)
  return Math.abs(evaluateCubicCompensated(a, b, c, d, x)) / size
}

/**
 * Stage 5 for assembled[index]: at most MAX_NEWTON_STEPS Newton steps on p (value from the
 * compensated Horner scheme), each kept only when |p| decreases and the root stays strictly
 * between its current neighbours. A step below 2^-30 relative ends the polish: the next one
 * could only remove an error of order (that step)² times |p''/p'|, below an ULP unless the
 * root is so ill-conditioned that its error allowance is far larger.
 */
function polishRoot(index: number): void {
  const t = assembled[index]!
  if (t === 0) return
  const lower = index > 0 ? assembled[index - 1]! : Number.NEGATIVE_INFINITY
  const upper = index + 1 < assembledCount ? assembled[index + 1]! : Number.POSITIVE_INFINITY
  const start = prepareLocalEvaluation(t)
  const a = coefficients[LOCAL_A]!
  const b = coefficients[LOCAL_B]!
  const c = coefficients[LOCAL_C]!
  const d = coefficients[LOCAL_D]!
  const exponent = coefficients[LOCAL_EXPONENT]!
  let x = start
  let root = t
  let value = 0
  let candidate = start
  let candidateRoot = t
  let change = 0
  // one evaluation per pass: at the start point, then at each proposed step
  for (let pass = 0; pass <= MAX_NEWTON_STEPS; pass++) {
    const candidateValue = evaluateCubicCompensated(a, b, c, d, candidate)
    if (pass > 0) {
      if (!(Math.abs(candidateValue) < Math.abs(value))) break
      x = candidate
      root = candidateRoot
      if (Math.abs(change) <= LAST_STEP_SIZE * Math.abs(x)) break
    }
    value = candidateValue
    if (value === 0 || pass === MAX_NEWTON_STEPS) break
    change = value / ((3 * a * x + 2 * b) * x + c)
    candidate = x - change
    candidateRoot = exponent === 0 ? candidate : scaleByPowerOfTwo(candidate, exponent)
    if (!(candidateRoot > lower && candidateRoot < upper) || candidateRoot === root) break
  }
  assembled[index] = root
}

/** Polishes the simple roots of the assembled list that lie in [lower, upper]. */
function polishAssembled(lower: number, upper: number): void {
  for (let i = 0; i < assembledCount; i++) {
    const t = assembled[i]!
    if (assembledMultiplicities[i] === 1 && t >= lower && t <= upper) polishRoot(i)
  }
}

/** One real root (Cardano): (s1 + γ + β)/3, or s3/|complex root|² when that would cancel. */
function insertCardanoRoot(): void {
  const k = resolvent[VARIABLE_EXPONENT]!
  const sum1 = resolvent[SUM1]!
  const sum = gammaPlusBeta()
  if ((sum1 > 0 && sum > 0) || (sum1 < 0 && sum < 0)) {
    insertRoot(scaleByPowerOfTwo((sum1 + sum) / 3, k), 1)
    return
  }
  // s1 and γ + β differ in sign (or one is 0): |complex root|² = ((s1 − (γ+β)/2)² + ¾(γ − β)²)/9
  // has no cancellation, and s3 comes from d/a unscaled, so a real root far below the pair
  // keeps its precision even where it underflows in the scaled cubic
  const half = sum1 - 0.5 * sum
  const difference = resolvent[GAMMA]! - resolvent[BETA]!
  insertRoot(productRoot(9 / (half * half + 0.75 * difference * difference), 2 * k), 1)
}

/**
 * Inserts the largest-magnitude root L (given as L/2^k) and the roots of the quadratic factor
 * p(t) = (1 − t/L)·(d + e·t + f·t²), e = c + d/L, f = b + e/L: deflation from the constant end,
 * which is stable for the largest root and keeps the small roots' precision in t itself.
 * Returns how many simple roots the factor gave, counting those left out beyond the double
 * range (a double root counts as none); its coefficients stay in factor[0] (e) and factor[1] (f).
 */
function insertLargestAndFactor(largest: number): number {
  const k = resolvent[VARIABLE_EXPONENT]!
  let d = coefficients[D]!
  let e = coefficients[C]! + scaleByPowerOfTwo(d / largest, -k)
  let f = coefficients[B]! + scaleByPowerOfTwo(e / largest, -k)
  if (!Number.isFinite(e) || !Number.isFinite(f)) {
    d *= FACTOR_RESCALE
    e = coefficients[C]! * FACTOR_RESCALE + scaleByPowerOfTwo(d / largest, -k)
    f = coefficients[B]! * FACTOR_RESCALE + scaleByPowerOfTwo(e / largest, -k)
  }
  factor[0] = e
  factor[1] = f
  const droppedBefore = peekDroppedMultiplicity()
  const count = f === 0 ? 0 : writeQuadraticRoots(f, e, d, pairRoots, 0, pairMultiplicities)
  let found = peekDroppedMultiplicity() - droppedBefore
  for (let i = 0; i < count; i++) if (pairMultiplicities[i] === 1) found++
  insertRoot(scaleByPowerOfTwo(largest, k), 1)
  insertPair(count)
  return found
}

/** e and f of the last quadratic factor (see insertLargestAndFactor). */
const factor = new Float64Array(2)

/**
 * Three real roots: Viète's form for the largest, the quadratic factor for the other two.
 * When the factor's rounding merges or loses a pair that the cubic's discriminant shows to be
 * distinct and real (a pair closer than about √u at its own scale), the pair is placed at the
 * factor's centre −e/(2f), split by the separation that the discriminant gives:
 * (M − S)² = Δ₁ / ((L − M)(L − S))² ≈ Δ₁ / (L − centre)⁴.
 */
function insertVieteRoots(): void {
  const k = resolvent[VARIABLE_EXPONENT]!
  const sum1 = resolvent[SUM1]!
  const angle = resolvent[ANGLE]!
  const radius = 2 * resolvent[GAMMA]! // γ = √(γβ) in this branch
  // cos θ, cos(θ + 2π/3) = −cos(π/3 − θ); θ ∈ [0, π/3]
  const largest = sum1 >= 0 ? (sum1 + radius * Math.cos(angle)) / 3 : (sum1 - radius * Math.cos(Math.PI / 3 - angle)) / 3
  if (insertLargestAndFactor(largest) === 2) return
  assembledCount = 0
  insertRoot(scaleByPowerOfTwo(largest, k), 1)
  const centre = scaleByPowerOfTwo(-factor[0]! / (2 * factor[1]!), -k)
  const gap = largest - centre
  const a = resolvent[SCALED_A]!
  const halfSeparation = (0.5 * Math.sqrt(resolvent[DISCRIMINANT_TIMES_THREE]! / (3 * a * a * a * a))) / (gap * gap)
  insertRoot(scaleByPowerOfTwo(centre - halfSeparation, k), 1)
  insertRoot(scaleByPowerOfTwo(centre + halfSeparation, k), 1)
}

/**
 * The discriminant is zero within its bound: two roots (or a complex pair) are within
 * rounding of each other at the scale of the largest root. Two cases:
 * - the close pair is far below the largest root (|C|, |D| of the scaled cubic tiny): the
 *   largest root is simple, (s1 + 2γ)/3 with γ = β, refined on the scaled cubic, and the
 *   pair comes from the quadratic factor, which resolves it at its own scale;
 * - otherwise the cluster is at the largest root's scale: the double root is the critical
 *   point (root of p') where |p| is relatively smaller, and the simple root is s3/(double)²,
 *   a product relation.
 */
function insertDoubleRoot(): void {
  if (Math.abs(resolvent[SCALED_C]!) <= SEPARATED_PAIR_SIZE && Math.abs(resolvent[SCALED_D]!) <= SEPARATED_PAIR_SIZE) {
    insertLargestAndFactor(refineScaledRoot((resolvent[SUM1]! + 2 * resolvent[GAMMA]!) / 3))
    return
  }
  const droppedBefore = takeDroppedMultiplicity()
  const a = coefficients[A]!
  const b = coefficients[B]!
  const c = coefficients[C]!
  // p' = 3a·t² + 2b·t + c (exact products for dyadic coefficients), or p'/4 where 3a or 2b could overflow
  const count = Math.abs(a) < CRITICAL_POINT_LIMIT && Math.abs(b) < CRITICAL_POINT_LIMIT
    ? writeQuadraticLikeRoots(3 * a, 2 * b, c, pairRoots, 0, undefined)
    : writeQuadraticLikeRoots(0.75 * a, 0.5 * b, 0.25 * c, pairRoots, 0, undefined)
  takeDroppedMultiplicity() // a critical point beyond the range is no root of p
  noteDroppedRoot(droppedBefore)
  if (count <= 0) {
    insertTripleRoot()
    return
  }
  let double = pairRoots[0]!
  if (count === 2 && relativeResidual(pairRoots[1]!) < relativeResidual(double)) double = pairRoots[1]!
  insertRoot(double, 2)
  const e = exponentOf(double)
  const mantissa = scaleByPowerOfTwo(double, -e)
  insertRoot(productRoot(1 / (mantissa * mantissa), 2 * e), 1)
}

/**
 * At most MAX_NEWTON_STEPS Newton steps for a root u of the scaled cubic A·u³ + B·u² + C·u + D
 * (|u| ≈ 1 there, so no range issue even where the root in t overflows), each kept only when
 * the compensated |p| decreases.
 */
function refineScaledRoot(start: number): number {
  const a = resolvent[SCALED_A]!
  const b = resolvent[SCALED_B]!
  const c = resolvent[SCALED_C]!
  const d = resolvent[SCALED_D]!
  let u = start
  let value = evaluateCubicCompensated(a, b, c, d, u)
  for (let step = 0; step < MAX_NEWTON_STEPS && value !== 0; step++) {
    const next = u - value / ((3 * a * u + 2 * b) * u + c)
    const nextValue = evaluateCubicCompensated(a, b, c, d, next)
    if (!(Math.abs(nextValue) < Math.abs(value))) break
    u = next
    value = nextValue
  }
  return u
}

/** A triple root: −b/(3a), from the scaled cubic where b is the dominant coefficient. */
function insertTripleRoot(): void {
  insertRoot(scaleByPowerOfTwo(-resolvent[SCALED_B]! / (3 * resolvent[SCALED_A]!), resolvent[VARIABLE_EXPONENT]!), 3)
}

/** Stages 2–5 for a ≠ 0 and d ≠ 0: fills the assembled list, polishing the roots in [lower, upper]. */
function assembleCubicRoots(a: number, b: number, c: number, d: number, lower: number, upper: number): void {
  if (isModerateCubic(a, b, c, d)) {
    coefficients[A] = a
    coefficients[B] = b
    coefficients[C] = c
    coefficients[D] = d
    exponentsKnown = false // found only if a rare step needs them
    directCoefficients = true // moderate coefficients are within the direct window
  } else {
    prepareCoefficients(a, b, c, d)
  }
  const branch = classifyCubic(a, b, c, d)
  computeResolvent(branch)
  if (branch === ONE_REAL_ROOT) insertCardanoRoot()
  else if (branch === THREE_REAL_ROOTS) insertVieteRoots()
  else if (branch === DOUBLE_ROOT) insertDoubleRoot()
  else insertTripleRoot()
  polishAssembled(lower, upper)
}

/**
 * Stage 1 and the rest: fills the assembled list for any finite coefficients, polishing the
 * simple roots in [lower, upper]. Returns the number of roots, or −1 when the polynomial is
 * identically zero.
 */
function assembleRoots(a: number, b: number, c: number, d: number, lower: number, upper: number): number {
  assembledCount = 0
  if (d === 0) {
    if (c === 0) {
      if (b === 0) {
        if (a === 0) return -1
        insertRoot(0, 3)
      } else {
        insertRoot(0, 2)
        if (a !== 0) insertRoot(-b / a, 1)
      }
    } else {
      insertRoot(0, 1)
      insertPair(writeQuadraticLikeRoots(a, b, c, pairRoots, 0, pairMultiplicities))
    }
  } else if (a === 0) {
    insertPair(Math.max(0, writeQuadraticLikeRoots(b, c, d, pairRoots, 0, pairMultiplicities)))
  } else {
    assembleCubicRoots(a, b, c, d, lower, upper)
  }
  return assembledCount
}

/**
 * Allocation-free cubic solver for hot loops (the ray–cubic intersection): writes the
 * distinct real roots of a·t³ + b·t² + c·t + d = 0 ascending into out[0…n) and returns n
 * (0 to 3). Same roots, same order as {@link solveCubic}.
 *
 * - multiplicities, when given, receives 1, 2 or 3 per root.
 * - Identically zero (a = b = c = d = 0, every t solves it): returns 0; the caller checks
 *   the coefficients itself when it has to tell this apart from "no root".
 * - d = 0 gives the root 0 exactly; roots beyond ±Number.MAX_VALUE are left out.
 * - Throws RangeError for a non-finite coefficient or when out has fewer than 3 slots.
 * - Allocates nothing per call; uses module-level scratch, so it is not re-entrant (JS is
 *   single-threaded per worker, which is enough).
 *
 * Accuracy: each simple root within a few ULPs times its condition number of the exact root
 * of the given double coefficients (tests/geometry/solve-cubic.test.ts measures it against a
 * 60-digit reference).
 *
 * @example
 * const roots = new Float64Array(3)
 * const n = solveCubicInto(1, -6, 11, -6, roots) // 3; roots = [1, 2, 3]
 */
export function solveCubicInto(a: number, b: number, c: number, d: number, out: Float64Array, multiplicities?: Uint8Array): number {
  return solveCubicInIntervalInto(a, b, c, d, Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY, out, multiplicities)
}

/**
 * {@link solveCubicInto} restricted to lower ≤ t ≤ upper (for a segment parameter, 0 and 1):
 * only the roots in the interval are written and only they are polished, which saves most of
 * the work when the other roots do not matter. The roots it writes are those solveCubicInto
 * gives in the interval, except that a root within 2^-20·(1 + |bound|) outside a bound may be
 * left out or kept. Throws RangeError when lower > upper or a bound is NaN, and as solveCubicInto.
 *
 * @example
 * const roots = new Float64Array(3)
 * solveCubicInIntervalInto(1, -6, 11, -6, 0, 1.5, roots) // 1; roots[0] = 1
 */
export function solveCubicInIntervalInto(
  a: number,
  b: number,
  c: number,
  d: number,
  lower: number,
  upper: number,
  out: Float64Array,
  multiplicities?: Uint8Array,
): number {
  if (!(Number.isFinite(a) && Number.isFinite(b) && Number.isFinite(c) && Number.isFinite(d))) {
    checkFiniteCoefficients('solveCubicInto', [a, b, c, d])
  }
  if (out.length < 3) throw new RangeError('solveCubicInto expects an output array with at least 3 slots')
  if (!(lower <= upper)) throw new RangeError(`solveCubicInIntervalInto expects lower ≤ upper, got ${lower} and ${upper}`)
  // polish a little beyond the bounds so that a root the polish moves across one is not lost
  const low = lower - INTERVAL_MARGIN * (1 + Math.abs(lower))
  const high = upper + INTERVAL_MARGIN * (1 + Math.abs(upper))
  const count = assembleRoots(a, b, c, d, low, high)
  let written = 0
  for (let i = 0; i < count; i++) {
    const t = assembled[i]!
    if (t < lower || t > upper) continue
    out[written] = t
    if (multiplicities !== undefined) multiplicities[written] = assembledMultiplicities[i]!
    written++
  }
  return written
}

/**
 * Real roots of a·t³ + b·t² + c·t + d = 0, shaped as POST /api/v1/solve/cubic answers.
 *
 * - degree: the index of the highest non-zero coefficient, less the multiplicity of real
 *   roots beyond ±Number.MAX_VALUE. Such a root exists only when the leading coefficient is
 *   negligible against the others (|root| ≤ 1 + max|coefficient/a| by Cauchy's bound, so
 *   it needs |a| < max(|b|, |c|, |d|)/Number.MAX_VALUE); it is left out and the degree drops:
 *   the criterion for dropping a negligible leading coefficient. The finite roots are still
 *   those of the full cubic. A huge root that is representable (say 1e20 when a = 1e-20) is
 *   reported and the degree stays 3.
 * - identicallyZero: all four coefficients are 0 (then degree 0 and no roots).
 * - discriminant: 18abcd − 4b³d + b²c² − 4ac³ − 27a²d² for degree 3, c² − 4bd of the quadratic
 *   b·t² + c·t + d for degree 2, else null. Computed on scaled coefficients (from error-free
 *   products when near zero) so it overflows only when its true value does; beyond the double
 *   range it is null, since JSON carries no Infinity. For tiny coefficients it may underflow to
 *   0 while the roots are distinct: the multiplicities, not its sign, are authoritative.
 * - roots: distinct real roots ascending, each once with its multiplicity; a double or triple
 *   root when the discriminant is zero within its computed rounding-error bound. When d = 0
 *   the root 0 is exactly 0. Two roots that round to the same double are merged.
 *
 * Throws RangeError for a non-finite coefficient (untrusted input is validated before).
 * Accuracy: as {@link solveCubicInto}.
 *
 * @example
 * solveCubic(1, 0, 6, -20) // Cardano's cube and six things equal twenty: roots [{ t: 2, multiplicity: 1 }]
 */
export function solveCubic(a: number, b: number, c: number, d: number): CubicSolution {
  checkFiniteCoefficients('solveCubic', [a, b, c, d])
  takeDroppedMultiplicity()
  const count = assembleRoots(a, b, c, d, Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY)
  const roots = collectRoots(assembled, assembledMultiplicities, count)
  const exactDegree = a !== 0 ? 3 : b !== 0 ? 2 : c !== 0 ? 1 : 0
  const degree = Math.max(0, exactDegree - takeDroppedMultiplicity()) as 0 | 1 | 2 | 3
  let discriminant: number | null = null
  if (degree === 3) discriminant = cubicDiscriminant(a, b, c, d)
  else if (degree === 2) discriminant = quadraticDiscriminant(b, c, d)
  return { degree, identicallyZero: count < 0, discriminant, roots }
}
