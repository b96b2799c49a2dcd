import { afterAll, describe, expect, it } from 'vitest'
import { solveCubic, solveCubicInIntervalInto, solveCubicInto } from '../../shared/geometry/solve-cubic'
import { createSeededRandom, type SeededRandom } from '../helpers/seeded-random'
import { ulpDistance, ulpOf } from '../helpers/ulp'
import { SOLVER_LIMITS, compareFamily, compareWithReference, toBig, ulpError, type Family } from './reference/cubic-bignumber'
import hardCases from './fixtures/cubic-hard.json'

type Coefficients = [number, number, number, number]

const LIMITS = SOLVER_LIMITS

/** a·(t − r1)(t − r2)(t − r3) expanded in doubles (so its exact roots are near, not at, r1…r3). */
function fromRoots(a: number, r1: number, r2: number, r3: number): Coefficients {
  return [a, -a * (r1 + r2 + r3), a * (r1 * r2 + r1 * r3 + r2 * r3), -a * r1 * r2 * r3]
}

/** The polynomial in u = t/s: roots multiplied by s, exactly when s is a power of two. */
function scaleRoots([a, b, c, d]: Coefficients, s: number): Coefficients {
  return [a, b * s, c * s * s, d * s * s * s]
}

/** A dyadic number with few bits, so products of a few of them are exact doubles. */
function dyadic(random: SeededRandom): number {
  return random.integer(-96, 96) / 2 ** random.integer(0, 5)
}

