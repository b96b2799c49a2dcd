/**
 * The resolvent identities that Cardano's formula and its trigonometric form rest on, facts of
 * standard algebra (any text on the cubic, e.g. the Lagrange resolvent treatment): for roots
 * α1, α2, α3 with elementary symmetric functions s1, s2, s3, Δ = ∏(αi − αj)², ω a primitive
 * cube root of unity, γ = α1 + ωα2 + ω²α3 and β = α1 + ω²α2 + ωα3:
 *   γβ = s1² − 3s2,  γ³ + β³ = 2s1³ − 9s1s2 + 27s3,  (γ³ − β³)² = −27Δ,  α1 = (s1 + γ + β)/3,
 * and Δ = −4p³ − 27q² for t³ + pt + q. First checked as algebra on seeded random roots, then
 * against the quantities the solver computes internally (cubicResolventTerms).
 */
import { describe, expect, it } from 'vitest'
import { add, complex, divide, multiply, pow, subtract, type Complex } from 'mathjs'
import { cubicResolventTerms } from '../../shared/geometry/internal/cubic-resolvent'
import { solveCubic } from '../../shared/geometry/solve-cubic'
import { createSeededRandom, type SeededRandom } from '../helpers/seeded-random'

const OMEGA = complex(-0.5, Math.sqrt(3) / 2)
const OMEGA_SQUARED = complex(-0.5, -Math.sqrt(3) / 2)

/**
 * Identities are compared relative to (3R)^n, R the largest |root| and n the degree of the
 * quantity in the roots (|s1|, |γ|, |β| ≤ 3R, |s2| ≤ 3R², |s3| ≤ R³, so every term is below
 * (3R)^n): each side is a sum of at most 27 products of at most six rounded factors (mathjs
 * takes complex powers through exp and log), within about 2^-45·(3R)^n; 2^-40 leaves margin.
 */
const IDENTITY_TOLERANCE = 2 ** -40
/**
 * The solver starts from coefficients rounded to doubles, which moves well-separated roots
 * (gaps ≥ R/8 here) by at most about 64u·R; its quantities are then compared with the exact
 * ones within 2^-36·(3R)^n (a margin of 2^11 over that).
 */
const SOLVER_TOLERANCE = 2 ** -36

function c(x: number | Complex): Complex {
  return typeof x === 'number' ? complex(x, 0) : x
}

function sum(...xs: Complex[]): Complex {
  return xs.reduce((total, x) => add(total, x) as Complex, complex(0, 0))
}

function product(...xs: Complex[]): Complex {
  return xs.reduce((total, x) => multiply(total, x) as Complex, complex(1, 0))
}

function distance(x: Complex, y: Complex): number {
  const d = subtract(x, y) as Complex
  return Math.hypot(d.re, d.im)
}

/** Three roots: either all real, or one real and a conjugate pair; the largest |root| is about scale. */
function randomRoots(random: SeededRandom, scale: number): [Complex, Complex, Complex] {
  if (random.next() < 0.5) return [c(random.uniform(-1, 1) * scale), c(random.uniform(-1, 1) * scale), c(random.uniform(-1, 1) * scale)]
  const x = random.uniform(-1, 1) * scale
  const y = random.uniform(0.1, 1) * scale
  return [c(random.uniform(-1, 1) * scale), complex(x, y), complex(x, -y)]
}

function symmetricFunctions([a1, a2, a3]: readonly Complex[]): [Complex, Complex, Complex] {
  return [sum(a1!, a2!, a3!), sum(product(a1!, a2!), product(a1!, a3!), product(a2!, a3!)), product(a1!, a2!, a3!)]
}

function rootDiscriminant([a1, a2, a3]: readonly Complex[]): Complex {
  const d = (x: Complex, y: Complex) => subtract(x, y) as Complex
  return pow(product(d(a1!, a2!), d(a1!, a3!), d(a2!, a3!)), 2) as Complex
}

function resolvents([a1, a2, a3]: readonly Complex[]): [Complex, Complex] {
  return [
    sum(a1!, product(OMEGA, a2!), product(OMEGA_SQUARED, a3!)),
    sum(a1!, product(OMEGA_SQUARED, a2!), product(OMEGA, a3!)),
  ]
}

