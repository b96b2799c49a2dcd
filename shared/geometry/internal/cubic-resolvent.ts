/**
 * The closed-form stage of the cubic solver: scaling by powers of two, the discriminant with
 * its rounding-error bound, and the resolvent quantities γ and β of Cardano's formula.
 *
 * Notation (standard algebra): the roots α1, α2, α3 of a·t³ + b·t² + c·t + d have the
 * elementary symmetric functions s1 = −b/a, s2 = c/a, s3 = −d/a. With ω a primitive cube
 * root of unity, γ = α1 + ω·α2 + ω²·α3 and β = α1 + ω²·α2 + ω·α3 satisfy
 *   γ·β = s1² − 3·s2,   γ³ + β³ = 2·s1³ − 9·s1·s2 + 27·s3,   (γ³ − β³)² = −27·Δ₁,
 * where Δ₁ = ∏(αi − αj)² is the discriminant of the monic cubic, and α1 = (s1 + γ + β)/3.
 * So γ³ and β³ are the roots of z² − (γ³ + β³)·z + (γ·β)³: Cardano's formula when they are
 * real (Δ₁ < 0, one real root), the trigonometric form of Viète when they are complex
 * conjugates (Δ₁ > 0, three real roots; then γ = √(γβ)·e^{iθ} with 3θ = atan2(√(27Δ₁), γ³ + β³)).
 *
 * The stage works on a "scaled cubic" A·u³ + B·u² + C·u + D: the coefficients themselves
 * when they lie within 2^±120 (k = 0), else the cubic in u = t / 2^k divided by 2^m, with k
 * from Fujiwara's root bound so that the largest root has |u| in [1/48, 2) and A ∈ [1, 2),
 * |B|, |C|, |D| < 1. Either way no intermediate can overflow, and whatever underflows is
 * negligible against the largest root. Results live in one module-level Float64Array
 * (slots below) so the hot path allocates nothing.
 */
import { UNIT_ROUNDOFF, exponentOf, productError, scaleByPowerOfTwo, sumError } from './float'

/** Branch codes returned by {@link classifyCubic}. */
export const ONE_REAL_ROOT = 1
export const THREE_REAL_ROOTS = 3
export const DOUBLE_ROOT = 2
const TRIPLE_ROOT = 4

const u = UNIT_ROUNDOFF
/**
 * Error bound of the double discriminant 4PS − R² (P = B² − 3AC, R = BC − 9AD,
 * S = C² − 3BD), relative to 4|P|₊|S|₊ + |R|₊² where |X|₊ sums the absolute values of X's
 * terms: each of P, R, S is within 3u|X|₊, so 4P̂Ŝ is within 28u|P|₊|S|₊ and R̂² within
 * 7u|R|₊², and the last subtraction adds u: 8u in all; 9u covers the bound's own rounding.
 */
export const DISCRIMINANT_DOUBLE_BOUND = 9 * u
/**
 * The same bound for the discriminant from error-free products: P, R, S are then within
 * 5u²|X|₊ (only the low-order sums round), which gives 10u² through 4PS and R², plus about
 * 4u² for the low-order sums of the final expression: 14u²; 16u² leaves margin.
 */
const DISCRIMINANT_EXACT_BOUND = 16 * u * u
/** Error bound of P = B² − 3AC from error-free products, relative to |P|₊ (5u², see above). */
const HESSIAN_EXACT_BOUND = 6 * u * u

/** Below every k that real exponents give (those are ≥ −1075 − 1023): marks b = c = d = 0. */
const NO_ROOT_EXPONENT = -3000

/**
 * The stage's results, read by the solver through the slot constants below. A Float64Array,
 * because writing a double into it allocates nothing (a module-level `let` would box it).
 */
