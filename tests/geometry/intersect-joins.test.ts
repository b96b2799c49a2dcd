/**
 * Joins, touches and overlaps, as the /intersect contract defines them. Every expected value
 * follows from the contract's rules on small invented polygons with integer coordinates, where
 * the answers are exact.
 */
import { describe, expect, it } from 'vitest'
import { intersectProbe } from '../../shared/geometry/index'
import type { Hit, Probe } from '../../shared/geometry/index'
import { pathOf } from './support/geometry-helpers'

const horizontal = (y: number, type: 'ray' | 'line' = 'line', x = -5): Probe => ({ type, origin: [x, y], direction: [1, 0] })
const summary = (hits: readonly Hit[]): string[] => hits.map((h) => `${h.kind}:${h.winding}@${h.point[0]},${h.point[1]}`)

describe('joins of consecutive segments', () => {
  it('reports a V tip touching the probe as one tangent with winding 0', () => {
    const hits = intersectProbe(pathOf('M0 10 L5 0 L10 10 Z'), horizontal(0))
    expect(hits).toEqual([{ segment: 1, t: 0, s: 10, point: [5, 0], kind: 'tangent', winding: 0 }])
  })

  it('reports a smooth top made of two segments as one tangent', () => {
    // Two quadratics meeting at (5, 0) with horizontal tangents on both sides.
    const hits = intersectProbe(pathOf('M0 10 Q2.5 0 5 0 Q7.5 0 10 10'), horizontal(0))
    expect(hits).toEqual([{ segment: 1, t: 0, s: 10, point: [5, 0], kind: 'tangent', winding: 0 }])
  })

  it('counts a crossing at a join once, with the winding of the passage', () => {
    const hits = intersectProbe(pathOf('M0 -5 L5 0 L10 5'), horizontal(0))
    expect(hits).toEqual([{ segment: 1, t: 0, s: 10, point: [5, 0], kind: 'crossing', winding: 1 }])
    const reversed = intersectProbe(pathOf('M10 5 L5 0 L0 -5'), horizontal(0))
    expect(summary(reversed)).toEqual(['crossing:-1@5,0'])
  })

  it('joins the last and first segments of a closed subpath', () => {
    const diamond = pathOf('M5 0 L10 5 L5 10 L0 5 Z')
    expect(summary(intersectProbe(diamond, horizontal(0)))).toEqual(['tangent:0@5,0'])
    expect(summary(intersectProbe(diamond, horizontal(5)))).toEqual(['crossing:-1@0,5', 'crossing:1@10,5'])
    expect(summary(intersectProbe(diamond, horizontal(10)))).toEqual(['tangent:0@5,10'])
  })

  it('never joins segments of different subpaths', () => {
    const twoPieces = pathOf('M0 -5 L5 0 M5 0 L10 5')
    const hits = intersectProbe(twoPieces, horizontal(0))
    expect(hits).toHaveLength(2)
    expect(hits.map((h) => h.segment).sort()).toEqual([0, 1])
  })

  it('finds a join between a curve and a line crossed by a vertical probe, once', () => {
    // Cubic from (0,0) to (10,0) bulging up, then a line on to (20,0): x = 10 is the join.
    // direction (0, 1) × tangent (1, 0) = −1.
    const vertical: Probe = { type: 'line', origin: [10, -20], direction: [0, 1] }
    expect(intersectProbe(pathOf('M0 0 C3 -6 7 -6 10 0 L20 0'), vertical)).toEqual([
      { segment: 1, t: 0, s: 20, point: [10, 0], kind: 'crossing', winding: -1 },
    ])
    // Turning down the probe instead: one overlap, arriving from x < 10 (side +) and leaving to x > 10 (side −).
    const hits = intersectProbe(pathOf('M0 0 C3 -6 7 -6 10 0 L10 10 L20 10'), vertical)
    expect(hits).toEqual([{ segment: 1, t: 0, s: 20, point: [10, 0], kind: 'overlap', winding: -1, sEnd: 30, tEnd: 1 }])
  })
})

