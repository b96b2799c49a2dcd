/**
 * The engines behind one interface, on seeded random ray–cubic pairs: the closed form against
 * the 60-digit BigNumber twin, and bezier-js, mathjs, subdivision and Newton against it where
 * the roots are well conditioned.
 */
import { describe, expect, it } from 'vitest'
import {
  bezierJsEngine, closedFormEngine, mathjsEngine, newtonEngine, subdivisionEngine,
} from '../../shared/geometry/index'
import type { IntersectionEngine } from '../../shared/geometry/index'
import { referenceLineCubicRoots } from './reference/line-cubic-bignumber'
import { createRayCubicPairs } from './support/seeded-random'

const SEED = 777
const PAIRS = 250
const { cubics, rays } = createRayCubicPairs(SEED, PAIRS)
const out = new Float64Array(4)
/** Roots closer than this to t = 0 or 1 are left out of the agreement checks (end handling differs by engine). */
const END_MARGIN = 1e-3
/** |g′| below max|f|/100 makes a root ill-conditioned enough (error ×100) to be left out of the agreement checks. */
const CONDITION_LIMIT = 100
/** Below max|f|/1e6 the root is a near-double root, beyond the first-order bound of the closed-form check. */
const NEAR_DOUBLE_LIMIT = 1e6
/** The interface check on a well-conditioned arch: every engine, subdivision included (chord error ~1e-6), within 1e-5. */
const INTERFACE_TOLERANCE = 1e-5

/** g(t) = d × (P(t) − o) and g′(t) in double, for conditioning the comparison. */
function sides(i: number): number[] {
  const [ox, oy, dx, dy] = rays.subarray(4 * i, 4 * i + 4)
  return [0, 1, 2, 3].map((k) => dx * (cubics[8 * i + 2 * k + 1] - oy) - dy * (cubics[8 * i + 2 * k] - ox))
}
function slopeAt(f: number[], t: number): number {
  const u = 1 - t
  return 3 * (u * u * (f[1] - f[0]) + 2 * u * t * (f[2] - f[1]) + t * t * (f[3] - f[2]))
}
function run(engine: IntersectionEngine, i: number, sMin = -Infinity, sMax = Infinity): number[] {
  const [ox, oy, dx, dy] = rays.subarray(4 * i, 4 * i + 4)
  const count = engine.intersectCubic(cubics, 8 * i, ox, oy, dx, dy, sMin, sMax, out)
  return Array.from(out.subarray(0, count))
}
/** Reference roots whose slope |g′| is at least 1/100 of max |f|, away from the ends: well conditioned. */
function wellConditioned(i: number): { reference: number[]; f: number[]; clean: boolean } {
  const [ox, oy, dx, dy] = rays.subarray(4 * i, 4 * i + 4)
  const reference = referenceLineCubicRoots(cubics, 8 * i, ox, oy, dx, dy)
  const f = sides(i)
  const scale = Math.max(...f.map(Math.abs))
  const clean = reference.every((t) => t > END_MARGIN && t < 1 - END_MARGIN && Math.abs(slopeAt(f, t)) >= scale / CONDITION_LIMIT)
  return { reference, f, clean }
}
const cases = Array.from({ length: PAIRS }, (_, i) => ({ i, ...wellConditioned(i) }))

describe('closed-form engine against the BigNumber twin', () => {
  it('finds every root, each within 64ε·max|f|/|g′(t)| + 4ε of the exact one', () => {
    // Residual budget: the control-point sides carry ≤ 3ε·max|f|, the power-basis conversion ≤ 8ε·max|f|,
    // the solver a few ulps: 64ε·max|f| of residual, which a slope |g′| turns into a t error.
    let roots = 0
    for (const { i, reference, f } of cases) {
      const found = run(closedFormEngine, i)
      const scale = Math.max(...f.map(Math.abs))
      for (const t of reference) {
        const slope = Math.abs(slopeAt(f, t))
        if (slope < scale / NEAR_DOUBLE_LIMIT) continue
        const bound = (64 * Number.EPSILON * scale) / slope + 4 * Number.EPSILON
        const nearest = found.reduce((best, x) => (Math.abs(x - t) < Math.abs(best - t) ? x : best), Infinity)
        if (!(Math.abs(nearest - t) <= bound)) throw new Error(`seed ${SEED}, pair ${i}: root ${t}, found ${found}`)
        roots++
      }
    }
    expect(roots).toBeGreaterThan(PAIRS / 2)
  })
})

/** bezier-js (rotation by atan2/cos/sin) and mathjs (complex Cardano) keep about 9 digits in t here. */
const ADAPTER_TOLERANCE = 1e-9
/** Flatness 2^-24 of the curve size leaves a chord error in t of order 1e-6. */
const SUBDIVISION_TOLERANCE = 1e-5
/** Newton converges to a few ulps; 1e-12 allows for conditioning up to the ×100 limit above. */
const NEWTON_TOLERANCE = 1e-12

