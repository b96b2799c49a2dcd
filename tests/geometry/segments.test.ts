/** Segment evaluation, derivatives, bounds and splitting, on curves with hand-computed values. */
import { describe, expect, it } from 'vitest'
import {
  computeSegmentBounds, evaluateSegment, evaluateSegmentDerivative, getSegmentKind, splitSegment,
} from '../../shared/geometry/index'
import type { ArcSegment } from '../../shared/geometry/index'
import { expectClose, pathOf } from './support/geometry-helpers'

/** Values of these small curves are exact or within a few ulps of 10: 16ε·10. */
const TOLERANCE = 16 * Number.EPSILON * 10

describe('segments', () => {
  const arch = [0, 0, 1, 2, 3, 2, 4, 0] as const // y = 6t(1 − t), peak (2, 1.5)

  it('names kinds by tuple length and refuses other lengths', () => {
    expect([4, 6, 8, 12].map((n) => getSegmentKind(new Array<number>(n).fill(0)))).toEqual(['line', 'quadratic', 'cubic', 'arc'])
    expect(() => getSegmentKind([1, 2, 3])).toThrow(RangeError)
  })

  it('evaluates points and derivatives (Bernstein form)', () => {
    expect(evaluateSegment(arch, 0.5)).toEqual([2, 1.5])
    // x′(t) = 3[(1−t)²·1 + 2t(1−t)·2 + t²·1], y′(t) = 6 − 12t.
    expect(evaluateSegmentDerivative(arch, 0.5)).toEqual([3 * (0.25 + 1 + 0.25), 0])
    expect(evaluateSegmentDerivative([0, 0, 2, 4, 6, 0], 0)).toEqual([4, 8])
  })

  it('bounds curves by their extrema, not their control points', () => {
    expect(computeSegmentBounds(arch)).toEqual([0, 0, 4, 1.5])
    // Quadratic y = 8t(1 − t) peaks at 2.
    expect(computeSegmentBounds([0, 0, 2, 4, 6, 0])).toEqual([0, 0, 6, 2])
    // Half circle of radius 5 through (5, −5).
    const [minX, minY, maxX, maxY] = computeSegmentBounds(pathOf('M0 0 A5 5 0 0 1 10 0').segments[0])
    expect([minX, maxX, maxY]).toEqual([0, 10, 0])
    expectClose(minY, -5, TOLERANCE, 'arc top')
  })

  it('splits by de Casteljau so that the halves join at P(t) and keep the curve', () => {
    const [left, right] = splitSegment(arch, 0.25)
    expect(left.slice(-2)).toEqual(right.slice(0, 2))
    expect(left.slice(-2)).toEqual(evaluateSegment(arch, 0.25))
    const [x, y] = evaluateSegment(right, 0.5)
    const [ex, ey] = evaluateSegment(arch, 0.625)
    expectClose(x, ex, TOLERANCE, 'x')
    expectClose(y, ey, TOLERANCE, 'y')
    const arc = pathOf('M0 0 A5 5 0 0 1 10 0').segments[0] as ArcSegment
    const [first, second] = splitSegment(arc, 0.5) as [ArcSegment, ArcSegment]
    expect(first[11] + second[11]).toBe(arc[11])
    expect(evaluateSegment(second, 1)).toEqual([10, 0])
    expect(() => splitSegment(arch, 1)).toThrow(RangeError)
  })
})
