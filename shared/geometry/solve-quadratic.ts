/**
 * Real roots of a·t² + b·t + c = 0 in the numerically stable closed form, for coefficients
 * anywhere in the double range.
 *
 * Stages: exact zero coefficients first (a = 0 is linear, c = 0 gives the root 0 exactly);
 * coefficients outside [2^-400, 2^400] are scaled by powers of two so that b² and 4ac can
 * neither overflow nor underflow; the discriminant is compared with its rounding-error bound
 * and recomputed from error-free products only when the double value cannot decide its sign;
 * the roots come from q = −(b + sign(b)·√(b² − 4ac))/2 as q/a and c/q, never from a
 * difference of like signs (Forsythe, "How do you solve a quadratic equation?", 1966).
 */
import type { CubicSolution, Root } from './types'
import { UNIT_ROUNDOFF, exponentOf, productError, scaleByPowerOfTwo, sumError } from './internal/float'

/**
 * Bound on the error of the double discriminant B² − 4·P (P the product a·c, both scaled),
 * relative to B² + 4|P|: one rounding each in B², the product and the difference gives
 * 2u(1 + u); 3u also covers the rounding of the bound itself.
 */
const DISCRIMINANT_DOUBLE_BOUND = 3 * UNIT_ROUNDOFF
/**
 * The same bound for the discriminant from error-free products: the low parts are exact and
 * only the two additions of the low-order sum round, 2u·2u(B² + 4|P|); 5u² adds margin.
 */
const DISCRIMINANT_EXACT_BOUND = 5 * UNIT_ROUNDOFF * UNIT_ROUNDOFF
/** Coefficients with exponents in ±400 need no scaling: b², 4ac and their error terms stay within 2^±900. */
const SAFE_MAGNITUDE = 2 ** 400
const SAFE_MINIMUM = 2 ** -400

/**
 * Scratch state (a Float64Array, so writing a double allocates nothing): after
 * {@link scaleQuadratic}, b = B·2^j and a·c = P·2^2j up to the rounding of P, which is
 * mantissaA·mantissaC·2^shift, with |B| < 2, |P| < 8 and at least one of |B|, |P| ≥ 1;
 * a = mantissaA·2^ea, c = mantissaC·2^ec.
 */
const state = new Float64Array(10)
const SCALED_B = 0
const PRODUCT = 1
const PRODUCT_SHIFT = 2
const SCALE_EXPONENT = 3
const MANTISSA_A = 4
const EXPONENT_A = 5
const MANTISSA_C = 6
const EXPONENT_C = 7
const DISCRIMINANT_HIGH = 8
const DISCRIMINANT_LOW = 9

/** True when a, c and b (unless 0) lie within 2^±400, where no scaling is needed. */
function needsNoScaling(a: number, b: number, c: number): boolean {
  const absA = Math.abs(a)
  const absB = Math.abs(b)
  const absC = Math.abs(c)
  return absA < SAFE_MAGNITUDE && absA > SAFE_MINIMUM && absC < SAFE_MAGNITUDE && absC > SAFE_MINIMUM &&
    absB < SAFE_MAGNITUDE && (absB > SAFE_MINIMUM || b === 0)
}

/** Fills the scaled state for a·t² + b·t + c with a, c non-zero (see {@link state}). */
function scaleQuadratic(a: number, b: number, c: number): void {
  if (needsNoScaling(a, b, c)) {
    storeScaling(b, a, 0, c, 0, 0)
    return
  }
  const ea = exponentOf(a)
  const ec = exponentOf(c)
  const eb = exponentOf(b)
  const half = (ea + ec) >> 1
  const j = eb > half ? eb : half
  storeScaling(scaleByPowerOfTwo(b, -j), scaleByPowerOfTwo(a, -ea), ea, scaleByPowerOfTwo(c, -ec), ec, j)
}