const FAMILIES: readonly Family<Coefficients>[] = [
  { name: 'uniform random coefficients', seed: 0x5eed0001, count: 2500, generate: (r) => [r.uniform(-1, 1), r.uniform(-1, 1), r.uniform(-1, 1), r.uniform(-1, 1)] },
  { name: 'uniform random real roots', seed: 0x5eed0002, count: 2500, generate: (r) => fromRoots(r.uniform(0.25, 4), r.uniform(-1, 1), r.uniform(-1, 1), r.uniform(-1, 1)) },
  { name: 'roots spread over 2^±40', seed: 0x5eed0003, count: 2000, generate: (r) => fromRoots(r.logUniform(-10, 10), r.logUniform(-40, 40), r.logUniform(-40, 40), r.logUniform(-40, 40)) },
  {
    name: 'near-double roots (relative gap 2^-53 … 2^-20)',
    seed: 0x5eed0004,
    count: 2500,
    generate: (r) => {
      const root = r.uniform(-1, 1)
      return fromRoots(r.uniform(0.5, 2), root, root * (1 + r.logUniform(-53, -20)), r.uniform(-1, 1))
    },
  },
  {
    name: 'near-triple clusters (gap 2^-40 … 2^-10), scaled by 2^±200',
    seed: 0x5eed0005,
    count: 1500,
    generate: (r) => {
      const root = r.uniform(-1, 1)
      const gap = r.logUniform(-40, -10)
      return scaleRoots(fromRoots(r.uniform(0.1, 10), root, root + gap, root + 2 * gap * r.uniform(0.5, 1.5)), 2 ** r.integer(-200, 200))
    },
  },
  {
    name: 'exact double roots with dyadic coefficients',
    seed: 0x5eed0006,
    count: 1500,
    generate: (r) => {
      const double = dyadic(r)
      return fromRoots(r.sign() * r.integer(1, 12) / 4, double, double, dyadic(r))
    },
  },
  {
    name: 'exact triple roots with dyadic coefficients',
    seed: 0x5eed0007,
    count: 500,
    generate: (r) => {
      const triple = dyadic(r)
      return fromRoots(r.sign() * r.integer(1, 12) / 8, triple, triple, triple)
    },
  },
  {
    name: 'complex pair nearly real (imaginary part 2^-60 … 2^-10) beside a real root',
    seed: 0x5eed0008,
    count: 1500,
    generate: (r) => {
      const x = r.uniform(-1, 1)
      const y = r.logUniform(-60, -10)
      const real = r.uniform(-1, 1)
      return [1, -(2 * x + real), x * x + y * y + 2 * x * real, -real * (x * x + y * y)]
    },
  },
  {
    name: 'tiny leading coefficient (2^-1074 … 2^-10 of the others), huge roots dropped',
    seed: 0x5eed0009,
    count: 2000,
    generate: (r) => {
      const scale = 2 ** r.integer(-300, 300)
      const a = r.pick([r.logUniform(-60, -10), r.logUniform(-1074, -60)])
      return [a * scale, r.uniform(-1, 1) * scale, r.uniform(-1, 1) * scale, r.uniform(-1, 1) * scale]
    },
  },
  {
    name: 'coefficients scaled by 1e±150',
    seed: 0x5eed000a,
    count: 1500,
    generate: (r) => {
      const scale = r.pick([1e150, 1e-150])
      return [r.uniform(-1, 1) * scale, r.uniform(-1, 1) * scale, r.uniform(-1, 1) * scale, r.uniform(-1, 1) * scale]
    },
  },
  {
    name: 'roots scaled by 2^±300 (coefficients of mixed scales)',
    seed: 0x5eed000b,
    count: 1500,
    generate: (r) => scaleRoots(fromRoots(r.uniform(0.25, 4), r.uniform(-1, 1), r.uniform(-1, 1), r.uniform(-1, 1)), 2 ** r.integer(-300, 300)),
  },
  {
    name: 'close pair far below the largest root',
    seed: 0x5eed000c,
    count: 1000,
    generate: (r) => {
      const pair = r.uniform(-1, 1)
      return fromRoots(1, r.sign() * r.logUniform(20, 300), pair, pair * (1 + r.logUniform(-40, -1)))
    },
  },
  {
    name: 'zero constant term',
    seed: 0x5eed000d,
    count: 1000,
    generate: (r) => [r.uniform(-1, 1), r.uniform(-1, 1), r.pick([0, r.uniform(-1, 1)]), 0],
  },
  {
    name: 'cubic Bézier in font units against a line',
    seed: 0x5eed000e,
    count: 1000,
    generate: (r) => {
      const [p0, p1, p2, p3] = [0, 1, 2, 3].map(() => r.integer(-2048, 2048)) as Coefficients
      return [-p0 + 3 * p1 - 3 * p2 + p3, 3 * p0 - 6 * p1 + 3 * p2, -3 * p0 + 3 * p1, p0 - r.integer(-2048, 2048)]
    },
  },
  {
    name: 'independent coefficients 1e-300 … 1e300',
    seed: 0x5eed000f,
    count: 1000,
    generate: (r) => [r.logUniform(-996, 996), r.logUniform(-996, 996), r.logUniform(-996, 996), r.logUniform(-996, 996)],
  },
]

const summary: string[] = []
afterAll(() => {
  // measured accuracy, for the record (not an assertion)
  console.info(`solveCubic against the 60-digit reference:\n${summary.join('\n')}`)
})