describe('numeric engines and adapters agree where roots are well conditioned', () => {
  const engines: readonly [IntersectionEngine, number, number][] = [
    // Tolerances in t: bezier-js and mathjs lose digits to rotation and complex Cardano (1e-9);
    // subdivision stops at flatness 2^-24 of the size (chord error ~1e-6); Newton converges fully
    // but, by its method, sees only roots at least two of its 16 sample intervals apart (1/8).
    [bezierJsEngine, ADAPTER_TOLERANCE, 0],
    [mathjsEngine, ADAPTER_TOLERANCE, 0],
    [subdivisionEngine, SUBDIVISION_TOLERANCE, 0],
    [newtonEngine, NEWTON_TOLERANCE, 1 / 8],
  ]
  for (const [engine, tolerance, separation] of engines) {
    it(`${engine.name} finds the same roots as the BigNumber twin (within ${tolerance})`, () => {
      let compared = 0
      for (const { i, reference, clean } of cases) {
        if (!clean || reference.some((t, k) => k > 0 && t - reference[k - 1] < separation)) continue
        const found = run(engine, i)
        if (found.length !== reference.length || found.some((t, k) => Math.abs(t - reference[k]) > tolerance)) {
          throw new Error(`seed ${SEED}, pair ${i}: ${engine.name} gave ${found}, reference ${reference}`)
        }
        compared++
      }
      expect(compared).toBeGreaterThan(PAIRS / 2)
    })
  }
})

describe('the engine interface', () => {
  // Arch y = 6t(1 − t) from (0, 0) to (4, 0); the line y = 1 meets it at t = (1 ± 1/√3)/2.
  const arch = new Float64Array([0, 0, 1, 2, 3, 2, 4, 0])
  const roots = [(1 - 1 / Math.sqrt(3)) / 2, (1 + 1 / Math.sqrt(3)) / 2]
  const engines = [closedFormEngine, bezierJsEngine, mathjsEngine, subdivisionEngine, newtonEngine]

  it('honours the probe range: ray, line, segment', () => {
    for (const engine of engines) {
      const line = engine.intersectCubic(arch, 0, -5, 1, 1, 0, -Infinity, Infinity, out)
      expect(line, engine.name).toBe(2)
      expect(Math.abs(out[0] - roots[0]), engine.name).toBeLessThan(INTERFACE_TOLERANCE)
      // A ray from x = 2 reaches only the second meeting; a segment from x = −5 to 2 only the first.
      expect(engine.intersectCubic(arch, 0, 2, 1, 1, 0, 0, Infinity, out), engine.name).toBe(1)
      expect(Math.abs(out[0] - roots[1]), engine.name).toBeLessThan(INTERFACE_TOLERANCE)
      expect(engine.intersectCubic(arch, 0, -5, 1, 7, 0, 0, 1, out), engine.name).toBe(1)
      expect(Math.abs(out[0] - roots[0]), engine.name).toBeLessThan(INTERFACE_TOLERANCE)
    }
  })

  it('reports no roots for a cubic lying along the line (closed form)', () => {
    expect(closedFormEngine.intersectCubic(new Float64Array([0, 0, 1, 0, 2, 0, 3, 0]), 0, -1, 0, 1, 0, -Infinity, Infinity, out)).toBe(0)
  })

  it('keeps an end point that touches the line with its neighbouring control point on it too (closed form)', () => {
    // The top of the demo map pin (M12 2C8.13 2 5 5.13 5 9) reversed: P2 and P3 on y = 2.
    // Hand-worked: y(t) − 2 = 7(1−t)³ + 9.39t(1−t)² = (1−t)²·(7 + 2.39t), a double root at t = 1
    // and no other on [0, 1].
    const top = new Float64Array([5, 9, 5, 5.13, 8.13, 2, 12, 2])
    expect(closedFormEngine.intersectCubic(top, 0, 0, 2, 1, 0, -Infinity, Infinity, out)).toBe(1)
    expect(out[0]).toBe(1)
    // The same curve reversed: the double root sits at t = 0.
    const reversed = new Float64Array([12, 2, 8.13, 2, 5, 5.13, 5, 9])
    expect(closedFormEngine.intersectCubic(reversed, 0, 0, 2, 1, 0, -Infinity, Infinity, out)).toBe(1)
    expect(out[0]).toBe(0)
    // Outside the probe's range the end is not a hit: a ray starting beyond x = 12.
    expect(closedFormEngine.intersectCubic(top, 0, 13, 2, 1, 0, 0, Infinity, out)).toBe(0)
  })
})
