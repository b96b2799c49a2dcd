import { describe, expect, it } from 'vitest'
import { quadraticDiscriminant, solveQuadratic, solveQuadraticInto } from '../../shared/geometry/solve-quadratic'
import { createSeededRandom, type SeededRandom } from '../helpers/seeded-random'
import { ulpDistance, ulpOf } from '../helpers/ulp'
import { SOLVER_LIMITS, compareFamily, compareWithReference, type Family } from './reference/cubic-bignumber'

type Quadratic = [number, number, number]

/** The quadratic as a cubic with a = 0, the shape the reference takes. */
function compare([a, b, c]: Quadratic) {
  return compareWithReference([0, a, b, c], solveQuadratic(a, b, c), SOLVER_LIMITS, ulpOf)
}

const FAMILIES: readonly Family<Quadratic>[] = [
  { name: 'uniform random coefficients', seed: 0x0a0b0001, count: 2000, generate: (r) => [r.uniform(-1, 1), r.uniform(-1, 1), r.uniform(-1, 1)] },
  {
    name: 'random roots spread over 2^±60',
    seed: 0x0a0b0002,
    count: 1500,
    generate: (r) => {
      const [x, y, a] = [r.logUniform(-60, 60), r.logUniform(-60, 60), r.logUniform(-20, 20)]
      return [a, -a * (x + y), a * x * y]
    },
  },
  {
    name: 'near-double roots (relative gap 2^-53 … 2^-10)',
    seed: 0x0a0b0003,
    count: 1500,
    generate: (r) => {
      const x = r.uniform(-1, 1)
      const y = x * (1 + r.logUniform(-53, -10))
      return [1, -(x + y), x * y]
    },
  },
  {
    name: 'exact double roots with dyadic coefficients',
    seed: 0x0a0b0004,
    count: 500,
    generate: (r) => {
      const x = r.integer(-200, 200) / 2 ** r.integer(0, 6)
      const a = r.sign() * r.integer(1, 16) / 4
      return [a, -2 * a * x, a * x * x]
    },
  },
  {
    name: 'coefficients scaled by 1e±150',
    seed: 0x0a0b0005,
    count: 1000,
    generate: (r) => {
      const scale = r.pick([1e150, 1e-150])
      return [r.uniform(-1, 1) * scale, r.uniform(-1, 1) * scale, r.uniform(-1, 1) * scale]
    },
  },
  {
    name: 'independent coefficients 1e-300 … 1e300 (roots beyond the range dropped)',
    seed: 0x0a0b0006,
    count: 1500,
    generate: (r) => [r.logUniform(-996, 996), r.logUniform(-996, 996), r.logUniform(-996, 996)],
  },
]

describe('solveQuadratic: worked examples', () => {
  it('(t − 2)(t − 3) = t² − 5t + 6 has the roots 2 and 3 exactly (common practice)', () => {
    expect(solveQuadratic(1, -5, 6)).toEqual({ degree: 2, identicallyZero: false, discriminant: 1, roots: [{ t: 2, multiplicity: 1 }, { t: 3, multiplicity: 1 }] })
  })

  it('t² − 1e8·t + 1: the small root 1e-8 without cancellation (the classic failure of (−b − √(b² − 4ac))/2a, discussed by Forsythe, 1966)', () => {
    const { roots } = solveQuadratic(1, -1e8, 1)
    // exact roots (1e8 ∓ √(1e16 − 4))/2: the small one is 1/(large one) = 1.00000000000000000001e-8
    expect(ulpDistance(roots[0]!.t, 1e-8)).toBeLessThanOrEqual(1)
    expect(roots[1]!.t).toBe(1e8)
    const naive = (1e8 - Math.sqrt(1e16 - 4)) / 2
    expect(ulpDistance(naive, 1e-8)).toBeGreaterThan(1e6) // the cancellation the stable form avoids
  })

  it("Kahan's example 94906265.625·t² − 189812534·t + 94906268.375 (from memory; checked against the reference): two roots 2.9e-8 apart", () => {
    const solution = solveQuadratic(94906265.625, -189812534, 94906268.375)
    expect(solution.roots.map((r) => r.multiplicity)).toEqual([1, 1])
    expect(solution.discriminant).toBe(7.5625) // exact: b² − 4ac of these doubles
    expect(compare([94906265.625, -189812534, 94906268.375]).failure).toBeNull()
  })

  it('an exact double root is reported once: (2t − 3)² = 4t² − 12t + 9', () => {
    expect(solveQuadratic(4, -12, 9)).toEqual({ degree: 2, identicallyZero: false, discriminant: 0, roots: [{ t: 1.5, multiplicity: 2 }] })
  })

  it('no real roots when b² < 4ac', () => {
    expect(solveQuadratic(1, 0, 1)).toEqual({ degree: 2, identicallyZero: false, discriminant: -4, roots: [] })
  })
})

