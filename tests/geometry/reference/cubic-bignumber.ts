/**
 * Slow exact twin of the cubic solver, the oracle of the tests: the real roots of
 * a·t³ + b·t² + c·t + d for the exact values of the given doubles, in mathjs BigNumber
 * arithmetic with 60 significant digits.
 *
 * Method: exact integer arithmetic (BigInt, each double being m·2^e) decides the structure,
 * i.e. the sign of the discriminant and of b² − 3ac, and whether a multiple root exists; the
 * critical points (roots of p') split the line into monotone pieces; each piece whose ends
 * differ in sign holds exactly one simple root, found by Newton's method kept inside the
 * bracket by bisection. Optional hints (for example the double solver's answers) only give
 * Newton its starting points: the bracket, not the hint, decides which root is found, so the
 * result does not depend on them, only the speed does.
 */
import { all, create } from 'mathjs'
import type { BigNumber } from 'mathjs'
import { createSeededRandom, type SeededRandom } from '../../helpers/seeded-random'

/** Significant decimal digits of the reference arithmetic. */
export const REFERENCE_DIGITS = 60
const math = create(all, { number: 'BigNumber', precision: REFERENCE_DIGITS })

export type Big = BigNumber
const ZERO = math.bignumber(0)
const TWO = math.bignumber(2)
const THREE = math.bignumber(3)
/** Newton stops when a step is below this relative size: the next error would be ~its square. */
const CONVERGED_STEP = math.bignumber(10).pow(-(REFERENCE_DIGITS / 2 + 5))
/** Enough for pure bisection from Fujiwara's bound down to 60 digits with room to spare. */
const MAX_ITERATIONS = 3000

const powersOfTwo = new Map<number, Big>()
function powerOfTwo(e: number): Big {
  let power = powersOfTwo.get(e)
  if (power === undefined) {
    power = TWO.pow(e)
    powersOfTwo.set(e, power)
  }
  return power
}

const bitsView = new DataView(new ArrayBuffer(8))

/** x = mantissa·2^exponent with an integer mantissa (exact). */
export function splitDouble(x: number): { mantissa: bigint; exponent: number } {
  if (!Number.isFinite(x)) throw new RangeError(`splitDouble expects a finite number, got ${x}`)
  if (x === 0) return { mantissa: 0n, exponent: 0 }
  bitsView.setFloat64(0, x)
  const bits = bitsView.getBigUint64(0)
  const biased = Number((bits >> 52n) & 0x7ffn)
  let mantissa = bits & 0xfffffffffffffn
  if (biased !== 0) mantissa |= 0x10000000000000n
  const exponent = (biased === 0 ? 1 : biased) - 1075
  return { mantissa: bits >> 63n ? -mantissa : mantissa, exponent }
}

/** The exact value of a double as a BigNumber (rounded to 60 digits only when it needs more). */
export function toBig(x: number): Big {
  const { mantissa, exponent } = splitDouble(x)
  return math.bignumber(mantissa.toString()).times(powerOfTwo(exponent))
}

/** An exact dyadic value: integer part times a power of two. */
interface Dyadic {
  readonly mantissa: bigint
  readonly exponent: number
}

function dyadicProduct(...factors: Dyadic[]): Dyadic {
  let mantissa = 1n
  let exponent = 0
  for (const f of factors) {
    mantissa *= f.mantissa
    exponent += f.exponent
  }
  return { mantissa, exponent }
}

/** Σ weight·term exactly; the sign of the result is exact. */
function dyadicSum(terms: readonly (readonly [bigint, Dyadic])[]): Dyadic {
  const live = terms.filter(([, t]) => t.mantissa !== 0n)
  if (live.length === 0) return { mantissa: 0n, exponent: 0 }
  const low = Math.min(...live.map(([, t]) => t.exponent))
  let mantissa = 0n
  for (const [weight, t] of live) mantissa += weight * t.mantissa * (1n << BigInt(t.exponent - low))
  return { mantissa, exponent: low }
}

function dyadicToBig(x: Dyadic): Big {
  return math.bignumber(x.mantissa.toString()).times(powerOfTwo(x.exponent))
}

function sign(x: Dyadic): number {
  return x.mantissa > 0n ? 1 : x.mantissa < 0n ? -1 : 0
}