describe('segments lying along the probe', () => {
  it('is one overlap hit with passage +1 from the negative to the positive side', () => {
    const hits = intersectProbe(pathOf('M0 -5 L0 0 L10 0 L10 5'), horizontal(0))
    expect(hits).toEqual([{ segment: 1, t: 0, s: 5, point: [0, 0], kind: 'overlap', winding: 1, sEnd: 15, tEnd: 1 }])
  })

  it('has passage −1 the other way round, and keeps s ≤ sEnd with t, tEnd following the segment', () => {
    const hits = intersectProbe(pathOf('M10 5 L10 0 L0 0 L0 -5'), horizontal(0))
    expect(hits).toEqual([{ segment: 1, t: 1, s: 5, point: [0, 0], kind: 'overlap', winding: -1, sEnd: 15, tEnd: 0 }])
  })

  it('has passage 0 when the path returns to the side it came from', () => {
    const hits = intersectProbe(pathOf('M0 -5 L0 0 L10 0 L10 -5'), horizontal(0))
    expect(summary(hits)).toEqual(['overlap:0@0,0'])
  })

  it('is clipped by a segment probe, and a cut overlap carries no passage', () => {
    const hits = intersectProbe(pathOf('M0 -5 L0 0 L10 0 L10 5'), { type: 'segment', from: [-5, 0], to: [5, 0] })
    expect(hits).toEqual([{ segment: 1, t: 0, s: 0.5, point: [0, 0], kind: 'overlap', winding: 0, sEnd: 1, tEnd: 0.5 }])
  })

  it('is clipped by a ray origin inside it', () => {
    const hits = intersectProbe(pathOf('M0 -5 L0 0 L10 0 L10 5'), horizontal(0, 'ray', 4))
    expect(hits).toEqual([{ segment: 1, t: 0.4, s: 0, point: [4, 0], kind: 'overlap', winding: 0, sEnd: 6, tEnd: 1 }])
  })

  it('gives consecutive overlapping segments one hit each, the last carrying the passage', () => {
    const hits = intersectProbe(pathOf('M0 -5 L0 0 L4 0 L10 0 L10 5'), horizontal(0))
    expect(summary(hits)).toEqual(['overlap:0@0,0', 'overlap:1@4,0'])
    expect(hits.map((h) => [h.segment, h.s, h.sEnd])).toEqual([[1, 5, 9], [2, 9, 15]])
  })

  it('carries the passage on the last overlap in path order even when it comes first along the probe', () => {
    // Along the probe the path goes right to (10, 0), then back left to (4, 0), then down.
    const hits = intersectProbe(pathOf('M0 -5 L0 0 L10 0 L4 0 L4 5'), horizontal(0))
    expect(hits.map((h) => [h.segment, h.winding])).toEqual([[1, 0], [2, 1]])
  })

  it('keeps the winding sum along a ray equal to the neighbouring rays when an edge lies on it', () => {
    // Staircase, clockwise on screen; the ray from (2, 5) runs along the edge (4,5)–(8,5).
    const stairs = pathOf('M0 0 L4 0 L4 5 L8 5 L8 10 L0 10 Z')
    const total = (y: number): number => intersectProbe(stairs, horizontal(y, 'ray', 2)).reduce((sum, h) => sum + h.winding, 0)
    expect(total(5)).toBe(1)
    expect(total(4.5)).toBe(1)
    expect(total(5.5)).toBe(1)
    expect(summary(intersectProbe(stairs, horizontal(5, 'ray', 2)))).toEqual(['overlap:1@4,5'])
  })

  it('treats a cubic whose control points all lie on the probe as an overlap over its whole extent', () => {
    // Control x: 0, 60, −50, 10 on y = 0: x(0.2) = 18.32 and x(0.8) = −8.32, so the curve
    // overshoots both end points along the line.
    const hits = intersectProbe(pathOf('M0 -5 L0 0 C60 0 -50 0 10 0 L10 5'), horizontal(0))
    expect(hits).toHaveLength(1)
    const [hit] = hits
    expect(hit.kind).toBe('overlap')
    expect(hit.winding).toBe(1)
    expect(hit.s).toBeLessThan(5 - 8.32)
    expect(hit.sEnd).toBeGreaterThan(5 + 18.32)
    expect(hit.t).toBeGreaterThan(0.5)
    expect(hit.tEnd).toBeLessThan(0.5)
  })
})
