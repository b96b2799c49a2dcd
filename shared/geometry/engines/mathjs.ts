/**
 * Adapter for mathjs `polynomialRoot`, which returns all roots of the cubic (real numbers
 * and Complex values); the real ones on [0, 1] are kept.
 */
import { polynomialRoot } from 'mathjs'
import type { IntersectionEngine } from './types'
import { computeSidePolynomialInto, keepInProbeRange, sortSmall } from './probe-range'

const polynomial = new Float64Array(4)

function intersectCubicMathjs(
  data: ArrayLike<number>, o: number,
  ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number,
  out: Float64Array,
): number {
  computeSidePolynomialInto(data, o, ox, oy, dx, dy, polynomial)
  const [a, b, c, d] = polynomial
  if (a === 0 && b === 0 && c === 0) return 0
  const found = polynomialRoot(d, c, b, a) as unknown as (number | { re: number; im: number })[]
  let count = 0
  for (const root of found) {
    const t = typeof root === 'number' ? root : root.im === 0 ? root.re : Number.NaN
    if (t >= 0 && t <= 1 && count < out.length) out[count++] = t
  }
  sortSmall(out, count)
  return keepInProbeRange(data, o, ox, oy, dx, dy, sMin, sMax, out, count)
}

/** mathjs polynomialRoot behind the engine interface. */
export const mathjsEngine: IntersectionEngine = {
  name: 'mathjs',
  description: 'mathjs 15 polynomialRoot on the power-basis cubic, real roots kept',
  intersectCubic: intersectCubicMathjs,
}