/** Exact discriminant 18abcd − 4b³d + b²c² − 4ac³ − 27a²d² of the given doubles. */
export function exactCubicDiscriminant(a: number, b: number, c: number, d: number): Dyadic {
  const [A, B, C, D] = [a, b, c, d].map(splitDouble) as [Dyadic, Dyadic, Dyadic, Dyadic]
  return dyadicSum([
    [18n, dyadicProduct(A, B, C, D)],
    [-4n, dyadicProduct(B, B, B, D)],
    [1n, dyadicProduct(B, B, C, C)],
    [-4n, dyadicProduct(A, C, C, C)],
    [-27n, dyadicProduct(A, A, D, D)],
  ])
}

export interface ReferenceRoot {
  readonly t: Big
  readonly multiplicity: 1 | 2 | 3
}

export interface ReferenceSolution {
  /** Index of the highest non-zero coefficient (no negligibility rule: this is algebra). */
  readonly exactDegree: 0 | 1 | 2 | 3
  readonly identicallyZero: boolean
  /** Exact discriminant of the cubic (degree 3) or quadratic (degree 2), else null. */
  readonly discriminant: Big | null
  readonly discriminantSign: number | null
  /** Distinct real roots, ascending. */
  readonly roots: readonly ReferenceRoot[]
}

/** Coefficients in ascending order: p(t) = Σ coefficients[i]·t^i. */
type Ascending = readonly Big[]

function evaluate(p: Ascending, t: Big): Big {
  let value = ZERO
  for (let i = p.length - 1; i >= 0; i--) value = value.times(t).plus(p[i]!)
  return value
}

function derivative(p: Ascending): Big[] {
  return p.slice(1).map((coefficient, i) => coefficient.times(i + 1))
}

/** The unique root of p in (low, high), where p(low) has sign lowSign and p(high) the other. */
function refineInBracket(p: Ascending, low: Big, high: Big, lowSign: number, hints: readonly number[]): Big {
  const slope = derivative(p)
  let lo = low
  let hi = high
  let x = lo.plus(hi).div(TWO)
  for (const hint of hints) {
    const h = toBig(hint)
    if (h.gt(lo) && h.lt(hi)) {
      x = h
      break
    }
  }
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
    const value = evaluate(p, x)
    if (value.isZero()) return x
    if ((value.isNeg() ? -1 : 1) === lowSign) lo = x
    else hi = x
    const step = value.div(evaluate(slope, x))
    if (step.isFinite() && step.abs().lte(x.abs().times(CONVERGED_STEP))) return x.minus(step)
    let next = x.minus(step)
    if (!step.isFinite() || !(next.gt(lo) && next.lt(hi))) next = lo.plus(hi).div(TWO)
    x = next
    if (hi.minus(lo).lte(x.abs().times(CONVERGED_STEP))) return x
  }
  throw new Error(`reference root search did not converge in (${low.toString()}, ${high.toString()})`)
}