/** Writes the state for a = mantissaA·2^ea, c = mantissaC·2^ec and b = scaledB·2^j. */
function storeScaling(scaledB: number, mantissaA: number, ea: number, mantissaC: number, ec: number, j: number): void {
  const shift = ea + ec - 2 * j
  state[SCALED_B] = scaledB
  state[PRODUCT] = scaleByPowerOfTwo(mantissaA * mantissaC, shift)
  state[PRODUCT_SHIFT] = shift
  state[SCALE_EXPONENT] = j
  state[MANTISSA_A] = mantissaA
  state[EXPONENT_A] = ea
  state[MANTISSA_C] = mantissaC
  state[EXPONENT_C] = ec
}

/**
 * Sign of the scaled discriminant B² − 4P: 1, −1, or 0 when it is zero within its
 * rounding-error bound; the value is left in DISCRIMINANT_HIGH + DISCRIMINANT_LOW.
 */
function scaledDiscriminantSign(exactAlways: boolean): number {
  const b = state[SCALED_B]!
  const fourProduct = 4 * state[PRODUCT]!
  const square = b * b
  const size = square + Math.abs(fourProduct)
  const high = square - fourProduct
  state[DISCRIMINANT_HIGH] = high
  state[DISCRIMINANT_LOW] = 0
  if (!exactAlways && Math.abs(high) > DISCRIMINANT_DOUBLE_BOUND * size) return high > 0 ? 1 : -1
  const mantissaA = state[MANTISSA_A]!
  const mantissaC = state[MANTISSA_C]!
  const productLow = scaleByPowerOfTwo(productError(mantissaA, mantissaC, mantissaA * mantissaC), state[PRODUCT_SHIFT]!)
  const low = sumError(square, -fourProduct, high) + productError(b, b, square) - 4 * productLow
  const sum = high + low
  state[DISCRIMINANT_HIGH] = sum
  state[DISCRIMINANT_LOW] = low - (sum - high)
  if (Math.abs(sum) <= DISCRIMINANT_EXACT_BOUND * size) return 0
  return sum > 0 ? 1 : -1
}

/** Multiplicity of the roots left out for lying beyond the double range, since the last reset. */
let droppedMultiplicity = 0

/** Returns how many roots (with multiplicity) were left out as infinite since the last call, and resets. */
export function takeDroppedMultiplicity(): number {
  const dropped = droppedMultiplicity
  droppedMultiplicity = 0
  return dropped
}

/** How many roots (with multiplicity) were left out as infinite since the last reset, without resetting. */
export function peekDroppedMultiplicity(): number {
  return droppedMultiplicity
}

/** Counts a root left out for lying beyond the double range (see {@link takeDroppedMultiplicity}). */
export function noteDroppedRoot(multiplicity: number): void {
  droppedMultiplicity += multiplicity
}

/** Stores one finite root (−0 as +0); returns 1, or 0 for a root beyond the double range. */
function writeRoot(t: number, multiplicity: number, out: Float64Array, at: number, multiplicities: Uint8Array | undefined): number {
  if (t === Number.POSITIVE_INFINITY || t === Number.NEGATIVE_INFINITY) {
    droppedMultiplicity += multiplicity
    return 0
  }
  out[at] = t + 0
  if (multiplicities !== undefined) multiplicities[at] = multiplicity
  return 1
}

/**
 * Writes the distinct real roots of a·t² + b·t + c ascending into out[offset…] and their
 * multiplicities into multiplicities[offset…] (if given); returns how many (0, 1 or 2).
 * Internal: no argument checks. Expects finite a ≠ 0 and c ≠ 0. Roots beyond the double
 * range are left out; a root below it comes out as its rounded value (possibly 0).
 */
export function writeQuadraticRoots(a: number, b: number, c: number, out: Float64Array, offset: number, multiplicities: Uint8Array | undefined): number {
  if (needsNoScaling(a, b, c)) {
    // the common case, no scaling: decided by the double discriminant when its bound allows
    const square = b * b
    const fourProduct = 4 * (a * c)
    const high = square - fourProduct
    const bound = DISCRIMINANT_DOUBLE_BOUND * (square + Math.abs(fourProduct))
    if (high < -bound) return 0
    if (high > bound) return writeStablePair(b, Math.sqrt(high), a, c, 0, 0, out, offset, multiplicities)
  }
  return writeScaledQuadraticRoots(a, b, c, out, offset, multiplicities)
}

