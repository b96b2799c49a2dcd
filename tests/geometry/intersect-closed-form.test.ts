/**
 * Probe–curve intersections whose answers are known in closed form. Shapes are invented for
 * these tests; the facts used are stated beside each case.
 */
import { describe, expect, it } from 'vitest'
import { computeSegmentBounds, intersectProbe, evaluateSegment } from '../../shared/geometry/index'
import type { Hit, Probe } from '../../shared/geometry/index'
import { distanceToLine, expectClose, pathOf } from './support/geometry-helpers'

/** A root that is dyadic, of a well-conditioned cubic, comes out within a few ulps of 1: 16ε. */
const T_TOLERANCE = 16 * Number.EPSILON
/** Meeting points within 64 ulps of the largest coordinate (scale 1000 in these shapes). */
const POINT_TOLERANCE = 64 * Number.EPSILON * 1000
const summary = (hits: readonly Hit[]): string[] => hits.map((h) => `${h.kind}:${h.winding}`)
const line = (origin: readonly [number, number], direction: readonly [number, number]): Probe => ({ type: 'line', origin, direction })

// Circle of four cubic quadrants with the usual constant k = 4(√2 − 1)/3, chosen so that each
// quadrant's midpoint B(½) = (P0 + 3P1 + 3P2 + P3)/8 lies exactly on the circle (common practice).
const K = (4 * (Math.SQRT2 - 1)) / 3
const R = 100
const kr = K * R
const circle = pathOf(
  `M${R} 0 C${R} ${kr} ${kr} ${R} 0 ${R} C${-kr} ${R} ${-R} ${kr} ${-R} 0 ` +
  `C${-R} ${-kr} ${-kr} ${-R} 0 ${-R} C${kr} ${-R} ${R} ${-kr} ${R} 0 Z`,
)

describe('circle of cubic arcs against axis lines and diagonals', () => {
  it('crosses the horizontal axis exactly at the joins (±R, 0), once each', () => {
    const hits = intersectProbe(circle, line([-200, 0], [1, 0]))
    // The path runs down (y growing) through (R, 0) and up through (−R, 0): windings +1 and −1.
    expect(hits).toEqual([
      { segment: 2, t: 0, s: 100, point: [-R, 0], kind: 'crossing', winding: -1 },
      { segment: 0, t: 0, s: 300, point: [R, 0], kind: 'crossing', winding: 1 },
    ])
  })

  it('touches the lines y = ±R and x = ±R at the joins (tangent, winding 0)', () => {
    expect(intersectProbe(circle, line([-200, R], [1, 0]))).toEqual([
      { segment: 1, t: 0, s: 200, point: [0, R], kind: 'tangent', winding: 0 },
    ])
    expect(intersectProbe(circle, line([-200, -R], [1, 0]))).toEqual([
      { segment: 3, t: 0, s: 200, point: [0, -R], kind: 'tangent', winding: 0 },
    ])
    // x = R touches at the first vertex, where the last and the first segment join.
    expect(intersectProbe(circle, line([R, -200], [0, 1]))).toEqual([
      { segment: 0, t: 0, s: 200, point: [R, 0], kind: 'tangent', winding: 0 },
    ])
    expect(summary(intersectProbe(circle, line([-R, 300], [0, -1])))).toEqual(['tangent:0'])
  })

  it('meets the 45° diagonal through the centre at the quadrant midpoints t = ½, on the circle', () => {
    const hits = intersectProbe(circle, line([-200, -200], [1, 1]))
    expect(hits.map((h) => h.segment)).toEqual([2, 0])
    const expected = R / Math.SQRT2
    for (const [hit, sign] of [[hits[0], -1], [hits[1], 1]] as const) {
      expectClose(hit.t, 0.5, T_TOLERANCE, 't')
      expectClose(hit.point[0], sign * expected, POINT_TOLERANCE, 'x')
      expectClose(hit.point[1], sign * expected, POINT_TOLERANCE, 'y')
      expect(hit.kind).toBe('crossing')
    }
  })

  it('gives a vertical line x = R/2 two crossings symmetric about y = 0', () => {
    const hits = intersectProbe(circle, line([R / 2, -200], [0, 1]))
    expect(hits).toHaveLength(2)
    expectClose(hits[0].point[1], -hits[1].point[1], POINT_TOLERANCE, 'symmetry')
    expect(hits.map((h) => [h.segment, h.winding])).toEqual([[3, -1], [0, 1]])
  })
})