/** Real roots of a polynomial with non-zero constant and leading coefficient, degree ≤ 3. */
function rootsOfReduced(p: Ascending, q: readonly number[], hints: readonly number[]): ReferenceRoot[] {
  const degree = p.length - 1
  if (degree === 0) return []
  if (degree === 1) return [{ t: p[0]!.neg().div(p[1]!), multiplicity: 1 }]
  if (degree === 2) {
    const [c, b, a] = p as [Big, Big, Big]
    const [C, B, A] = q.map(splitDouble) as [Dyadic, Dyadic, Dyadic]
    const disc = dyadicSum([[1n, dyadicProduct(B, B)], [-4n, dyadicProduct(A, C)]])
    if (sign(disc) < 0) return []
    if (sign(disc) === 0) return [{ t: b.neg().div(a.times(2)), multiplicity: 2 }]
    const root = dyadicToBig(disc).sqrt()
    const half = b.isNeg() ? root.minus(b).div(TWO) : b.plus(root).neg().div(TWO)
    const roots = [half.div(a), c.div(half)].sort((x, y) => x.cmp(y))
    return roots.map((t) => ({ t, multiplicity: 1 as const }))
  }
  const [dq, cq, bq, aq] = q as [number, number, number, number]
  const [d, c, b, a] = p as [Big, Big, Big, Big]
  const [A, B, C, D] = [aq, bq, cq, dq].map(splitDouble) as [Dyadic, Dyadic, Dyadic, Dyadic]
  const hessian = dyadicSum([[1n, dyadicProduct(B, B)], [-3n, dyadicProduct(A, C)]])
  const cross = dyadicSum([[1n, dyadicProduct(B, C)], [-9n, dyadicProduct(A, D)]])
  if (sign(hessian) === 0 && sign(cross) === 0) return [{ t: b.neg().div(a.times(3)), multiplicity: 3 }]
  const discriminantSign = sign(exactCubicDiscriminant(aq, bq, cq, dq))
  // Fujiwara's bound: every root has |t| ≤ 2·max(|b/a|, |c/a|^(1/2), |d/(2a)|^(1/3)); ×3 instead
  // of ×2 keeps every root strictly inside the bracket
  // (maximum by Decimal's exact comparison: mathjs's max compares within a tolerance)
  const candidates = [b.div(a).abs(), c.div(a).abs().sqrt(), d.div(a.times(2)).abs().cbrt()]
  const bound = candidates.reduce((x, y) => (y.gt(x) ? y : x)).times(3)
  const leadSign = a.isNeg() ? -1 : 1
  if (sign(hessian) <= 0) return [{ t: refineInBracket(p, bound.neg(), bound, -leadSign, hints), multiplicity: 1 }]
  // critical points from the stable quadratic formula for 3a·t² + 2b·t + c
  const root = dyadicToBig(hessian).sqrt()
  const q2 = b.isNeg() ? root.minus(b) : b.plus(root).neg()
  const critical = [q2.div(a.times(THREE)), c.div(q2)].sort((x, y) => x.cmp(y)) as [Big, Big]
  const edges: Big[] = [bound.neg(), critical[0], critical[1], bound]
  const signs = edges.map((t, i) => (i === 0 ? -leadSign : i === 3 ? leadSign : evaluate(p, t).isNeg() ? -1 : 1))
  const roots: ReferenceRoot[] = []
  if (discriminantSign === 0) {
    // a double root sits at the critical point where |p| is relatively smaller; the simple
    // root lies in the outer piece beyond the other critical point
    const size = (t: Big): Big => evaluate(p.map((x) => x.abs()), t.abs())
    const relative = (t: Big): Big => evaluate(p, t).abs().div(size(t))
    const doubleIsFirst = relative(critical[0]).lt(relative(critical[1]))
    roots.push({ t: doubleIsFirst ? critical[0] : critical[1], multiplicity: 2 })
    const piece = doubleIsFirst ? 2 : 0
    roots.push({ t: refineInBracket(p, edges[piece]!, edges[piece + 1]!, signs[piece]!, hints), multiplicity: 1 })
  } else {
    for (let piece = 0; piece < 3; piece++) {
      if (signs[piece] === signs[piece + 1]) continue
      roots.push({ t: refineInBracket(p, edges[piece]!, edges[piece + 1]!, signs[piece]!, hints), multiplicity: 1 })
    }
    const expected = discriminantSign > 0 ? 3 : 1
    if (roots.length !== expected) {
      throw new Error(`reference found ${roots.length} roots where the discriminant's sign says ${expected}: ${q.join(', ')}`)
    }
  }
  return roots.sort((x, y) => x.t.cmp(y.t))
}

/**
 * The exact real roots (60 digits) of a·t³ + b·t² + c·t + d = 0 for the exact double values.
 * Roots at 0 (d = 0, c = 0, …) are exactly 0. hints only speed up the search.
 */
export function referenceCubicRoots(a: number, b: number, c: number, d: number, hints: readonly number[] = []): ReferenceSolution {
  const given = [d, c, b, a]
  let top = 3
  while (top >= 0 && given[top] === 0) top--
  const exactDegree = Math.max(0, top) as 0 | 1 | 2 | 3
  if (top < 0) return { exactDegree, identicallyZero: true, discriminant: null, discriminantSign: null, roots: [] }
  let zeros = 0
  while (given[zeros] === 0) zeros++
  const reduced = given.slice(zeros, top + 1)
  const roots = [...rootsOfReduced(reduced.map(toBig), reduced, hints)]
  if (zeros > 0) roots.push({ t: ZERO, multiplicity: zeros as 1 | 2 | 3 })
  roots.sort((x, y) => x.t.cmp(y.t))
  let discriminant: Dyadic | null = null
  if (exactDegree === 3) discriminant = exactCubicDiscriminant(a, b, c, d)
  if (exactDegree === 2) {
    const [B, C, D] = [b, c, d].map(splitDouble) as [Dyadic, Dyadic, Dyadic]
    discriminant = dyadicSum([[1n, dyadicProduct(C, C)], [-4n, dyadicProduct(B, D)]])
  }
  return {
    exactDegree,
    identicallyZero: false,
    discriminant: discriminant && dyadicToBig(discriminant),
    discriminantSign: discriminant && sign(discriminant),
    roots,
  }
}