/**
 * The two roots q/a and c/q with q = −(B + sign(B)·root)/2, where b = B·2^j, root is √(b² − 4ac)
 * scaled alike, a = mantissaA·2^(j − shiftA) and c = mantissaC·2^(j + shiftC): written ascending,
 * merged into a double root when they round to the same double.
 */
function writeStablePair(
  scaledB: number, root: number, mantissaA: number, mantissaC: number, shiftA: number, shiftC: number,
  out: Float64Array, offset: number, multiplicities: Uint8Array | undefined,
): number {
  const q = scaledB >= 0 ? -0.5 * (scaledB + root) : 0.5 * (root - scaledB)
  const first = scaleByPowerOfTwo(q / mantissaA, shiftA)
  const second = scaleByPowerOfTwo(mantissaC / q, shiftC)
  const low = first < second ? first : second
  const top = first < second ? second : first
  if (low === top) return writeRoot(low, 2, out, offset, multiplicities)
  const count = writeRoot(low, 1, out, offset, multiplicities)
  return count + writeRoot(top, 1, out, offset + count, multiplicities)
}

/** {@link writeQuadraticRoots} with scaling and, near a double root, error-free products. */
function writeScaledQuadraticRoots(a: number, b: number, c: number, out: Float64Array, offset: number, multiplicities: Uint8Array | undefined): number {
  scaleQuadratic(a, b, c)
  const sign = scaledDiscriminantSign(false)
  if (sign < 0) return 0
  const scaledB = state[SCALED_B]!
  const mantissaA = state[MANTISSA_A]!
  const j = state[SCALE_EXPONENT]!
  const ea = state[EXPONENT_A]!
  if (sign === 0) return writeRoot(scaleByPowerOfTwo(-scaledB / (2 * mantissaA), j - ea), 2, out, offset, multiplicities)
  const high = state[DISCRIMINANT_HIGH]!
  const rootHigh = Math.sqrt(high)
  const root = rootHigh + state[DISCRIMINANT_LOW]! / (2 * rootHigh)
  return writeStablePair(scaledB, root, mantissaA, state[MANTISSA_C]!, j - ea, state[EXPONENT_C]! - j, out, offset, multiplicities)
}

/**
 * Roots of a·t² + b·t + c including the exact zero cases (a = 0: linear; c = 0: the root 0
 * exactly), the shared body of {@link solveQuadraticInto} and the cubic solver. Internal: no
 * argument checks. Returns −1 when every t is a root (a = b = c = 0).
 */
export function writeQuadraticLikeRoots(a: number, b: number, c: number, out: Float64Array, offset: number, multiplicities: Uint8Array | undefined): number {
  if (a === 0) {
    if (b === 0) return c === 0 ? -1 : 0
    return writeRoot(c === 0 ? 0 : -c / b, 1, out, offset, multiplicities)
  }
  if (c === 0) {
    if (b === 0) return writeRoot(0, 2, out, offset, multiplicities)
    const other = -b / a
    if (other === 0) return writeRoot(0, 2, out, offset, multiplicities) // −b/a underflowed
    const first = writeRoot(other < 0 ? other : 0, 1, out, offset, multiplicities)
    return first + writeRoot(other < 0 ? 0 : other, 1, out, offset + first, multiplicities)
  }
  return writeQuadraticRoots(a, b, c, out, offset, multiplicities)
}

/** Throws RangeError naming the caller when a coefficient is not a finite number. */
export function checkFiniteCoefficients(name: string, values: readonly number[]): void {
  for (const value of values) {
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      throw new RangeError(`${name} expects finite numbers as coefficients, got ${String(value)}`)
    }
  }
}