describe('solveCubic: worked examples from published sources', () => {
  it("Cardano, Ars Magna (1545): cube and six things equal twenty, t³ + 6t = 20, has the root 2", () => {
    const solution = solveCubic(1, 0, 6, -20)
    expect(solution.roots).toEqual([{ t: 2, multiplicity: 1 }])
    expect(solution.degree).toBe(3)
  })

  it("Bombelli, L'Algebra (1572): cube equal to fifteen things and four, t³ = 15t + 4, has 4 and −2 ± √3", () => {
    const solution = solveCubic(1, 0, -15, -4)
    const rootThree = toBig(3).sqrt()
    const exact = [rootThree.neg().minus(2), rootThree.minus(2), toBig(4)]
    expect(solution.roots.map((r) => r.multiplicity)).toEqual([1, 1, 1])
    // correctly rounded: within half an ULP of the 60-digit values
    solution.roots.forEach((root, i) => expect(ulpError(root.t, exact[i]!, ulpOf)).toBeLessThanOrEqual(0.5))
  })

  it('the general discriminant 18abcd − 4b³d + b²c² − 4ac³ − 27a²d² equals a⁴∏(ri − rj)² (standard algebra)', () => {
    // by hand from the roots: (t−1)(t−2)(t−3): (1·2·1)² = 4; 2(t−1)(t+1)(t−3): 2⁴·(2·4·2)² = 4096;
    // Cardano's t³ + 6t − 20 and Bombelli's t³ − 15t − 4 through Δ = −4p³ − 27q²: −11664 and 13068
    expect(solveCubic(1, -6, 11, -6).discriminant).toBe(4)
    expect(solveCubic(2, -6, -2, 6).discriminant).toBe(4096)
    expect(solveCubic(1, 0, 6, -20).discriminant).toBe(-4 * 6 ** 3 - 27 * 20 ** 2)
    expect(solveCubic(1, 0, -15, -4).discriminant).toBe(-4 * (-15) ** 3 - 27 * 4 ** 2)
    // (t − 1)²(t − 2) has a repeated root, so Δ = 0; (t² + 1)(t − 2) = t³ − 2t² + t − 2: a⁴∏ over
    // the roots 2, i, −i: (2 − i)²(2 + i)²(2i)² = 25·(−4) = −100
    expect(solveCubic(1, -4, 5, -2).discriminant).toBe(0)
    expect(solveCubic(1, -2, 1, -2).discriminant).toBe(-100)
  })
})

describe('solveCubic: the answer shape of POST /api/v1/solve/cubic', () => {
  it('reports a double root once with multiplicity 2 and a triple root once with 3', () => {
    expect(solveCubic(1, -4, 5, -2).roots).toEqual([{ t: 1, multiplicity: 2 }, { t: 2, multiplicity: 1 }])
    expect(solveCubic(1, -3, 3, -1).roots).toEqual([{ t: 1, multiplicity: 3 }])
  })

  it('reports the root 0 exactly when d = 0, also beside roots that are not dyadic', () => {
    const solution = solveCubic(3, -1, -1, 0)
    expect(solution.roots.map((r) => r.t)).toContain(0)
    expect(Object.is(solution.roots.find((r) => r.t === 0)!.t, 0)).toBe(true)
    expect(solveCubic(-1, 0, 0, 0).roots).toEqual([{ t: 0, multiplicity: 3 }])
  })

  it('all four coefficients 0: degree 0, identically zero, no roots; a non-zero constant: degree 0, no roots', () => {
    expect(solveCubic(0, 0, 0, 0)).toEqual({ degree: 0, identicallyZero: true, discriminant: null, roots: [] })
    expect(solveCubic(0, 0, 0, -7)).toEqual({ degree: 0, identicallyZero: false, discriminant: null, roots: [] })
  })

  it('lower degrees: b² − 4ac style discriminant for a quadratic, null for a line', () => {
    expect(solveCubic(0, 1, -3, 2)).toEqual({ degree: 2, identicallyZero: false, discriminant: 1, roots: [{ t: 1, multiplicity: 1 }, { t: 2, multiplicity: 1 }] })
    expect(solveCubic(0, 0, 4, -3)).toEqual({ degree: 1, identicallyZero: false, discriminant: null, roots: [{ t: 0.75, multiplicity: 1 }] })
  })

  it('a negligible leading coefficient (its root beyond ±Number.MAX_VALUE) is dropped; a representable huge root is kept', () => {
    const dropped = solveCubic(1e-300, 1e300, -3e300, 2e300)
    expect(dropped.degree).toBe(2)
    expect(dropped.roots.map((r) => r.t)).toEqual([1, 2])
    expect(dropped.discriminant).toBeNull() // c² − 4bd = 1e600 is beyond the double range
    const kept = solveCubic(1e-20, 1, -3, 2)
    expect(kept.degree).toBe(3)
    expect(kept.roots.map((r) => r.t).slice(1)).toEqual([1, 2])
    expect(ulpDistance(kept.roots[0]!.t, -1e20 - 3)).toBeLessThanOrEqual(2) // −b/a − (sum of the others)
  })

  it('the discriminant does not overflow needlessly and is null only beyond the double range', () => {
    // (t−1)(t−2)(t−3) scaled by 1e100: Δ = 4·1e400 overflows, so null; by 1e50: 4e200
    expect(solveCubic(1e100, -6e100, 11e100, -6e100).discriminant).toBeNull()
    const scaled = solveCubic(1e50, -6e50, 11e50, -6e50).discriminant!
    expect(Math.abs(scaled / 4e200 - 1)).toBeLessThan(1e-14)
    // roots scaled by 2^300: Δ grows by 2^(6·300)/... still finite as long as its value is
    expect(solveCubic(1, -6 * 2 ** 100, 11 * 2 ** 200, -6 * 2 ** 300).discriminant).toBe(4 * 2 ** 600)
  })

  it('throws RangeError for non-finite coefficients, a short output array or an empty interval (malformed calls)', () => {
    expect(() => solveCubic(Number.NaN, 1, 2, 3)).toThrow(RangeError)
    expect(() => solveCubic(1, Number.POSITIVE_INFINITY, 2, 3)).toThrow(RangeError)
    expect(() => solveCubicInto(1, 2, 3, Number.NEGATIVE_INFINITY, new Float64Array(3))).toThrow(RangeError)
    expect(() => solveCubicInto(1, 2, 3, 4, new Float64Array(2))).toThrow(RangeError)
    expect(() => solveCubicInIntervalInto(1, 2, 3, 4, 1, 0, new Float64Array(3))).toThrow(RangeError)
  })
})