export const resolvent = new Float64Array(14)
/** Exponent k of the variable scaling t = 2^k·u. */
export const VARIABLE_EXPONENT = 0
/** Scaled coefficients: A·u³ + B·u² + C·u + D = 2^-m · p(2^k·u) (A = a, or the mantissa of a). */
export const SCALED_A = 1
export const SCALED_B = 2
export const SCALED_C = 3
export const SCALED_D = 4
/** s1, s2, s3 of the scaled cubic (its roots are the roots of p divided by 2^k). */
export const SUM1 = 5
const SUM2 = 6
const SUM3 = 7
/** γ·β = s1² − 3·s2 of the scaled cubic. */
const GAMMA_BETA = 8
/** γ³ + β³ = 2·s1³ − 9·s1·s2 + 27·s3 of the scaled cubic. */
const GAMMA_CUBE_SUM = 9
/** 3·A⁴·Δ₁ of the scaled cubic, i.e. 4PS − R² (its sign decides the branch). */
export const DISCRIMINANT_TIMES_THREE = 10
/** One real root: γ and β (real). Three real roots: γ = √(γβ) and θ, with γ·e^{iθ} the complex γ. */
export const GAMMA = 11
export const BETA = 12
export const ANGLE = 13

/**
 * Scales p(t) = a·t³ + b·t² + c·t + d (a ≠ 0, finite) into the variables above.
 * k = max(e_b − e_a + 1, ⌈(e_c − e_a + 1)/2⌉, ⌈(e_d − e_a + 1)/3⌉) with e_x = floor(log2|x|)
 * makes |B|, |C|, |D| < 1 and at least one of them ≥ 1/8; the scaling is exact except for
 * parts below 2^-1074 of the largest term, which cannot move the largest root.
 */
function scaleCubic(a: number, b: number, c: number, d: number): void {
  const ea = exponentOf(a)
  const eb = exponentOf(b)
  const ec = exponentOf(c)
  const ed = exponentOf(d)
  let k = eb - ea + 1
  const fromC = (ec - ea + 2) >> 1
  if (fromC > k) k = fromC
  const fromD = Math.ceil((ed - ea + 1) / 3)
  if (fromD > k) k = fromD
  if (k < NO_ROOT_EXPONENT) k = 0 // b = c = d = 0: every term came from ZERO_EXPONENT
  resolvent[VARIABLE_EXPONENT] = k
  resolvent[SCALED_A] = scaleByPowerOfTwo(a, -ea)
  resolvent[SCALED_B] = scaleByPowerOfTwo(b, -ea - k)
  resolvent[SCALED_C] = scaleByPowerOfTwo(c, -ea - 2 * k)
  resolvent[SCALED_D] = scaleByPowerOfTwo(d, -ea - 3 * k)
}

/** Bounds of the moderate path (see {@link isModerateCubic}). */
const MODERATE_MAXIMUM = 2 ** 120
const MODERATE_MINIMUM = 2 ** -120

function isModerate(x: number): boolean {
  const magnitude = Math.abs(x)
  return magnitude <= MODERATE_MAXIMUM && magnitude >= MODERATE_MINIMUM
}

/**
 * True when a, d and the non-zero b, c lie within 2^±120 (the common case): then the closed
 * form can run on the coefficients unscaled (k = 0), since its products of up to four
 * coefficients and their error terms stay between 2^-540 and 2^500.
 */
export function isModerateCubic(a: number, b: number, c: number, d: number): boolean {
  return isModerate(a) && isModerate(d) && (b === 0 || isModerate(b)) && (c === 0 || isModerate(c))
}

/**
 * The solver's first stage for a ≠ 0: moderate coefficients are used unscaled (k = 0), which
 * suffices for the branch decision, its bounds and the closed form; otherwise, and whenever
 * the double-root branch needs the normalised cubic of {@link scaleCubic}, they are scaled.
 * Returns the branch, with the scaled cubic and its quantities in {@link resolvent}.
 */
export function classifyCubic(a: number, b: number, c: number, d: number): number {
  if (isModerateCubic(a, b, c, d)) {
    setUnscaledCubic(a, b, c, d)
    const branch = classifyScaledCubic(false)
    if (branch !== DOUBLE_ROOT) return branch
  }
  scaleCubic(a, b, c, d)
  return classifyScaledCubic(false)
}

/** Uses the coefficients unscaled (k = 0) as the "scaled" cubic (see {@link classifyCubic}). */
function setUnscaledCubic(a: number, b: number, c: number, d: number): void {
  resolvent[VARIABLE_EXPONENT] = 0
  resolvent[SCALED_A] = a
  resolvent[SCALED_B] = b
  resolvent[SCALED_C] = c
  resolvent[SCALED_D] = d
}