function describeRoots(roots: readonly Complex[]): string {
  return roots.map((r) => `${r.re}${r.im === 0 ? '' : ` ${r.im < 0 ? '−' : '+'} ${Math.abs(r.im)}i`}`).join(', ')
}

function largestModulus(roots: readonly Complex[]): number {
  return Math.max(...roots.map((r) => Math.hypot(r.re, r.im)))
}

/** s1² − 3s2, which γβ must equal. */
function hessianOf(s1: Complex, s2: Complex): Complex {
  return subtract(pow(s1, 2), multiply(3, s2)) as Complex
}

/** 2s1³ − 9s1s2 + 27s3, which γ³ + β³ must equal. */
function cubeSumOf(s1: Complex, s2: Complex, s3: Complex): Complex {
  return sum(multiply(2, pow(s1, 3)) as Complex, multiply(-9, product(s1, s2)) as Complex, multiply(27, s3) as Complex)
}

/** Asserts |x − y| ≤ tolerance·(3·scale)^degree, naming what failed. */
function expectWithin(x: Complex, y: Complex, degree: number, scale: number, tolerance: number, label: string): void {
  expect(distance(x, y) / (3 * scale) ** degree, label).toBeLessThan(tolerance)
}

describe('resolvent identities (standard algebra) on seeded random roots', () => {
  it('γβ = s1² − 3s2, γ³ + β³ = 2s1³ − 9s1s2 + 27s3, (γ³ − β³)² = −27Δ, α1 = (s1 + γ + β)/3', () => {
    const seed = 0x7e501
    const random = createSeededRandom(seed)
    for (let i = 0; i < 500; i++) {
      const roots = randomRoots(random, random.logUniform(-30, 30))
      const scale = largestModulus(roots)
      const [s1, s2, s3] = symmetricFunctions(roots)
      const [gamma, beta] = resolvents(roots)
      const delta = rootDiscriminant(roots)
      const within = (x: Complex, y: Complex, degree: number, what: string) =>
        expectWithin(x, y, degree, scale, IDENTITY_TOLERANCE, `seed ${seed} case ${i} ${what}: roots ${describeRoots(roots)}`)
      within(product(gamma, beta), hessianOf(s1, s2), 2, 'γβ')
      const cubes = [pow(gamma, 3) as Complex, pow(beta, 3) as Complex] as const
      within(add(cubes[0], cubes[1]) as Complex, cubeSumOf(s1, s2, s3), 3, 'γ³ + β³')
      within(pow(subtract(cubes[0], cubes[1]), 2) as Complex, multiply(-27, delta) as Complex, 6, '(γ³ − β³)²')
      within(divide(sum(s1, gamma, beta), 3) as Complex, roots[0], 1, 'α1')
    }
  })

  it('Δ = −4p³ − 27q² for t³ + pt + q (roots with s1 = 0)', () => {
    const seed = 0x7e502
    const random = createSeededRandom(seed)
    for (let i = 0; i < 500; i++) {
      const [r1, r2] = [random.uniform(-1, 1), random.uniform(-1, 1)]
      const roots = [c(r1), c(r2), c(-r1 - r2)]
      const [, p, minusQ] = symmetricFunctions(roots)
      const q = multiply(-1, minusQ) as Complex
      const formula = subtract(multiply(-4, pow(p, 3)), multiply(27, pow(q, 2))) as Complex
      expect(distance(formula, rootDiscriminant(roots)), `seed ${seed} case ${i}`).toBeLessThan(IDENTITY_TOLERANCE * (3 * largestModulus(roots)) ** 6)
    }
  })
})

