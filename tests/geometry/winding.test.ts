/**
 * Winding numbers and containment (nonzero and evenodd, every subpath closed as SVG fills it),
 * checked against hand-counted cases and against an independent oracle: the angle swept by
 * a finely flattened outline around the point, divided by 2π (common practice).
 */
import { describe, expect, it } from 'vitest'
import { containsPoints, evaluateSegment, windingNumber } from '../../shared/geometry/index'
import type { NormalisedPath, Point } from '../../shared/geometry/index'
import { createRandom } from './support/seeded-random'
import { pathOf } from './support/geometry-helpers'

/** Winding by the swept angle of the outline flattened into `steps` chords per segment. */
function sweptAngleWinding(path: NormalisedPath, [px, py]: Point, steps = 256): number {
  let total = 0
  for (const subpath of path.subpaths) {
    const points: Point[] = []
    for (let k = 0; k < subpath.count; k++) {
      const segment = path.segments[subpath.start + k]
      for (let i = 0; i < steps; i++) points.push(evaluateSegment(segment, i / steps))
    }
    for (let i = 0; i < points.length; i++) {
      const [ax, ay] = points[i]
      const [bx, by] = points[(i + 1) % points.length]
      total += Math.atan2((ax - px) * (by - py) - (ay - py) * (bx - px), (ax - px) * (bx - px) + (ay - py) * (by - py))
    }
  }
  return Math.round(total / (2 * Math.PI))
}

describe('winding numbers', () => {
  it('is +1 inside a square drawn clockwise on screen (y down) and −1 drawn the other way', () => {
    expect(windingNumber(pathOf('M0 0 H10 V10 H0 Z'), [5, 5])).toBe(1)
    expect(windingNumber(pathOf('M0 0 V10 H10 V0 Z'), [5, 5])).toBe(-1)
    expect(windingNumber(pathOf('M0 0 H10 V10 H0 Z'), [15, 5])).toBe(0)
  })

  it('adds nested subpaths: nonzero fills a same-direction hole, evenodd does not', () => {
    const nested = pathOf('M0 0 H30 V30 H0 Z M10 10 H20 V20 H10 Z')
    expect(windingNumber(nested, [15, 15])).toBe(2)
    const [nonzero] = containsPoints(nested, [[15, 15]], 'nonzero')
    const [evenodd] = containsPoints(nested, [[15, 15]], 'evenodd')
    expect(nonzero).toEqual({ inside: true, winding: 2, onBoundary: false })
    expect(evenodd).toEqual({ inside: false, winding: 2, onBoundary: false })
  })

  it('closes open subpaths for filling', () => {
    // An open "C" of three sides fills like the closed square.
    expect(windingNumber(pathOf('M0 0 H10 V10 H0'), [5, 5])).toBe(1)
    expect(containsPoints(pathOf('M0 0 H10 V10 H0'), [[5, 5]])[0].inside).toBe(true)
  })

  it('counts a ray running along an edge or through a vertex correctly', () => {
    // Points level with a vertex and with a horizontal edge of a staircase.
    const stairs = pathOf('M0 0 L4 0 L4 5 L8 5 L8 10 L0 10 Z')
    for (const point of [[2, 5], [2, 0.5], [6, 7], [2, 9.5]] as Point[]) expect(windingNumber(stairs, point)).toBe(1)
    expect(windingNumber(stairs, [6, 2])).toBe(0)
    const diamond = pathOf('M5 0 L10 5 L5 10 L0 5 Z')
    expect(windingNumber(diamond, [5, 5])).toBe(1)
    expect(windingNumber(diamond, [-1, 0])).toBe(0)
    expect(windingNumber(diamond, [-1, 5])).toBe(0)
  })

  it('agrees with the swept-angle oracle on a curved path with loops, for seeded random points', () => {
    // A cubic loop, an arc and a quadratic in one closed subpath, plus a second overlapping subpath.
    const path = pathOf('M-18 0 C26 -40 -26 -30 18 10 A15 10 20 1 1 -10 25 Q-30 10 -18 0 Z M-5 -30 L30 -10 L-5 20 Z')
    const seed = 4242
    const random = createRandom(seed)
    let checked = 0
    for (let i = 0; i < 300; i++) {
      const point: Point = [-45 + 90 * random(), -45 + 90 * random()]
      const expected = sweptAngleWinding(path, point)
      const actual = windingNumber(path, point)
      if (actual !== expected) throw new Error(`seed ${seed}, point ${point}: winding ${actual}, oracle ${expected}`)
      checked++
    }
    expect(checked).toBe(300)
  })
})

describe('containment', () => {
  const square = pathOf('M0 0 H10 V10 H0 Z')

  it('reports points on edges, at vertices and on curves as onBoundary', () => {
    const results = containsPoints(square, [[10, 5], [0, 0], [5, 10], [5, 1e-14], [5, 5]])
    expect(results.map((r) => r.onBoundary)).toEqual([true, true, true, true, false])
    const arch = pathOf('M0 0 C1 2 3 2 4 0 Z')
    const onCurve = evaluateSegment(arch.segments[0], 0.3)
    expect(containsPoints(arch, [onCurve])[0].onBoundary).toBe(true)
  })

  it('applies the fill rules to the winding number', () => {
    const doubled = pathOf('M0 0 H10 V10 H0 Z M0 0 H10 V10 H0 Z')
    expect(containsPoints(doubled, [[5, 5]], 'nonzero')[0]).toEqual({ inside: true, winding: 2, onBoundary: false })
    expect(containsPoints(doubled, [[5, 5]], 'evenodd')[0].inside).toBe(false)
    expect(containsPoints(square, [[5, 5]])[0].inside).toBe(true)
  })

  it('throws RangeError for non-finite points (a malformed call)', () => {
    expect(() => containsPoints(square, [[Number.NaN, 1]])).toThrow(RangeError)
  })
})