/**
 * Allocation-free quadratic solver for hot loops: writes the distinct real roots of
 * a·t² + b·t + c = 0 ascending into out[0…n) and returns n (0, 1 or 2).
 *
 * - multiplicities, when given, receives 1 or 2 per root (2 for a double root, reported
 *   once, when b² − 4ac is zero within its rounding-error bound).
 * - a = 0 solves the linear equation; c = 0 gives the root 0 exactly.
 * - Identically zero (a = b = c = 0): returns 0; the caller checks the coefficients itself.
 * - A root beyond ±Number.MAX_VALUE (a negligible against b) is left out.
 * - Throws RangeError for a non-finite coefficient or when out has fewer than 2 slots.
 *
 * Accuracy: each simple root within a few ULPs times its condition number (tested against
 * a 60-digit reference in tests/geometry/solve-quadratic.test.ts).
 *
 * @example
 * const roots = new Float64Array(2)
 * solveQuadraticInto(1, -3, 2, roots) // 2; roots = [1, 2]
 */
export function solveQuadraticInto(a: number, b: number, c: number, out: Float64Array, multiplicities?: Uint8Array): number {
  if (!(Number.isFinite(a) && Number.isFinite(b) && Number.isFinite(c))) checkFiniteCoefficients('solveQuadraticInto', [a, b, c])
  if (out.length < 2) throw new RangeError('solveQuadraticInto expects an output array with at least 2 slots')
  const count = writeQuadraticLikeRoots(a, b, c, out, 0, multiplicities)
  return count < 0 ? 0 : count
}

/**
 * b² − 4ac without needless overflow: scaled by powers of two, from error-free products,
 * then scaled back. null when the true value lies beyond the double range (JSON carries no
 * Infinity); it may underflow to 0 for tiny coefficients.
 */
export function quadraticDiscriminant(a: number, b: number, c: number): number | null {
  if (a === 0 || c === 0) {
    const square = b * b
    return Number.isFinite(square) ? square : null
  }
  scaleQuadratic(a, b, c)
  scaledDiscriminantSign(true)
  const value = scaleByPowerOfTwo(state[DISCRIMINANT_HIGH]!, 2 * state[SCALE_EXPONENT]!)
  return Number.isFinite(value) ? value : null
}

/** Root objects for the first count entries (none for count ≤ 0). */
export function collectRoots(values: Float64Array, multiplicities: Uint8Array, count: number): Root[] {
  const roots: Root[] = []
  for (let i = 0; i < count; i++) roots.push({ t: values[i]!, multiplicity: multiplicities[i] as 1 | 2 | 3 })
  return roots
}

const quadraticRoots = new Float64Array(2)
const quadraticMultiplicities = new Uint8Array(2)

/**
 * Real roots of a·t² + b·t + c = 0 in the shape of the API's cubic answer (degree ≤ 2).
 *
 * - degree: index of the highest non-zero coefficient, less the multiplicity of the real
 *   roots beyond ±Number.MAX_VALUE (a leading coefficient that small against the others is
 *   negligible and dropped; the remaining root is still the quadratic's).
 * - identicallyZero: a = b = c = 0.
 * - discriminant: b² − 4ac for degree 2 (see {@link quadraticDiscriminant}), else null.
 * - roots: distinct real roots ascending; a double root once with multiplicity 2.
 *
 * Throws RangeError for a non-finite coefficient.
 *
 * @example
 * solveQuadratic(1, -2, 1) // { degree: 2, identicallyZero: false, discriminant: 0, roots: [{ t: 1, multiplicity: 2 }] }
 */
export function solveQuadratic(a: number, b: number, c: number): CubicSolution {
  checkFiniteCoefficients('solveQuadratic', [a, b, c])
  takeDroppedMultiplicity()
  const count = writeQuadraticLikeRoots(a, b, c, quadraticRoots, 0, quadraticMultiplicities)
  const exactDegree = a !== 0 ? 2 : b !== 0 ? 1 : 0
  const degree = (exactDegree - takeDroppedMultiplicity()) as 0 | 1 | 2
  return {
    degree,
    identicallyZero: count < 0,
    discriminant: degree === 2 ? quadraticDiscriminant(a, b, c) : null,
    roots: collectRoots(quadraticRoots, quadraticMultiplicities, count),
  }
}
