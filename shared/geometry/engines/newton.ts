/**
 * Newton iteration from sampled brackets: g(t) = direction × (P(t) − origin) is sampled at
 * evenly spaced t; every sign change brackets a root, refined by Newton steps that fall back
 * to bisection when a step leaves the bracket. Touches between samples (no sign change) are
 * missed, by design of the method. Allocation-free.
 */
import type { IntersectionEngine } from './types'
import { computeSidePolynomialInto, keepInProbeRange } from './probe-range'

/** Default number of sample intervals on [0, 1]. */
export const DEFAULT_SAMPLES = 16
/** Newton steps per bracket at most; quadratic convergence needs far fewer. */
const MAX_STEPS = 60
const polynomial = new Float64Array(4)

/** A Newton engine sampling [0, 1] at `samples` intervals. */
export function createNewtonEngine(samples: number = DEFAULT_SAMPLES): IntersectionEngine {
  function intersectCubicNewton(
    data: ArrayLike<number>, o: number,
    ox: number, oy: number, dx: number, dy: number, sMin: number, sMax: number,
    out: Float64Array,
  ): number {
    computeSidePolynomialInto(data, o, ox, oy, dx, dy, polynomial)
    const a = polynomial[0], b = polynomial[1], c = polynomial[2], f0 = polynomial[3]
    const g = (t: number): number => ((a * t + b) * t + c) * t + f0
    const slope = (t: number): number => (3 * a * t + 2 * b) * t + c
    let count = 0
    let previousT = 0
    let previousG = f0
    if (previousG === 0) out[count++] = 0
    for (let i = 1; i <= samples && count < out.length; i++) {
      const t = i / samples
      const value = g(t)
      if (value === 0) {
        out[count++] = t
      } else if (previousG !== 0 && (previousG < 0) !== (value < 0)) {
        let low = previousT, high = t
        const lowNegative = previousG < 0
        let x = low + ((high - low) * previousG) / (previousG - value)
        for (let step = 0; step < MAX_STEPS; step++) {
          const gx = g(x)
          if (gx === 0) break
          if ((gx < 0) === lowNegative) low = x
          else high = x
          const derivative = slope(x)
          let next = derivative === 0 ? Number.NaN : x - gx / derivative
          if (!(next > low && next < high)) next = (low + high) / 2
          if (next === x || high - low <= Number.EPSILON * Math.max(1, Math.abs(x))) { x = next; break }
          x = next
        }
        out[count++] = x
      }
      previousT = t
      previousG = value
    }
    return keepInProbeRange(data, o, ox, oy, dx, dy, sMin, sMax, out, count)
  }
  return {
    name: 'newton',
    description: `sign changes of g at ${samples} samples, each refined by safeguarded Newton iteration`,
    intersectCubic: intersectCubicNewton,
  }
}

/** Newton engine with the default sampling. */
export const newtonEngine: IntersectionEngine = createNewtonEngine()