/**
 * Relative condition number of a simple root r ≠ 0 under relative perturbations of the
 * coefficients: Σ|coefficient_i|·|r|^i / (|r|·|p'(r)|) (standard; e.g. Higham, Accuracy and
 * Stability of Numerical Algorithms, §5.3). With derivativeOrder 1 it is the same quantity
 * for r as a root of p' (the conditioning of a double root's position).
 */
export function rootCondition(coefficients: readonly number[], r: Big, derivativeOrder: 0 | 1 = 0): number {
  let p: Ascending = [...coefficients].reverse().map(toBig)
  if (derivativeOrder === 1) p = derivative(p)
  if (r.isZero()) return 0
  const size = evaluate(p.map((x) => x.abs()), r.abs())
  const slope = evaluate(derivative(p), r).abs().times(r.abs())
  if (slope.isZero()) return Number.POSITIVE_INFINITY
  return size.div(slope).toNumber()
}

/** |p(t)| / Σ|coefficient_i|·|t|^i at the double t, exactly (the backward error of t as a root). */
export function relativeResidualAt(coefficients: readonly number[], t: number, derivativeOrder: 0 | 1 = 0): number {
  let p: Ascending = [...coefficients].reverse().map(toBig)
  if (derivativeOrder === 1) p = derivative(p)
  const x = toBig(t)
  const size = evaluate(p.map((v) => v.abs()), x.abs())
  return size.isZero() ? 0 : evaluate(p, x).abs().div(size).toNumber()
}

/** |approximation − exact| in units of the last place of the double nearest to exact. */
export function ulpError(approximation: number, exact: Big, ulpOf: (x: number) => number): number {
  return toBig(approximation).minus(exact).abs().div(toBig(ulpOf(exact.toNumber()))).toNumber()
}

/** Roots of a quadratic a·t² + b·t + c for the exact doubles (the quadratic solver's oracle). */
export function referenceQuadraticRoots(a: number, b: number, c: number, hints: readonly number[] = []): ReferenceSolution {
  return referenceCubicRoots(0, a, b, c, hints)
}

/** |Δ| / Σ|terms of Δ| for the exact discriminant of the given doubles (0 when all terms vanish). */
export function relativeDiscriminant(a: number, b: number, c: number, d: number): number {
  const [A, B, C, D] = [a, b, c, d].map(splitDouble) as [Dyadic, Dyadic, Dyadic, Dyadic]
  const terms: Dyadic[] = [
    dyadicProduct({ mantissa: 18n, exponent: 0 }, A, B, C, D),
    dyadicProduct({ mantissa: 4n, exponent: 0 }, B, B, B, D),
    dyadicProduct(B, B, C, C),
    dyadicProduct({ mantissa: 4n, exponent: 0 }, A, C, C, C),
    dyadicProduct({ mantissa: 27n, exponent: 0 }, A, A, D, D),
  ].map((t) => ({ mantissa: t.mantissa < 0n ? -t.mantissa : t.mantissa, exponent: t.exponent }))
  const size = dyadicToBig(dyadicSum(terms.map((t) => [1n, t] as const)))
  if (size.isZero()) return 0
  return dyadicToBig(exactCubicDiscriminant(a, b, c, d)).abs().div(size).toNumber()
}

/**
 * How far a root r can move when every coefficient changes by at most the relative amount
 * perturbation: the nearest root of c1·h + c2·h² + c3·h³ = E (c_m = p^(m)(r)/m!, E the
 * perturbation's size at r) is within 3E/|c1|, (3E/|c2|)^(1/2) and (E/|c3|)^(1/3) (Vieta's
 * relations for that cubic in h), so within their minimum. Simple roots give the usual
 * condition-number bound; clusters of close roots the larger Hölder-type bounds.
 */
