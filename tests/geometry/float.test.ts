/**
 * The floating-point building blocks of the solvers (shared/geometry/internal/float.ts):
 * exact exponents and power-of-two scaling, the error-free transformations of Knuth (TwoSum)
 * and Dekker (product), and the error bound of the compensated Horner scheme of Graillat,
 * Langlois and Louvet (2005), each checked against exact arithmetic.
 */
import { describe, expect, it } from 'vitest'
import {
  UNIT_ROUNDOFF,
  ZERO_EXPONENT,
  evaluateCubicCompensated,
  exponentOf,
  productError,
  scaleByPowerOfTwo,
  sumError,
  ulpOf,
} from '../../shared/geometry/internal/float'
import { createSeededRandom } from '../helpers/seeded-random'
import { ulpOf as independentUlpOf } from '../helpers/ulp'
import { splitDouble, toBig } from './reference/cubic-bignumber'

/** x + y − z·… as an exact dyadic comparison: Σ sign·value = 0 for doubles, via integer mantissas. */
function exactlyZero(terms: readonly (readonly [1 | -1, ...number[]])[]): boolean {
  const products = terms.map(([sign, ...factors]) => {
    let mantissa = BigInt(sign)
    let exponent = 0
    for (const f of factors) {
      const split = splitDouble(f)
      mantissa *= split.mantissa
      exponent += split.exponent
    }
    return { mantissa, exponent }
  })
  const low = Math.min(...products.filter((p) => p.mantissa !== 0n).map((p) => p.exponent), 0)
  return products.reduce((total, p) => total + p.mantissa * (1n << BigInt(p.exponent - low)), 0n) === 0n
}

describe('exponentOf and scaleByPowerOfTwo', () => {
  it('exponentOf is floor(log2 |x|) exactly, next to powers of two and for subnormals', () => {
    for (let e = -1074; e <= 1023; e++) {
      expect(exponentOf(2 ** e)).toBe(e)
      if (e > -1074) expect(exponentOf(-3 * 2 ** (e - 1))).toBe(e) // −1.5·2^e (not a double at e = −1074)
      const below = 2 ** e - (e <= -1022 ? 2 ** -1074 : independentUlpOf(2 ** e) / 2) // the double just below 2^e
      if (e > -1074) expect(exponentOf(below)).toBe(e - 1)
    }
    expect(exponentOf(0)).toBe(ZERO_EXPONENT)
  })

  it('scaleByPowerOfTwo is exact for normal results, even in several steps, and overflows or underflows like x·2^n', () => {
    const seed = 0xf10a7
    const random = createSeededRandom(seed)
    for (let i = 0; i < 20000; i++) {
      const x = random.logUniform(-1074, 1023)
      const n = random.integer(-2300, 2300)
      const scaled = scaleByPowerOfTwo(x, n)
      const target = exponentOf(x) + n
      const label = `seed ${seed} case ${i}: ${x}·2^${n}`
      if (target > 1023) expect(scaled, label).toBe(x > 0 ? Number.POSITIVE_INFINITY : Number.NEGATIVE_INFINITY)
      else if (target >= -1022) expect(scaleByPowerOfTwo(scaled, -n), label).toBe(x) // exact both ways
      else if (target < -1075) expect(scaled, label).toBe(0 * x)
      else expect(Math.abs(scaled), label).toBeLessThan(2 ** -1022) // subnormal result
    }
  })

  it('ulpOf agrees with the independent bit-level helper', () => {
    const random = createSeededRandom(0xf10a8)
    for (let i = 0; i < 5000; i++) {
      const x = random.logUniform(-1074, 1023)
      expect(ulpOf(x), `seed 0xf10a8 case ${i}: ${x}`).toBe(independentUlpOf(x))
    }
  })
})

describe('error-free transformations', () => {
  it('a + b = s + sumError(a, b, s) and a·b = p + productError(a, b, p) exactly', () => {
    const seed = 0xf10a9
    const random = createSeededRandom(seed)
    for (let i = 0; i < 20000; i++) {
      const a = random.logUniform(-400, 400)
      const b = random.logUniform(-400, 400)
      const s = a + b
      const p = a * b
      expect(exactlyZero([[1, a], [1, b], [-1, s], [-1, sumError(a, b, s)]]), `seed ${seed} case ${i}: ${a} + ${b}`).toBe(true)
      expect(exactlyZero([[1, a, b], [-1, p], [-1, productError(a, b, p)]]), `seed ${seed} case ${i}: ${a} · ${b}`).toBe(true)
    }
  })
})

describe('compensated Horner scheme', () => {
  it('stays within u·|p(x)| + 2(6u)²·Σ|coefficient|·|x|^i of the exact value, near roots too', () => {
    const seed = 0xf10aa
    const random = createSeededRandom(seed)
    const u = UNIT_ROUNDOFF
    for (let i = 0; i < 3000; i++) {
      const [r1, r2, r3] = [random.uniform(-1, 1), random.uniform(-1, 1), random.uniform(-1, 1)]
      const [a, b, c, d] = [1, -(r1 + r2 + r3), r1 * r2 + r1 * r3 + r2 * r3, -r1 * r2 * r3]
      const x = random.pick([r1, r2, r3]) * (1 + random.uniform(-1e-9, 1e-9))
      const [A, B, C, D, X] = [a, b, c, d, x].map(toBig)
      const exact = A.times(X).plus(B).times(X).plus(C).times(X).plus(D)
      const size = Math.abs(a) * Math.abs(x) ** 3 + Math.abs(b) * x * x + Math.abs(c) * Math.abs(x) + Math.abs(d)
      const bound = u * Math.abs(exact.toNumber()) + 2 * (6 * u) ** 2 * size
      const error = toBig(evaluateCubicCompensated(a, b, c, d, x)).minus(exact).abs().toNumber()
      expect(error, `seed ${seed} case ${i}: p(${x}) for [${a}, ${b}, ${c}, ${d}]`).toBeLessThanOrEqual(bound)
    }
  })
})
