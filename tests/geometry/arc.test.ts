/**
 * SVG elliptical arcs: conversion per SVG 1.1 (Second Edition) Appendix F.6 "Elliptical arc
 * implementation notes" (F.6.2 out-of-range parameters, F.6.5 endpoint → centre conversion,
 * F.6.6 radius correction), checked on the spec's own parameter definitions, and probe hits
 * on exact arcs.
 */
import { describe, expect, it } from 'vitest'
import { convertArcToCentre, evaluateSegment, intersectProbe } from '../../shared/geometry/index'
import type { ArcSegment } from '../../shared/geometry/index'
import { expectClose, pathOf } from './support/geometry-helpers'

/** Angles and centres of these small arcs come out within a few ulps: 16ε at scale 1 (angles) or 256 (coordinates). */
const ANGLE_TOLERANCE = 16 * Number.EPSILON * Math.PI
const COORDINATE_TOLERANCE = 16 * Number.EPSILON * 256
/** Residual of the ellipse equation at a computed point: ~ε per trig value and product, scaled by (size/r)² ≤ ~16; 1000ε. */
const RESIDUAL_TOLERANCE = 1e3 * Number.EPSILON
/** Parameter of the top of the half circle: atan2 and the division by π are a few ulps of ½. */
const T_TOLERANCE = 4 * Number.EPSILON

function arcOf(...args: Parameters<typeof convertArcToCentre>): ArcSegment {
  const converted = convertArcToCentre(...args)
  if (converted.kind !== 'arc') throw new Error(`expected an arc, got ${converted.kind}`)
  return converted.segment
}

/** F.6.3: (x, y) = C + R(φ)·(rx cos θ, ry sin θ); back in the ellipse frame it satisfies (x′/rx)² + (y′/ry)² = 1. */
function ellipseResidual(arc: ArcSegment, x: number, y: number): number {
  const [, , , , cx, cy, rx, ry, c, s] = arc
  const px = c * (x - cx) + s * (y - cy), py = -s * (x - cx) + c * (y - cy)
  return (px / rx) ** 2 + (py / ry) ** 2 - 1
}

describe('F.6.5 endpoint to centre conversion', () => {
  // The four arcs of the SVG 1.1 path chapter's figure (8.3.8, from memory):
  // M125,75 a100,50 0 fA,fS 100,50 — from (125, 75) to (225, 125) with rx = 100, ry = 50, φ = 0.
  // Step 1: (x1′, y1′) = (−50, −25); Λ = 0.5; the radicand (1 − Λ)/Λ = 1, so c′ = ±(−50, 25)
  // and the centre is (175, 100) + c′: (125, 125) when fA ≠ fS, (225, 75) when fA = fS.
  const cases = [
    { largeArc: false, sweep: false, centre: [225, 75], start: Math.PI, delta: -Math.PI / 2 },
    { largeArc: false, sweep: true, centre: [125, 125], start: -Math.PI / 2, delta: Math.PI / 2 },
    { largeArc: true, sweep: false, centre: [125, 125], start: -Math.PI / 2, delta: -1.5 * Math.PI },
    { largeArc: true, sweep: true, centre: [225, 75], start: Math.PI, delta: 1.5 * Math.PI },
  ]
  for (const { largeArc, sweep, centre, start, delta } of cases) {
    it(`fA = ${Number(largeArc)}, fS = ${Number(sweep)}: centre (${centre}), θ1 = ${start.toFixed(4)}, Δθ = ${delta.toFixed(4)}`, () => {
      const arc = arcOf(125, 75, 100, 50, 0, largeArc, sweep, 225, 125)
      expectClose(arc[4], centre[0], COORDINATE_TOLERANCE, 'cx')
      expectClose(arc[5], centre[1], COORDINATE_TOLERANCE, 'cy')
      expect([arc[6], arc[7], arc[8], arc[9]]).toEqual([100, 50, 1, 0])
      expectClose(arc[10], start, ANGLE_TOLERANCE, 'θ1')
      expectClose(arc[11], delta, ANGLE_TOLERANCE, 'Δθ')
      // Step 4's conventions: fS = 1 means Δθ > 0; fA = 1 means |Δθ| > π.
      expect(arc[11] > 0).toBe(sweep)
      expect(Math.abs(arc[11]) > Math.PI).toBe(largeArc)
      // The end points are stored exactly and the parametrisation reaches them.
      expect(evaluateSegment(arc, 0)).toEqual([125, 75])
      expect(evaluateSegment(arc, 1)).toEqual([225, 125])
      const [cx, cy, rx, ry, , , a, d] = arc.slice(4)
      const endAngle = a + d
      expectClose(cx + rx * Math.cos(endAngle), 225, COORDINATE_TOLERANCE, 'end x')
      expectClose(cy + ry * Math.sin(endAngle), 125, COORDINATE_TOLERANCE, 'end y')
    })
  }

  it('places every point of a rotated arc on its ellipse (F.6.3 with φ = 30°)', () => {
    const arc = arcOf(10, 20, 40, 15, 30, true, false, 35, 5)
    for (const t of [0, 0.125, 0.5, 0.875, 1]) {
      const [x, y] = evaluateSegment(arc, t)
      expectClose(ellipseResidual(arc, x, y), 0, RESIDUAL_TOLERANCE, `t = ${t}`)
    }
    expectClose(arc[8], Math.cos(Math.PI / 6), T_TOLERANCE, 'cos φ')
  })
})