export function clusterRadius(coefficients: readonly number[], r: Big, perturbation: number): Big {
  const p: Ascending = [...coefficients].reverse().map(toBig)
  const size = evaluate(p.map((x) => x.abs()), r.abs()).times(perturbation)
  let bound: Big | null = null
  let derivativeCoefficients: Ascending = p
  for (let m = 1; m <= 3; m++) {
    derivativeCoefficients = derivative(derivativeCoefficients)
    const factorial = [1, 1, 2, 6][m]!
    const cm = evaluate(derivativeCoefficients, r).abs().div(factorial)
    if (cm.isZero()) continue
    const weight = m === 3 ? 1 : 3
    const candidate = (size.times(weight).div(cm)).pow(math.bignumber(1).div(m))
    if (bound === null || candidate.lt(bound)) bound = candidate
  }
  return bound ?? ZERO
}

/** What a solver answered, in the shape of the API (only the fields the comparison needs). */
export interface SolvedRoots {
  readonly degree: number
  readonly roots: readonly { readonly t: number; readonly multiplicity: number }[]
}

/** Acceptance limits of {@link compareWithReference}, each a documented test tolerance. */
export interface ComparisonLimits {
  /** A root's error in ULPs may be this many times max(1, its condition number). */
  readonly ulpBudget: number
  /** Where the multiplicities differ, |Δ| / Σ|terms of Δ| must be at most this. */
  readonly nearZeroDiscriminant: number
  /** Where they differ, each solver root's relative residual must be at most this. */
  readonly clusterResidual: number
  /** ... and each exact root within clusterRadius(root, this) of a solver root. */
  readonly clusterPerturbation: number
}

const UNIT_ROUNDOFF = 2 ** -53
/**
 * The limits the solver tests use:
 * - ulpBudget 4: "a few ULPs" times max(1, condition number); the solvers measure ≤ 1.8.
 * - nearZeroDiscriminant 2^-100: the cubic solver merges roots when |4PS − R²| ≤ 16u²·(4|P|₊|S|₊ + |R|₊²)
 *   on its scaled cubic, and that size is at most 5·3·Σ|terms of Δ|, so |Δ|/Σ|terms| ≤ 27u² < 2^-101
 *   there (the quadratic's 5u²·(b² + 4|ac|) is smaller still).
 * - clusterResidual 64u: a root reported for a cluster is a root of p to within rounding.
 * - clusterPerturbation 16u: the cluster radius for coefficient changes of 16u (the solver's
 *   merged roots sit within the radius for 1.6u, and radii grow at least as the cube root).
 */
export const SOLVER_LIMITS: ComparisonLimits = {
  ulpBudget: 4,
  nearZeroDiscriminant: 2 ** -100,
  clusterResidual: 64 * UNIT_ROUNDOFF,
  clusterPerturbation: 16 * UNIT_ROUNDOFF,
}

export interface Comparison {
  /** Why the answer is wrong, or null. */
  readonly failure: string | null
  /** max over compared roots of (ULP error / max(1, condition)); 0 when none compared. */
  readonly worstRatio: number
  readonly simpleRoots: number
  readonly multipleRoots: number
  /** 1 when the answer's multiplicities differ from the exact ones (allowed near Δ = 0). */
  readonly clusterCases: number
}

/**
 * Checks one answer against the exact roots: degree (the exact degree less the real roots
 * beyond the double range), finite ascending distinct roots, then either the same roots with
 * the same multiplicities within the ULP budget, or, only where the exact discriminant is zero
 * within nearZeroDiscriminant of its terms, a cluster answer: every reported root a near-root
 * (tiny residual) and every exact root within its cluster radius of a reported one.
 */
