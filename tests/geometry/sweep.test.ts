/** Sweeps of parallel probes: crossings, windings along rows and filled spans, counted by hand. */
import { describe, expect, it } from 'vitest'
import { sweepPath } from '../../shared/geometry/index'
import { expectClose, pathOf } from './support/geometry-helpers'

/** Angle sweeps place rows by cos/sin of the angle: a few ulps of the coordinates (≤ 100). */
const TOLERANCE = 64 * Number.EPSILON * 100

describe('sweeps', () => {
  it('answers explicit scanlines with crossings, span windings and filled spans', () => {
    // Square 0..30 with a same-direction square hole 10..20: nonzero fills the hole (winding 2).
    const path = pathOf('M0 0 H30 V30 H0 Z M10 10 H20 V20 H10 Z')
    const [outside, through] = sweepPath(path, { rows: [-5, 15] })
    expect(outside.hits).toEqual([])
    expect(outside.filled).toEqual([])
    expect(through.hits.map((h) => [h.s, h.winding])).toEqual([[0, -1], [10, -1], [20, 1], [30, 1]])
    expect(through.spans).toEqual([
      { sStart: 0, sEnd: 10, winding: 1 },
      { sStart: 10, sEnd: 20, winding: 2 },
      { sStart: 20, sEnd: 30, winding: 1 },
    ])
    expect(through.filled).toEqual([[0, 30]])
    const [evenodd] = sweepPath(path, { rows: [15], fillRule: 'evenodd' })
    expect(evenodd.filled).toEqual([[0, 10], [20, 30]])
  })

  it('keeps a scanline along an edge as an overlap and fills the boundary beside filled spans', () => {
    const stairs = pathOf('M0 0 L4 0 L4 5 L8 5 L8 10 L0 10 Z')
    const [row] = sweepPath(stairs, { rows: [5] })
    expect(row.hits.map((h) => h.kind)).toEqual(['crossing', 'overlap'])
    expect(row.filled).toEqual([[0, 8]])
  })

  it('runs a family by angle, spacing and count across a diamond', () => {
    // Angle π/2 gives direction (0, 1) and line spacing along (−sin, cos) = (−1, 0): from
    // x = 10 the lines are x = 10, 7.5, 5, 2.5, 0. The side tips (0, 5) and (10, 5) are touches;
    // x = 5 passes through the top and bottom tips, where the path goes across, so it crosses.
    const diamond = pathOf('M5 0 L10 5 L5 10 L0 5 Z')
    const rows = sweepPath(diamond, { angle: Math.PI / 2, spacing: 2.5, count: 5, origin: [10, 0] })
    expect(rows.map((r) => r.hits.map((h) => h.kind).join())).toEqual([
      'tangent', 'crossing,crossing', 'crossing,crossing', 'crossing,crossing', 'tangent',
    ])
    expectClose(rows[1].origin[0], 7.5, TOLERANCE, 'row 1 x')
    // Row x = 7.5 is filled for y in [2.5, 7.5] (s = y with origin y = 0).
    expect(rows[1].filled).toHaveLength(1)
    const [from, to] = rows[1].filled[0]
    expectClose(from, 2.5, TOLERANCE, 'from')
    expectClose(to, 7.5, TOLERANCE, 'to')
    expect(rows[0].filled).toEqual([])
  })

  it('refuses a malformed family', () => {
    expect(() => sweepPath(pathOf('M0 0 H1 V1 Z'), { angle: 0, spacing: 1, count: -1, origin: [0, 0] })).toThrow(RangeError)
  })
})