describe('F.6.6 radius correction and F.6.2 out-of-range parameters', () => {
  it('scales radii that are too small by √Λ and centres the half ellipse on the chord', () => {
    // From (0, 0) to (10, 0) with r = 1: Λ = 25, so r becomes 5 and the centre is the midpoint.
    const converted = convertArcToCentre(0, 0, 1, 1, 0, false, true, 10, 0)
    expect(converted.kind).toBe('arc')
    if (converted.kind !== 'arc') return
    expect(converted.radiusScale).toBe(5)
    const arc = converted.segment
    expect([arc[4], arc[5], arc[6], arc[7]]).toEqual([5, 0, 5, 5])
    expect(arc[10]).toBe(Math.PI)
    expect(arc[11]).toBe(Math.PI)
    // Ellipse radii keep their ratio: rx = 2, ry = 1 across a chord of 8 in x scales to 4 and 2.
    const ellipse = arcOf(0, 0, 2, 1, 0, false, false, 8, 0)
    expect([ellipse[6], ellipse[7], ellipse[11]]).toEqual([4, 2, -Math.PI])
  })

  it('turns a zero radius into a line, omits an arc with equal end points, and takes |r| of negative radii', () => {
    expect(convertArcToCentre(0, 0, 0, 5, 0, false, true, 10, 0)).toEqual({ kind: 'line', segment: [0, 0, 10, 0] })
    expect(convertArcToCentre(3, 4, 5, 5, 0, true, true, 3, 4)).toEqual({ kind: 'omitted' })
    expect(arcOf(0, 0, -5, -5, 0, false, true, 10, 0)).toEqual(arcOf(0, 0, 5, 5, 0, false, true, 10, 0))
  })
})

describe('probes against exact arcs', () => {
  // Half circle of radius 5 from (0, 0) to (10, 0) through (5, −5) (fS = 1: increasing angle, y down).
  const half = pathOf('M0 0 A5 5 0 0 1 10 0')

  it('crosses y = −3 at x = 5 ± 4 (3-4-5 triangle) on the ellipse itself', () => {
    const hits = intersectProbe(half, { type: 'line', origin: [-10, -3], direction: [1, 0] })
    expect(hits.map((h) => [h.kind, h.winding])).toEqual([['crossing', -1], ['crossing', 1]])
    expectClose(hits[0].point[0], 1, COORDINATE_TOLERANCE, 'x1')
    expectClose(hits[1].point[0], 9, COORDINATE_TOLERANCE, 'x2')
    expectClose(hits[0].s, 11, COORDINATE_TOLERANCE, 's1')
  })

  it('touches y = −5 once at the top (t = ½)', () => {
    const hits = intersectProbe(half, { type: 'line', origin: [-10, -5], direction: [1, 0] })
    expect(hits.map((h) => h.kind)).toEqual(['tangent'])
    expectClose(hits[0].t, 0.5, T_TOLERANCE, 't')
    expectClose(hits[0].point[0], 5, COORDINATE_TOLERANCE, 'x')
  })

  it('does not meet the other half of its circle', () => {
    expect(intersectProbe(half, { type: 'line', origin: [-10, 3], direction: [1, 0] })).toEqual([])
  })

  it('crosses a circle made of two arcs at the joins once each, and touches its top and bottom', () => {
    const circle = pathOf('M0 0 A5 5 0 0 1 10 0 A5 5 0 0 1 0 0 Z')
    const across = intersectProbe(circle, { type: 'line', origin: [-10, 0], direction: [1, 0] })
    expect(across).toEqual([
      { segment: 0, t: 0, s: 10, point: [0, 0], kind: 'crossing', winding: -1 },
      { segment: 1, t: 0, s: 20, point: [10, 0], kind: 'crossing', winding: 1 },
    ])
    expect(intersectProbe(circle, { type: 'line', origin: [-10, 5], direction: [1, 0] }).map((h) => h.kind)).toEqual(['tangent'])
  })

  it('meets a rotated ellipse where the probe meets the ellipse equation', () => {
    const path = pathOf('M10 20 A40 15 30 1 0 35 5')
    const arc = path.segments[0] as ArcSegment
    // A line through the centre meets the whole ellipse twice; the large arc (|Δθ| > π) holds at least one.
    const hits = intersectProbe(path, { type: 'line', origin: [arc[4], arc[5]], direction: [1, 0.25] })
    expect(hits.length).toBeGreaterThan(0)
    for (const hit of hits) expectClose(ellipseResidual(arc, hit.point[0], hit.point[1]), 0, RESIDUAL_TOLERANCE, 'on ellipse')
  })
})