export function compareWithReference(coefficients: readonly [number, number, number, number], answer: SolvedRoots, limits: ComparisonLimits, ulpOf: (x: number) => number): Comparison {
  const [a, b, c, d] = coefficients
  const none = { worstRatio: 0, simpleRoots: 0, multipleRoots: 0, clusterCases: 0 }
  const reference = referenceCubicRoots(a, b, c, d, answer.roots.map((r) => r.t))
  const finite = reference.roots.filter((r) => r.t.abs().lte(toBig(Number.MAX_VALUE)))
  const dropped = reference.roots.filter((r) => !finite.includes(r)).reduce((sum, r) => sum + r.multiplicity, 0)
  const describe = (): string => `exact roots ${reference.roots.map((r) => `${r.t.toPrecision(20)}×${r.multiplicity}`).join(', ') || 'none'}; answer ${JSON.stringify(answer)}`
  if (answer.degree !== Math.max(0, reference.exactDegree - dropped)) return { failure: `degree ${answer.degree}, expected ${reference.exactDegree - dropped}; ${describe()}`, ...none }
  for (let i = 0; i < answer.roots.length; i++) {
    const root = answer.roots[i]!
    if (!Number.isFinite(root.t)) return { failure: `non-finite root; ${describe()}`, ...none }
    if (i > 0 && !(root.t > answer.roots[i - 1]!.t)) return { failure: `roots not strictly ascending; ${describe()}`, ...none }
    if (![1, 2, 3].includes(root.multiplicity)) return { failure: `bad multiplicity; ${describe()}`, ...none }
  }
  const sameStructure = finite.length === answer.roots.length && finite.every((r, i) => r.multiplicity === answer.roots[i]!.multiplicity)
  if (sameStructure) {
    let worstRatio = 0
    let simpleRoots = 0
    for (let i = 0; i < finite.length; i++) {
      const exact = finite[i]!
      const condition = exact.multiplicity === 3 ? 1 : rootCondition(coefficients, exact.t, exact.multiplicity === 2 ? 1 : 0)
      const ratio = ulpError(answer.roots[i]!.t, exact.t, ulpOf) / Math.max(1, condition)
      if (!(ratio <= limits.ulpBudget)) return { failure: `root ${i} off by ${ratio.toPrecision(4)} ULPs × condition ${condition.toPrecision(4)}; ${describe()}`, ...none }
      worstRatio = Math.max(worstRatio, ratio)
      if (exact.multiplicity === 1) simpleRoots++
    }
    return { failure: null, worstRatio, simpleRoots, multipleRoots: finite.length - simpleRoots, clusterCases: 0 }
  }
  const nearZero = relativeDiscriminant(a, b, c, d)
  if (!(nearZero <= limits.nearZeroDiscriminant)) return { failure: `multiplicities differ although |Δ|/terms = ${nearZero.toPrecision(4)}; ${describe()}`, ...none }
  for (const root of answer.roots) {
    const residual = relativeResidualAt(coefficients, root.t)
    if (!(residual <= limits.clusterResidual)) return { failure: `cluster answer ${root.t} has residual ${residual.toPrecision(4)}; ${describe()}`, ...none }
  }
  for (const exact of finite) {
    const radius = clusterRadius(coefficients, exact.t, limits.clusterPerturbation)
    if (!answer.roots.some((root) => toBig(root.t).minus(exact.t).abs().lte(radius))) {
      return { failure: `exact root ${exact.t.toPrecision(20)} farther than ${radius.toPrecision(4)} from every answer; ${describe()}`, ...none }
    }
  }
  return { failure: null, worstRatio: 0, simpleRoots: 0, multipleRoots: 0, clusterCases: 1 }
}

/** A seeded family of test polynomials. */
export interface Family<Coefficients extends readonly number[]> {
  readonly name: string
  readonly seed: number
  readonly count: number
  readonly generate: (random: SeededRandom) => Coefficients
}

export interface FamilyResult {
  /** Up to five failures, each with the seed, case index and coefficients to replay it. */
  readonly failures: readonly string[]
  readonly worstRatio: number
  readonly simpleRoots: number
  readonly multipleRoots: number
  readonly clusterCases: number
}

/** Generates a family from its seed and compares every member's answer with the reference. */
export function compareFamily<Coefficients extends readonly number[]>(
  family: Family<Coefficients>,
  compare: (coefficients: Coefficients) => Comparison,
): FamilyResult {
  const random = createSeededRandom(family.seed)
  const failures: string[] = []
  let worstRatio = 0
  let simpleRoots = 0
  let multipleRoots = 0
  let clusterCases = 0
  for (let i = 0; i < family.count && failures.length < 5; i++) {
    const coefficients = family.generate(random)
    const comparison = compare(coefficients)
    if (comparison.failure !== null) {
      failures.push(`seed ${family.seed} case ${i}, coefficients [${coefficients.join(', ')}]: ${comparison.failure}`)
      continue
    }
    worstRatio = Math.max(worstRatio, comparison.worstRatio)
    simpleRoots += comparison.simpleRoots
    multipleRoots += comparison.multipleRoots
    clusterCases += comparison.clusterCases
  }
  return { failures, worstRatio, simpleRoots, multipleRoots, clusterCases }
}