/**
 * Decides the branch of the scaled cubic from the sign of its discriminant: computed in
 * doubles with a rounding-error bound, and again from error-free products only when the
 * bound cannot decide (or always, when exactAlways). Zero within the bound is a multiple
 * root: triple when B² − 3AC is also zero within its bound. Sets SUM1…SUM3, GAMMA_BETA,
 * GAMMA_CUBE_SUM and DISCRIMINANT_TIMES_THREE.
 */
function classifyScaledCubic(exactAlways: boolean): number {
  const a = resolvent[SCALED_A]!
  const b = resolvent[SCALED_B]!
  const c = resolvent[SCALED_C]!
  const d = resolvent[SCALED_D]!
  const reciprocal = 1 / a
  const s1 = -b * reciprocal
  const s2 = c * reciprocal
  const s3 = -d * reciprocal
  resolvent[SUM1] = s1
  resolvent[SUM2] = s2
  resolvent[SUM3] = s3
  resolvent[GAMMA_CUBE_SUM] = (2 * s1 * s1 - 9 * s2) * s1 + 27 * s3
  const bb = b * b
  const ac = a * c
  const bc = b * c
  const ad = a * d
  const cc = c * c
  const bd = b * d
  const p = bb - 3 * ac
  const r = bc - 9 * ad
  const s = cc - 3 * bd
  const pSize = bb + 3 * Math.abs(ac)
  const size = 4 * pSize * (cc + 3 * Math.abs(bd)) + (Math.abs(bc) + 9 * Math.abs(ad)) ** 2
  const value = 4 * p * s - r * r
  if (!exactAlways && Math.abs(value) > DISCRIMINANT_DOUBLE_BOUND * size) {
    resolvent[GAMMA_BETA] = p * reciprocal * reciprocal
    resolvent[DISCRIMINANT_TIMES_THREE] = value
    return value > 0 ? THREE_REAL_ROOTS : ONE_REAL_ROOT
  }
  // Near a multiple root: P, R, S and 4PS − R² from error-free products.
  const pHigh = twoTermDifference(bb, productError(b, b, bb), 3, ac, productError(a, c, ac))
  const pLow = differenceLow[0]!
  const rHigh = twoTermDifference(bc, productError(b, c, bc), 9, ad, productError(a, d, ad))
  const rLow = differenceLow[0]!
  const sHigh = twoTermDifference(cc, productError(c, c, cc), 3, bd, productError(b, d, bd))
  const sLow = differenceLow[0]!
  const ps = pHigh * sHigh
  const psLow = productError(pHigh, sHigh, ps) + (pHigh * sLow + pLow * sHigh)
  const rr = rHigh * rHigh
  const rrLow = productError(rHigh, rHigh, rr) + 2 * rHigh * rLow
  const high = 4 * ps - rr
  const exact = high + (sumError(4 * ps, -rr, high) + 4 * psLow - rrLow)
  const hessian = pHigh + pLow
  resolvent[GAMMA_BETA] = hessian * reciprocal * reciprocal
  resolvent[DISCRIMINANT_TIMES_THREE] = exact
  if (Math.abs(exact) > DISCRIMINANT_EXACT_BOUND * size) return exact > 0 ? THREE_REAL_ROOTS : ONE_REAL_ROOT
  return hessian > HESSIAN_EXACT_BOUND * pSize ? DOUBLE_ROOT : TRIPLE_ROOT
}

/** Low part left by {@link twoTermDifference} in slot 0. */
const differenceLow = new Float64Array(1)

/**
 * x − factor·y as high + low (returns high, leaves low in differenceLow), where x = xHigh + xLow
 * and y = yHigh + yLow are exact products and factor is a small integer (3 or 9).
 */
function twoTermDifference(xHigh: number, xLow: number, factor: number, yHigh: number, yLow: number): number {
  const scaled = factor * yHigh
  const scaledLow = productError(factor, yHigh, scaled) + factor * yLow
  const high = xHigh - scaled
  const low = sumError(xHigh, -scaled, high) + xLow - scaledLow
  const sum = high + low
  differenceLow[0] = low - (sum - high)
  return sum
}