describe('symmetric curves with exact tangents', () => {
  // y(t) = 6t(1 − t), x(t) = 3t(1−t)² + 9t²(1−t) + 4t³: peak y = 3/2 at t = ½, x = 2.
  const arch = pathOf('M0 0 C1 2 3 2 4 0')

  it('touches y = 3/2 once at t = ½ (exact double root)', () => {
    expect(intersectProbe(arch, line([-5, 1.5], [1, 0]))).toEqual([
      { segment: 0, t: 0.5, s: 7, point: [2, 1.5], kind: 'tangent', winding: 0 },
    ])
  })

  it('crosses y = 1 at t = (1 ± 1/√3)/2, rising then falling', () => {
    const hits = intersectProbe(arch, line([-5, 1], [1, 0]))
    const roots = [(1 - 1 / Math.sqrt(3)) / 2, (1 + 1 / Math.sqrt(3)) / 2]
    expect(summary(hits)).toEqual(['crossing:1', 'crossing:-1'])
    hits.forEach((hit, i) => {
      expectClose(hit.t, roots[i], T_TOLERANCE, 't')
      expectClose(hit.point[1], 1, POINT_TOLERANCE, 'y')
    })
  })

  it('finds the touch at a computed interior extremum that is not a vertex', () => {
    // The peak of this cubic has no simple closed form in doubles; the probe sits at the
    // maximum y from computeSegmentBounds (rounded), which is where common libraries miss.
    const segment = [0, 0, 1, -3, 2.5, -3.5, 4, 0.5] as const
    const peak = computeSegmentBounds(segment)[1]
    const hits = intersectProbe(pathOf('M0 0 C1 -3 2.5 -3.5 4 0.5'), line([-5, peak], [1, 0]))
    expect(summary(hits)).toEqual(['tangent:0'])
    expect(distanceToLine(hits[0].point[0], hits[0].point[1], -5, peak, 1, 0)).toBeLessThanOrEqual(POINT_TOLERANCE)
  })
})

describe('inflections, collinear controls and loops', () => {
  it('crosses at an exact inflection on the probe: y = 8(t − ½)³ has a triple root', () => {
    // Bernstein y coefficients (−1, 1, −1, 1) are 8t³ − 12t² + 6t − 1 = 8(t − ½)³; x = 3t.
    expect(intersectProbe(pathOf('M0 -1 C1 1 2 -1 3 1'), line([-5, 0], [1, 0]))).toEqual([
      { segment: 0, t: 0.5, s: 6.5, point: [1.5, 0], kind: 'crossing', winding: 1 },
    ])
  })

  it('meets a cubic with collinear control points three times at the same point', () => {
    // Controls on y = x with x: 0, 60, −50, 10: the curve runs along the diagonal out to
    // 18.32 (t = 0.2), back to −8.32 (t = 0.8) and on to 10, so y = 5 meets it three times at (5, 5).
    // The three s agree up to rounding, so their order along the probe is not fixed: read them by t.
    const hits = intersectProbe(pathOf('M0 0 C60 60 -50 -50 10 10'), line([-5, 5], [1, 0])).sort((a, b) => a.t - b.t)
    expect(summary(hits)).toEqual(['crossing:1', 'crossing:-1', 'crossing:1'])
    for (const hit of hits) {
      expectClose(hit.point[0], 5, POINT_TOLERANCE, 'x')
      expectClose(hit.point[1], 5, POINT_TOLERANCE, 'y')
    }
    expect(hits[0].t).toBeLessThan(hits[1].t)
    expect(hits[1].t).toBeLessThan(hits[2].t)
  })

  it('crosses a loop three times at t = ¼, ½, ¾', () => {
    // x controls (−18, 26, −26, 18) are 192(t − ¼)(t − ½)(t − ¾); with y controls (0, −40, −30, 10)
    // the curve crosses itself near (−1.1, −18.9). y(¼, ½, ¾) = −20.9375, −25, −14.0625 exactly.
    const loop = pathOf('M-18 0 C26 -40 -26 -30 18 10')
    const hits = intersectProbe(loop, line([0, -50], [0, 1]))
    const expected = [[0.5, -25, 1], [0.25, -20.9375, -1], [0.75, -14.0625, -1]]
    expect(hits).toHaveLength(3)
    hits.forEach((hit, i) => {
      const [t, y, winding] = expected[i]
      expectClose(hit.t, t, T_TOLERANCE, 't')
      expectClose(hit.point[1], y, POINT_TOLERANCE, 'y')
      expectClose(hit.s, y + 50, POINT_TOLERANCE, 's')
      expect(hit.winding).toBe(winding)
    })
  })
})

describe('rays starting behind or between meetings', () => {
  const arch = pathOf('M0 0 C1 2 3 2 4 0')
  const xs = [(1 - 1 / Math.sqrt(3)) / 2, (1 + 1 / Math.sqrt(3)) / 2].map((t) => evaluateSegment(arch.segments[0], t)[0])

  it('keeps only the meetings ahead of the origin', () => {
    const between = intersectProbe(arch, { type: 'ray', origin: [2, 1], direction: [1, 0] })
    expect(between).toHaveLength(1)
    expectClose(between[0].s, xs[1] - 2, POINT_TOLERANCE, 's')
    expect(intersectProbe(arch, { type: 'ray', origin: [5, 1], direction: [1, 0] })).toEqual([])
  })

  it('finds both meetings when the ray from behind points back, with winding signs flipped', () => {
    const hits = intersectProbe(arch, { type: 'ray', origin: [5, 1], direction: [-1, 0] })
    expect(summary(hits)).toEqual(['crossing:1', 'crossing:-1'])
    expectClose(hits[0].s, 5 - xs[1], POINT_TOLERANCE, 's')
    expectClose(hits[1].s, 5 - xs[0], POINT_TOLERANCE, 's')
  })

  it('scales s with the direction length: s is the probe parameter, not a distance', () => {
    const hits = intersectProbe(arch, { type: 'ray', origin: [5, 1], direction: [-4, 0] })
    expectClose(hits[0].s, (5 - xs[1]) / 4, POINT_TOLERANCE, 's')
  })
})