describe('solveQuadratic: degenerate coefficients', () => {
  it('a = 0 is linear, a = b = 0 constant, all zero identically zero', () => {
    expect(solveQuadratic(0, 2, -3)).toEqual({ degree: 1, identicallyZero: false, discriminant: null, roots: [{ t: 1.5, multiplicity: 1 }] })
    expect(solveQuadratic(0, 0, 3)).toEqual({ degree: 0, identicallyZero: false, discriminant: null, roots: [] })
    expect(solveQuadratic(0, 0, 0)).toEqual({ degree: 0, identicallyZero: true, discriminant: null, roots: [] })
  })

  it('c = 0 gives the root 0 exactly', () => {
    expect(solveQuadratic(3, 1, 0).roots).toEqual([{ t: -1 / 3, multiplicity: 1 }, { t: 0, multiplicity: 1 }])
    expect(solveQuadratic(-3, 0, 0).roots).toEqual([{ t: 0, multiplicity: 2 }])
  })

  it('a root beyond the double range is dropped and the degree falls; the discriminant is null when it overflows', () => {
    const solution = solveQuadratic(1e-300, 1e300, 1e300)
    expect(solution.degree).toBe(1)
    expect(solution.discriminant).toBeNull()
    expect(solution.roots).toEqual([{ t: -1, multiplicity: 1 }])
    expect(quadraticDiscriminant(1e200, 1e200, 1e200)).toBeNull() // −3e400
    expect(quadraticDiscriminant(1e-200, 3e-200, 2e-200)).toBe(0) // 1e-400 underflows, documented
    expect(Math.abs(quadraticDiscriminant(1e150, 3e150, 2e150)! / 1e300 - 1)).toBeLessThan(1e-14) // 9e300 − 8e300, each side rounded once
  })

  it('throws RangeError for non-finite coefficients or a short output array', () => {
    expect(() => solveQuadratic(1, Number.NaN, 0)).toThrow(RangeError)
    expect(() => solveQuadraticInto(1, 2, Number.POSITIVE_INFINITY, new Float64Array(2))).toThrow(RangeError)
    expect(() => solveQuadraticInto(1, 2, 3, new Float64Array(1))).toThrow(RangeError)
  })
})

describe('solveQuadratic against the 60-digit BigNumber reference', () => {
  for (const family of FAMILIES) {
    it(`${family.name}: ${family.count} quadratics (seed ${family.seed})`, () => {
      const result = compareFamily(family, compare)
      expect(result.failures).toEqual([])
      expect(result.simpleRoots + result.multipleRoots + result.clusterCases).toBeGreaterThan(0)
    })
  }
})

describe('solveQuadraticInto', () => {
  it('writes the same roots and multiplicities as solveQuadratic', () => {
    const seed = 0x0a0b0007
    const random = createSeededRandom(seed)
    const out = new Float64Array(2)
    const multiplicities = new Uint8Array(2)
    for (let i = 0; i < 3000; i++) {
      const coefficients: Quadratic = [random.pick([0, random.uniform(-1, 1)]), random.uniform(-1, 1), random.pick([0, random.uniform(-1, 1)])]
      const count = solveQuadraticInto(...coefficients, out, multiplicities)
      const got = Array.from({ length: count }, (_, j) => ({ t: out[j]!, multiplicity: multiplicities[j]! }))
      expect(got, `seed ${seed} case ${i} [${coefficients.join(', ')}]`).toEqual(solveQuadratic(...coefficients).roots)
    }
    expect(solveQuadraticInto(0, 0, 0, out)).toBe(0)
  })
})
