import { describe, expect, it } from 'vitest'
import type { NormalisedPath, Probe } from '../../shared/geometry'
import { parsePathData } from '../../shared/geometry'
import {
  clipProbeToRect, directionOfAngle, fromCoreProbe, pathBounds, pathSize, sweepLines, toCoreProbe,
} from '../../src/canvas/probe-geometry'
import type { CanvasProbe } from '../../src/canvas/types'

/** cos and sin of a double argument are within an ulp or two; 4ε covers them and the degree → radian product. */
const TRIG_TOLERANCE = 4 * Number.EPSILON
/** Sweep origins are sums of two products of values ≤ 10: each rounding ≤ 10·2⁻⁵³ ≈ 1e-15; 1e-14 allows a few. */
const SUM_TOLERANCE = 1e-14

describe('directionOfAngle (degrees from +x towards +y)', () => {
  it('is exact at the multiples of 90°, any turn', () => {
    expect(directionOfAngle(0)).toStrictEqual([1, 0])
    expect(directionOfAngle(90)).toStrictEqual([0, 1])
    expect(directionOfAngle(180)).toStrictEqual([-1, 0])
    expect(directionOfAngle(270)).toStrictEqual([0, -1])
    expect(directionOfAngle(-90)).toStrictEqual([0, -1])
    expect(directionOfAngle(360)).toStrictEqual([1, 0])
    expect(directionOfAngle(450)).toStrictEqual([0, 1])
    expect(directionOfAngle(-720)).toStrictEqual([1, 0])
  })

  it('gives equal |x| and |y| at the odd multiples of 45°, with the quadrant signs', () => {
    const signs: Record<number, [number, number]> = { 45: [1, 1], 135: [-1, 1], 225: [-1, -1], 315: [1, -1], [-45]: [1, -1] }
    for (const [angle, [sx, sy]] of Object.entries(signs)) {
      const [x, y] = directionOfAngle(Number(angle))
      expect(Math.abs(x), `angle ${angle}`).toBe(Math.abs(y))
      expect([Math.sign(x), Math.sign(y)], `angle ${angle}`).toStrictEqual([sx, sy])
      expect(Math.abs(Math.hypot(x, y) - 1)).toBeLessThanOrEqual(TRIG_TOLERANCE)
    }
  })

  it('gives cos and sin elsewhere (30°: (√3/2, 1/2), common practice) and reduces whole turns', () => {
    const [x, y] = directionOfAngle(30)
    expect(Math.abs(x - Math.sqrt(3) / 2)).toBeLessThanOrEqual(TRIG_TOLERANCE)
    expect(Math.abs(y - 0.5)).toBeLessThanOrEqual(TRIG_TOLERANCE)
    expect(directionOfAngle(390)).toStrictEqual(directionOfAngle(30))
    expect(directionOfAngle(-330)).toStrictEqual(directionOfAngle(30))
  })

  it('refuses a non-finite angle', () => {
    expect(() => directionOfAngle(Number.NaN)).toThrow(RangeError)
    expect(() => directionOfAngle(Infinity)).toThrow(RangeError)
  })
})

describe('sweepLines (line i through origin + i·spacing·(−sin, cos))', () => {
  it('steps down in +y for angle 0', () => {
    expect(sweepLines({ id: 'w', angle: 0, spacing: 2, count: 3, origin: [1, 5] })).toStrictEqual([
      { origin: [1, 5], direction: [1, 0] },
      { origin: [1, 7], direction: [1, 0] },
      { origin: [1, 9], direction: [1, 0] },
    ])
  })

  it('steps towards −x for angle 90 (n = (−1, 0))', () => {
    const lines = sweepLines({ id: 'w', angle: 90, spacing: 2.5, count: 3, origin: [7.5, -1] })
    expect(lines.map((line) => line.origin)).toStrictEqual([[7.5, -1], [5, -1], [2.5, -1]])
    lines.forEach((line) => expect(line.direction).toStrictEqual([0, 1]))
  })

  it('steps along (−√½, √½) for angle 45: spacing √2 moves each line by (−1, 1)', () => {
    const lines = sweepLines({ id: 'w', angle: 45, spacing: Math.SQRT2, count: 4, origin: [3, -2] })
    lines.forEach((line, i) => {
      expect(Math.abs(line.origin[0] - (3 - i))).toBeLessThanOrEqual(SUM_TOLERANCE)
      expect(Math.abs(line.origin[1] - (-2 + i))).toBeLessThanOrEqual(SUM_TOLERANCE)
    })
  })

  it('gives no line for count 0 and refuses a fractional or negative count', () => {
    expect(sweepLines({ id: 'w', angle: 10, spacing: 1, count: 0, origin: [0, 0] })).toStrictEqual([])
    expect(() => sweepLines({ id: 'w', angle: 10, spacing: 1, count: 1.5, origin: [0, 0] })).toThrow(RangeError)
    expect(() => sweepLines({ id: 'w', angle: 10, spacing: 1, count: -1, origin: [0, 0] })).toThrow(RangeError)
    expect(() => sweepLines({ id: 'w', angle: 10, spacing: Number.NaN, count: 2, origin: [0, 0] })).toThrow(RangeError)
  })
})