describe('solveCubic: hard fixtures (tests/geometry/fixtures/cubic-hard.json)', () => {
  for (const fixture of hardCases.cases) {
    it(`${fixture.name}: ${fixture.catches}`, () => {
      const coefficients = fixture.coefficients as Coefficients
      const solution = solveCubic(...coefficients)
      const expectations = fixture.expect as {
        degree?: number
        identicallyZero?: boolean
        discriminant?: number | null
        roots?: { t: number; multiplicity: number }[]
        rootCount?: number
      }
      if (expectations.degree !== undefined) expect(solution.degree).toBe(expectations.degree)
      if (expectations.identicallyZero !== undefined) expect(solution.identicallyZero).toBe(expectations.identicallyZero)
      if (expectations.discriminant !== undefined) expect(solution.discriminant).toBe(expectations.discriminant)
      if (expectations.roots !== undefined) expect(solution.roots).toEqual(expectations.roots)
      if (expectations.rootCount !== undefined) expect(solution.roots).toHaveLength(expectations.rootCount)
      if (solution.identicallyZero) return
      const comparison = compareWithReference(coefficients, solution, LIMITS, ulpOf)
      expect(comparison.failure, `fixture ${fixture.name} [${coefficients.join(', ')}]`).toBeNull()
    })
  }
})

describe('solveCubic against the 60-digit BigNumber reference', () => {
  for (const family of FAMILIES) {
    it(`${family.name}: ${family.count} cubics (seed ${family.seed})`, () => {
      const result = compareFamily(family, (coefficients) => compareWithReference(coefficients, solveCubic(...coefficients), LIMITS, ulpOf))
      summary.push(`  ${family.name}: ${result.simpleRoots} simple, ${result.multipleRoots} multiple roots, ${result.clusterCases} near-Δ=0 clusters; worst ${result.worstRatio.toFixed(3)} ULP × max(1, κ)`)
      expect(result.failures).toEqual([])
      expect(result.simpleRoots + result.multipleRoots + result.clusterCases).toBeGreaterThan(0)
    })
  }
})