/**
 * Computes γ and β (one real root) or θ (three real roots) after {@link classifyScaledCubic}.
 * In the one-real-root branch γ³ is the root of z² − (γ³+β³)z + (γβ)³ of larger magnitude,
 * (γ³+β³ + sign·√(−27Δ₁))/2 with the sign of γ³+β³ so nothing cancels, γ its real cube
 * root, and β = γβ/γ from the product relation (γ ≠ 0 there since Δ₁ ≠ 0).
 */
export function computeResolvent(branch: number): void {
  const a = resolvent[SCALED_A]!
  const aSquared = a * a
  const cubeSum = resolvent[GAMMA_CUBE_SUM]!
  const product = resolvent[GAMMA_BETA]!
  const discriminant = resolvent[DISCRIMINANT_TIMES_THREE]!
  if (branch === ONE_REAL_ROOT) {
    const root = (3 * Math.sqrt(-discriminant)) / aSquared
    const gamma = Math.cbrt(cubeSum >= 0 ? 0.5 * (cubeSum + root) : 0.5 * (cubeSum - root))
    resolvent[GAMMA] = gamma
    resolvent[BETA] = product / gamma
    resolvent[ANGLE] = 0
  } else if (branch === THREE_REAL_ROOTS) {
    resolvent[ANGLE] = Math.atan2((3 * Math.sqrt(discriminant)) / aSquared, cubeSum) / 3
    const modulus = Math.sqrt(product > 0 ? product : 0)
    resolvent[GAMMA] = modulus
    resolvent[BETA] = modulus
  } else {
    // multiple root: γ³ = β³ = (γ³ + β³)/2
    const gamma = Math.cbrt(0.5 * cubeSum)
    resolvent[GAMMA] = gamma
    resolvent[BETA] = gamma
    resolvent[ANGLE] = 0
  }
}

/**
 * γ + β without cancellation (one-real-root branch): when γβ < 0 the two have opposite signs
 * and the sum is taken as (γ³ + β³)/(γ² − γβ + β²), whose denominator is then a sum of
 * positive terms.
 */
export function gammaPlusBeta(): number {
  const gamma = resolvent[GAMMA]!
  const beta = resolvent[BETA]!
  const product = resolvent[GAMMA_BETA]!
  if (product >= 0) return gamma + beta
  return resolvent[GAMMA_CUBE_SUM]! / (gamma * gamma - product + beta * beta)
}

/**
 * p's discriminant 18abcd − 4b³d + b²c² − 4ac³ − 27a²d² for a ≠ 0 without needless overflow.
 * When the scaled cubic holds every coefficient exactly it is (4PS − R²)/3 there, from
 * error-free products, scaled back by 2^(4e_a + 6k); when a coefficient underflowed in that
 * scaling (roots spread over more than the double range) the five terms are summed from
 * mantissas and exponents instead. Returns null when it lies beyond the double range (JSON
 * carries no Infinity); it may underflow to 0 when the coefficients are tiny.
 */
export function cubicDiscriminant(a: number, b: number, c: number, d: number): number | null {
  if (b === 0 && c === 0 && d === 0) return 0
  scaleCubic(a, b, c, d)
  let value: number
  if (isScaledExactly(b, resolvent[SCALED_B]!) && isScaledExactly(c, resolvent[SCALED_C]!) && isScaledExactly(d, resolvent[SCALED_D]!)) {
    classifyScaledCubic(true)
    value = scaleByPowerOfTwo(resolvent[DISCRIMINANT_TIMES_THREE]! / 3, 4 * exponentOf(a) + 6 * resolvent[VARIABLE_EXPONENT]!)
  } else {
    value = sumDiscriminantTerms(a, b, c, d)
  }
  return Number.isFinite(value) ? value : null
}

/** True when the scaled value kept every bit of the original (zero, or a normal double). */
function isScaledExactly(original: number, scaled: number): boolean {
  return original === 0 || Math.abs(scaled) >= 2 ** -1022
}

/** Mantissas and exponents of the coefficients for {@link sumDiscriminantTerms}. */
const termMantissas = new Float64Array(5)
const termExponents = new Float64Array(5)