describe("the solver's internal resolvent quantities (cubicResolventTerms) obey the identities", () => {
  /** Roots at least scale/8 apart, so rounding the coefficients moves them by ~u·scale only. */
  function separatedRoots(random: SeededRandom, scale: number): [Complex, Complex, Complex] {
    for (;;) {
      const roots = randomRoots(random, scale)
      const gaps = [distance(roots[0], roots[1]), distance(roots[0], roots[2]), distance(roots[1], roots[2])]
      if (Math.min(...gaps) >= scale / 8 && largestModulus(roots) >= scale / 4) return roots
    }
  }

  it('on 2000 seeded random root triples (one and three real roots, scales 2^±100)', () => {
    const seed = 0x7e503
    const random = createSeededRandom(seed)
    for (let i = 0; i < 2000; i++) {
      const roots = separatedRoots(random, random.logUniform(-100, 100))
      const scale = largestModulus(roots)
      const [s1, s2, s3] = symmetricFunctions(roots)
      const a = random.uniform(0.5, 4)
      // real coefficients of a·(t − α1)(t − α2)(t − α3), each rounded to a double
      const coefficients = [a, -a * s1.re, a * s2.re, -a * s3.re] as const
      const terms = cubicResolventTerms(...coefficients)
      const label = `seed ${seed} case ${i}: coefficients [${coefficients.join(', ')}], roots ${describeRoots(roots)}`
      const within = (x: Complex, y: Complex, degree: number, what: string) => expectWithin(x, y, degree, scale, SOLVER_TOLERANCE, `${label} (${what})`)

      const threeReal = roots.every((r) => r.im === 0)
      expect(terms.branch, label).toBe(threeReal ? 'three-real' : 'one-real')
      within(c(terms.s1), s1, 1, 's1')
      within(c(terms.s2), s2, 2, 's2')
      within(c(terms.s3), s3, 3, 's3')

      const gamma = complex(terms.gamma[0], terms.gamma[1])
      const beta = complex(terms.beta[0], terms.beta[1])
      // γβ = s1² − 3s2, both as the solver's complex γ·β and as its stored value
      const hessian = hessianOf(s1, s2)
      within(product(gamma, beta), hessian, 2, 'γβ from γ and β')
      within(c(terms.gammaBeta), hessian, 2, 'stored γβ')
      // γ³ + β³ = 2s1³ − 9s1s2 + 27s3
      const cubeSum = cubeSumOf(s1, s2, s3)
      const cubes = [pow(gamma, 3) as Complex, pow(beta, 3) as Complex] as const
      within(add(cubes[0], cubes[1]) as Complex, cubeSum, 3, 'γ³ + β³ from γ and β')
      within(c(terms.gammaCubeSum), cubeSum, 3, 'stored γ³ + β³')
      // (γ³ − β³)² = −27Δ, and the solver's monic discriminant is Δ
      const delta = rootDiscriminant(roots)
      within(pow(subtract(cubes[0], cubes[1]), 2) as Complex, multiply(-27, delta) as Complex, 6, '(γ³ − β³)²')
      within(c(terms.monicDiscriminant), delta, 6, 'Δ')
      // (s1 + γ + β)/3 is a root, and {γ, β} are the resolvents of some labelling of the roots
      const first = divide(sum(c(terms.s1), gamma, beta), 3) as Complex
      expect(Math.min(...roots.map((r) => distance(first, r))) / scale, `${label} (α1)`).toBeLessThan(SOLVER_TOLERANCE)
      const labellings = [[0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0]].map((order) => resolvents(order.map((k) => roots[k]!)))
      const match = Math.min(...labellings.map(([g, b]) => Math.max(distance(g, gamma), distance(b, beta))))
      expect(match / scale, `${label} (γ, β as resolvents)`).toBeLessThan(SOLVER_TOLERANCE)
    }
  })

  it('Δ = −4p³ − 27q²: the solver reports exactly that for t³ + pt + q with small integers', () => {
    const seed = 0x7e504
    const random = createSeededRandom(seed)
    for (let i = 0; i < 500; i++) {
      const [p, q] = [random.integer(-1000, 1000), random.integer(-1000, 1000)]
      if (p === 0 && q === 0) continue
      const expected = -4 * p ** 3 - 27 * q ** 2 // exact: below 2^53
      expect(solveCubic(1, 0, p, q).discriminant, `seed ${seed} case ${i}: p ${p}, q ${q}`).toBe(expected)
      expect(cubicResolventTerms(1, 0, p, q).monicDiscriminant, `seed ${seed} case ${i}: p ${p}, q ${q}`).toBe(expected)
    }
  })
})