describe('solveCubic: extreme coefficients never give NaN or Infinity', () => {
  it('20000 cubics with coefficients from ±1e-300 to ±1e300 (and exact zeros) give finite, ascending, distinct roots', () => {
    const seed = 0x5eed0010
    const random = createSeededRandom(seed)
    const problems: string[] = []
    for (let i = 0; i < 20000 && problems.length < 5; i++) {
      const pickCoefficient = (): number => (random.next() < 0.1 ? 0 : random.logUniform(-997, 997))
      const coefficients: Coefficients = [pickCoefficient(), pickCoefficient(), pickCoefficient(), pickCoefficient()]
      const solution = solveCubic(...coefficients)
      const roots = solution.roots
      const ordered = roots.every((r, j) => Number.isFinite(r.t) && (j === 0 || r.t > roots[j - 1]!.t) && [1, 2, 3].includes(r.multiplicity))
      const total = roots.reduce((sum, r) => sum + r.multiplicity, 0)
      const exactDegree = coefficients[0] !== 0 ? 3 : coefficients[1] !== 0 ? 2 : coefficients[2] !== 0 ? 1 : 0
      const discriminantOk = solution.degree < 2 ? solution.discriminant === null : solution.discriminant === null || Number.isFinite(solution.discriminant)
      if (!ordered || total > solution.degree || solution.degree > exactDegree || !discriminantOk) {
        problems.push(`seed ${seed} case ${i}, coefficients [${coefficients.join(', ')}]: ${JSON.stringify(solution)}`)
      }
    }
    expect(problems).toEqual([])
  })

  it('subnormal and largest doubles as coefficients', () => {
    const extremes = [5e-324, -5e-324, 2 ** -1022, Number.MAX_VALUE, -Number.MAX_VALUE, 1]
    const random = createSeededRandom(0x5eed0011)
    for (let i = 0; i < 2000; i++) {
      const coefficients: Coefficients = [random.pick(extremes), random.pick(extremes), random.pick(extremes), random.pick(extremes)]
      const solution = solveCubic(...coefficients)
      expect(solution.roots.every((r) => Number.isFinite(r.t)), `seed 0x5eed0011 case ${i} [${coefficients.join(', ')}]`).toBe(true)
      const comparison = compareWithReference(coefficients, solution, LIMITS, ulpOf)
      expect(comparison.failure, `seed 0x5eed0011 case ${i} [${coefficients.join(', ')}]`).toBeNull()
    }
  })
})

describe('solveCubicInto and solveCubicInIntervalInto', () => {
  it('give the same roots and multiplicities as solveCubic, and 0 for the identically zero cubic', () => {
    const seed = 0x5eed0012
    const random = createSeededRandom(seed)
    const out = new Float64Array(3)
    const multiplicities = new Uint8Array(3)
    for (let i = 0; i < 3000; i++) {
      const coefficients: Coefficients = random.next() < 0.3
        ? fromRoots(random.uniform(0.5, 2), dyadic(random), dyadic(random), dyadic(random))
        : [random.uniform(-1, 1), random.uniform(-1, 1), random.uniform(-1, 1), random.pick([0, random.uniform(-1, 1)])]
      const count = solveCubicInto(...coefficients, out, multiplicities)
      const expected = solveCubic(...coefficients).roots
      const got = Array.from({ length: count }, (_, j) => ({ t: out[j]!, multiplicity: multiplicities[j]! }))
      expect(got, `seed ${seed} case ${i} [${coefficients.join(', ')}]`).toEqual(expected)
    }
    out.fill(7)
    expect(solveCubicInto(0, 0, 0, 0, out)).toBe(0)
  })

  it('the interval variant keeps exactly the roots in [lower, upper]', () => {
    const seed = 0x5eed0013
    const random = createSeededRandom(seed)
    const all = new Float64Array(3)
    const inside = new Float64Array(3)
    for (let i = 0; i < 3000; i++) {
      const coefficients: Coefficients = [random.uniform(-1, 1), random.uniform(-1, 1), random.uniform(-1, 1), random.uniform(-1, 1)]
      const count = solveCubicInto(...coefficients, all)
      const kept = solveCubicInIntervalInto(...coefficients, 0, 1, inside)
      const expected = Array.from(all.subarray(0, count)).filter((t) => t >= 0 && t <= 1)
      expect(Array.from(inside.subarray(0, kept)), `seed ${seed} case ${i} [${coefficients.join(', ')}]`).toEqual(expected)
    }
  })
})