/** The five terms of the discriminant as mantissa·2^exponent, summed at the largest exponent. */
function sumDiscriminantTerms(a: number, b: number, c: number, d: number): number {
  const ea = exponentOf(a)
  const eb = exponentOf(b)
  const ec = exponentOf(c)
  const ed = exponentOf(d)
  const ma = scaleByPowerOfTwo(a, -ea)
  const mb = b === 0 ? 0 : scaleByPowerOfTwo(b, -eb)
  const mc = c === 0 ? 0 : scaleByPowerOfTwo(c, -ec)
  const md = d === 0 ? 0 : scaleByPowerOfTwo(d, -ed)
  termMantissas[0] = 18 * ma * mb * mc * md
  termExponents[0] = ea + eb + ec + ed
  termMantissas[1] = -4 * mb * mb * mb * md
  termExponents[1] = 3 * eb + ed
  termMantissas[2] = mb * mb * mc * mc
  termExponents[2] = 2 * eb + 2 * ec
  termMantissas[3] = -4 * ma * mc * mc * mc
  termExponents[3] = ea + 3 * ec
  termMantissas[4] = -27 * ma * ma * md * md
  termExponents[4] = 2 * ea + 2 * ed
  let top = -Infinity
  for (let i = 0; i < 5; i++) if (termMantissas[i] !== 0 && termExponents[i]! > top) top = termExponents[i]!
  if (top === -Infinity) return 0
  let sum = 0
  for (let i = 0; i < 5; i++) if (termMantissas[i] !== 0) sum += scaleByPowerOfTwo(termMantissas[i]!, termExponents[i]! - top)
  return scaleByPowerOfTwo(sum, top)
}

/** The solver's intermediate quantities for one cubic, unscaled back to t (for tests). */
export interface CubicResolventTerms {
  readonly branch: 'one-real' | 'three-real' | 'double' | 'triple'
  readonly s1: number
  readonly s2: number
  readonly s3: number
  /** γ·β as the solver computed it (meant to equal s1² − 3·s2). */
  readonly gammaBeta: number
  /** γ³ + β³ as the solver computed it (meant to equal 2s1³ − 9s1s2 + 27s3). */
  readonly gammaCubeSum: number
  /** Δ₁ = ∏(αi − αj)² of the monic cubic, from the solver's discriminant. */
  readonly monicDiscriminant: number
  /** γ and β as complex numbers [re, im]; α = (s1 + γ + β)/3 is one of the roots. */
  readonly gamma: readonly [number, number]
  readonly beta: readonly [number, number]
}

/**
 * Internal, for tests: runs the solver's own scaling, classification and resolvent stage on
 * a·t³ + b·t² + c·t + d (a ≠ 0; moderate coefficients so the unscaled values are finite)
 * and returns the quantities in the variable t. Allocates; not for hot loops.
 */
export function cubicResolventTerms(a: number, b: number, c: number, d: number): CubicResolventTerms {
  if (a === 0 || !Number.isFinite(a + b + c + d)) throw new RangeError('cubicResolventTerms expects finite coefficients with a ≠ 0')
  const branch = classifyCubic(a, b, c, d)
  computeResolvent(branch)
  const k = resolvent[VARIABLE_EXPONENT]!
  const up = (slot: number, power: number): number => scaleByPowerOfTwo(resolvent[slot]!, power * k)
  const modulus = up(GAMMA, 1)
  const angle = resolvent[ANGLE]!
  const gamma: [number, number] = branch === THREE_REAL_ROOTS ? [modulus * Math.cos(angle), modulus * Math.sin(angle)] : [modulus, 0]
  const beta: [number, number] = branch === THREE_REAL_ROOTS ? [gamma[0], -gamma[1]] : [up(BETA, 1), 0]
  const names = { [ONE_REAL_ROOT]: 'one-real', [THREE_REAL_ROOTS]: 'three-real', [DOUBLE_ROOT]: 'double', [TRIPLE_ROOT]: 'triple' } as const
  const a4 = resolvent[SCALED_A]! ** 4
  return {
    branch: names[branch as 1 | 2 | 3 | 4],
    s1: up(SUM1, 1),
    s2: up(SUM2, 2),
    s3: up(SUM3, 3),
    gammaBeta: up(GAMMA_BETA, 2),
    gammaCubeSum: up(GAMMA_CUBE_SUM, 3),
    monicDiscriminant: scaleByPowerOfTwo(resolvent[DISCRIMINANT_TIMES_THREE]! / (3 * a4), 6 * k),
    gamma,
    beta,
  }
}