describe('toCoreProbe / fromCoreProbe', () => {
  const awkward = [0.1 + 0.2, 1e-300] as const
  const probes: CanvasProbe[] = [
    { id: 'p1', type: 'ray', a: awkward, b: [-3.5, 2 ** -1074] },
    { id: 'p2', type: 'line', a: [7, -0.3], b: [1e300, 1] },
    { id: 'p3', type: 'segment', a: [1 / 3, 2 / 3], b: awkward },
  ]

  it('maps a ray and a line to origin/direction and a segment to from/to', () => {
    expect(toCoreProbe(probes[0])).toStrictEqual({ type: 'ray', origin: awkward, direction: [-3.5, 2 ** -1074] })
    expect(toCoreProbe(probes[1])).toStrictEqual({ type: 'line', origin: [7, -0.3], direction: [1e300, 1] })
    expect(toCoreProbe(probes[2])).toStrictEqual({ type: 'segment', from: [1 / 3, 2 / 3], to: awkward })
  })

  it('round-trips exactly both ways', () => {
    for (const probe of probes) expect(fromCoreProbe(toCoreProbe(probe), probe.id)).toStrictEqual(probe)
    const core: Probe = { type: 'segment', from: [0.7, 0.1 * 3], to: [5e-324, -1e-300] }
    expect(toCoreProbe(fromCoreProbe(core, 'x'))).toStrictEqual(core)
  })
})

describe('clipProbeToRect on [0, 0, 10, 10] (pieces worked out by hand)', () => {
  const rect = [0, 0, 10, 10] as const
  const ray = (origin: [number, number], direction: [number, number]): Probe => ({ type: 'ray', origin, direction })
  const line = (origin: [number, number], direction: [number, number]): Probe => ({ type: 'line', origin, direction })
  const segment = (from: [number, number], to: [number, number]): Probe => ({ type: 'segment', from, to })

  it('runs a ray from its origin (kept as the same point) to the edge it leaves by', () => {
    const probe = ray([5, 5], [1, 0])
    const piece = clipProbeToRect(probe, rect)
    expect(piece).toStrictEqual([[5, 5], [10, 5]])
    expect(piece![0]).toBe((probe as { origin: unknown }).origin)
    expect(clipProbeToRect(ray([-5, 5], [1, 0]), rect)).toStrictEqual([[0, 5], [10, 5]])
    expect(clipProbeToRect(ray([15, 5], [1, 0]), rect)).toBeNull()
    expect(clipProbeToRect(ray([-5, 5], [0, 1]), rect)).toBeNull()
  })

  it('runs a line both ways, in the line\'s own direction', () => {
    expect(clipProbeToRect(line([15, 5], [1, 0]), rect)).toStrictEqual([[0, 5], [10, 5]])
    expect(clipProbeToRect(line([15, 5], [-1, 0]), rect)).toStrictEqual([[10, 5], [0, 5]])
    expect(clipProbeToRect(line([3, 3], [1, 1]), rect)).toStrictEqual([[0, 0], [10, 10]])
    // y = x + 5 enters at (0, 5) and leaves through the bottom edge at (5, 10).
    expect(clipProbeToRect(line([-5, 0], [2, 2]), rect)).toStrictEqual([[0, 5], [5, 10]])
  })

  it('keeps a segment inside as it is and cuts one that sticks out', () => {
    const inside = segment([2, 2], [8, 3])
    const piece = clipProbeToRect(inside, rect)!
    expect(piece[0]).toBe((inside as { from: unknown }).from)
    expect(piece[1]).toBe((inside as { to: unknown }).to)
    expect(clipProbeToRect(segment([-10, 5], [20, 5]), rect)).toStrictEqual([[0, 5], [10, 5]])
    expect(clipProbeToRect(segment([5, 5], [5, 40]), rect)).toStrictEqual([[5, 5], [5, 10]])
    expect(clipProbeToRect(segment([-10, 5], [-1, 5]), rect)).toBeNull()
  })

  it('counts the edges and corners as inside', () => {
    expect(clipProbeToRect(line([3, 10], [1, 0]), rect)).toStrictEqual([[0, 10], [10, 10]])
    // x + y = 20 touches only the corner (10, 10).
    expect(clipProbeToRect(line([20, 0], [-1, 1]), rect)).toStrictEqual([[10, 10], [10, 10]])
    expect(clipProbeToRect(line([3, 10.5], [1, 0]), rect)).toBeNull()
  })

  it('answers degenerate input without throwing, and refuses non-finite numbers', () => {
    expect(clipProbeToRect(segment([4, 4], [4, 4]), rect)).toStrictEqual([[4, 4], [4, 4]])
    expect(clipProbeToRect(segment([14, 4], [14, 4]), rect)).toBeNull()
    expect(clipProbeToRect(line([5, 5], [1, 0]), [10, 0, 0, 10])).toBeNull()
    expect(() => clipProbeToRect(line([5, Number.NaN], [1, 0]), rect)).toThrow(RangeError)
    expect(() => clipProbeToRect(line([5, 5], [1, 0]), [0, 0, Infinity, 10])).toThrow(RangeError)
  })
})

describe('pathBounds and pathSize', () => {
  it('unites the tight segment bounds (a cubic\'s apex, not its controls)', () => {
    // y(t) = −24·t·(1 − t) for controls y 0, −8, −8, 0: the apex at t = ½ is −6.
    const parsed = parsePathData('M0 0 C0 -8 10 -8 10 0 M20 5 L25 1')
    if (!parsed.ok) throw new Error(parsed.error.message)
    const path = parsed.path
    expect(pathBounds(path)).toStrictEqual([0, -6, 25, 5])
    expect(pathSize(path)).toBe(Math.hypot(25, 11))
  })

  it('has no bounds and size 0 without segments', () => {
    const empty: NormalisedPath = { segments: [], subpaths: [] }
    expect(pathBounds(empty)).toBeNull()
    expect(pathSize(empty)).toBe(0)
  })
})
