/**
 * Floating-point building blocks of the polynomial solvers: binary exponents, exact scaling
 * by powers of two, error-free transformations and a compensated Horner scheme.
 *
 * Everything here works on scalars and allocates nothing per call; the only state is the
 * module-level table of powers of two and one 8-byte view used to read exponent bits.
 */

/** Unit roundoff of IEEE-754 binary64 with rounding to nearest: 2^-53. */
export const UNIT_ROUNDOFF = 2 ** -53

/** Exponent reported by {@link exponentOf} for 0: far below every real exponent (−1074…1023). */
export const ZERO_EXPONENT = -100_000

const MIN_TABLE_EXPONENT = -1074
const MAX_TABLE_EXPONENT = 1023

/** 2^n for n in [−1074, 1023], at index n + 1074 (every entry exact). */
const POWERS_OF_TWO = new Float64Array(MAX_TABLE_EXPONENT - MIN_TABLE_EXPONENT + 1)
for (let n = MIN_TABLE_EXPONENT; n <= MAX_TABLE_EXPONENT; n++) {
  POWERS_OF_TWO[n - MIN_TABLE_EXPONENT] = 2 ** n
}

const bitsAsFloat = new Float64Array(1)
const bitsAsWords = new Uint32Array(bitsAsFloat.buffer)
bitsAsFloat[0] = 1
/** Index of the word holding sign and exponent (1 on little-endian machines). */
const HIGH_WORD = bitsAsWords[1] === 0x3ff00000 ? 1 : 0

/**
 * floor(log2 |x|) for finite non-zero x, subnormals included; {@link ZERO_EXPONENT} for ±0.
 * Reads the exponent bits, so it is exact where Math.log2 may round across a power of two.
 */
export function exponentOf(x: number): number {
  bitsAsFloat[0] = x
  const biased = (bitsAsWords[HIGH_WORD]! >>> 20) & 0x7ff
  return biased !== 0 ? biased - 1023 : subnormalExponent(x)
}

/** {@link exponentOf} below the normal range (kept apart so the common path stays small). */
function subnormalExponent(x: number): number {
  if (x === 0) return ZERO_EXPONENT
  bitsAsFloat[0] = x * 18446744073709551616 // 2^64 lifts a subnormal into the normal range
  return ((bitsAsWords[HIGH_WORD]! >>> 20) & 0x7ff) - 1023 - 64
}

/**
 * x · 2^n for any integer n, exact whenever the result is a normal double (ldexp).
 * One table multiply for |n| within the normal exponents; larger |n| in steps.
 */
export function scaleByPowerOfTwo(x: number, n: number): number {
  if (n >= -1022 && n <= MAX_TABLE_EXPONENT) return x * POWERS_OF_TWO[n - MIN_TABLE_EXPONENT]!
  return scaleByFarPowerOfTwo(x, n)
}

/** The stepwise part of {@link scaleByPowerOfTwo}: each step exact unless the result overflows or is subnormal. */
function scaleByFarPowerOfTwo(x: number, n: number): number {
  if (n > 2200) return x === 0 ? x : x * Number.POSITIVE_INFINITY
  if (n < -2200) return x * 0
  let y = x
  let k = n
  while (k > MAX_TABLE_EXPONENT) {
    y *= POWERS_OF_TWO[MAX_TABLE_EXPONENT - MIN_TABLE_EXPONENT]!
    k -= MAX_TABLE_EXPONENT
  }
  while (k < MIN_TABLE_EXPONENT) {
    y *= POWERS_OF_TWO[-1022 - MIN_TABLE_EXPONENT]!
    k += 1022
  }
  return y * POWERS_OF_TWO[k - MIN_TABLE_EXPONENT]!
}

/** Veltkamp–Dekker splitting constant 2^27 + 1 for binary64. */
export const SPLITTER = 134217729

/**
 * The rounding error of p = fl(a·b): a·b = p + productError(a, b, p) exactly (Dekker 1971,
 * "A floating-point technique for extending the available precision"). Needs |a|, |b|,
 * |p| below 2^995 so the split does not overflow, and no underflow in the partial products.
 */
export function productError(a: number, b: number, p: number): number {
  let t = SPLITTER * a
  const aHigh = t - (t - a)
  const aLow = a - aHigh
  t = SPLITTER * b
  const bHigh = t - (t - b)
  const bLow = b - bHigh
  return aLow * bLow - (((p - aHigh * bHigh) - aLow * bHigh) - aHigh * bLow)
}

/** The rounding error of s = fl(a + b): a + b = s + sumError(a, b, s) exactly (Knuth's TwoSum). */
export function sumError(a: number, b: number, s: number): number {
  const bVirtual = s - a
  return (a - (s - bVirtual)) + (b - bVirtual)
}

/**
 * a·x³ + b·x² + c·x + d by the compensated Horner scheme of Graillat, Langlois and Louvet
 * (2005, "Compensated Horner Scheme"): as accurate as Horner's rule in twice the working
 * precision, then rounded, i.e. |error| ≤ u·|p(x)| + 2·(6u)²·(|a||x|³ + |b|x² + |c||x| + |d|).
 * Same range preconditions as {@link productError} for the terms.
 */
export function evaluateCubicCompensated(a: number, b: number, c: number, d: number, x: number): number {
  let t = SPLITTER * x
  const xHigh = t - (t - x)
  const xLow = x - xHigh

  let p = a * x
  t = SPLITTER * a
  let sHigh = t - (t - a)
  let sLow = a - sHigh
  let error = sLow * xLow - (((p - sHigh * xHigh) - sLow * xHigh) - sHigh * xLow)
  let s = p + b
  let bVirtual = s - p
  error += (p - (s - bVirtual)) + (b - bVirtual)

  p = s * x
  t = SPLITTER * s
  sHigh = t - (t - s)
  sLow = s - sHigh
  let stepError = sLow * xLow - (((p - sHigh * xHigh) - sLow * xHigh) - sHigh * xLow)
  let next = p + c
  bVirtual = next - p
  stepError += (p - (next - bVirtual)) + (c - bVirtual)
  error = error * x + stepError
  s = next

  p = s * x
  t = SPLITTER * s
  sHigh = t - (t - s)
  sLow = s - sHigh
  stepError = sLow * xLow - (((p - sHigh * xHigh) - sLow * xHigh) - sHigh * xLow)
  next = p + d
  bVirtual = next - p
  stepError += (p - (next - bVirtual)) + (d - bVirtual)
  error = error * x + stepError

  return next + error
}

/** The spacing of doubles at x: 2^(exponentOf(x) − 52), and 2^-1074 at and below the normal range. */
export function ulpOf(x: number): number {
  if (!Number.isFinite(x)) return Number.NaN
  const e = exponentOf(x)
  return e - 52 < MIN_TABLE_EXPONENT ? POWERS_OF_TWO[0]! : POWERS_OF_TWO[e - 52 - MIN_TABLE_EXPONENT]!
}
