/**
 * Font-unit outlines with integer coordinates, and the same shapes offset by 1e6: probes
 * through on-curve points and extrema (where joins and touches must be found exactly once).
 * The glyph is invented (fixtures/glyph-o-quadratic.json); expected hits are its on-curve
 * points, read off the data.
 */
import { describe, expect, it } from 'vitest'
import { containsPoints, intersectProbe, parsePathData, windingNumber } from '../../shared/geometry/index'
import type { Hit, NormalisedPath } from '../../shared/geometry/index'
import glyph from './fixtures/glyph-o-quadratic.json'
import { expectClose, pathOf } from './support/geometry-helpers'

/** Offset of the translated copy; its coordinates carry ulp(1e6) ≈ 1.2e-10 each. */
const OFFSET = 1e6
/** Hits of the offset copy agree within 64 ulps of 1e6 (rounding of P − origin and of the roots). */
const OFFSET_TOLERANCE = 64 * Number.EPSILON * OFFSET
/** Non-integer expected points are correctly rounded exact values: 64 ulps of the glyph size 1000. */
const ROOT_TOLERANCE = 64 * Number.EPSILON * 1000

function translate(pathData: string, by: number): string {
  const parsed = parsePathData(pathData)
  if (!parsed.ok) throw new Error(parsed.error.message)
  // Absolute commands only in the fixture: shift every coordinate pair.
  return pathData.replace(/(-?\d+(?:\.\d+)?) (-?\d+(?:\.\d+)?)/g, (_, x: string, y: string) => `${Number(x) + by} ${Number(y) + by}`)
}

type Expected = readonly (readonly [number, string, number])[]
function check(hits: readonly Hit[], expected: Expected, coordinate: 0 | 1, offset: number, tolerance: number): void {
  expect(hits.map((h) => [h.kind, h.winding])).toEqual(expected.map(([, kind, winding]) => [kind, winding]))
  hits.forEach((hit, i) => {
    const value = expected[i][0]
    expectClose(hit.point[coordinate], value + offset, Number.isInteger(value) ? tolerance : Math.max(tolerance, ROOT_TOLERANCE), `hit ${i}`)
  })
}

function probeGlyph(path: NormalisedPath, offset: number, tolerance: number): void {
  for (const probe of glyph.horizontalProbes) {
    const hits = intersectProbe(path, { type: 'line', origin: [offset - 100, probe.y + offset], direction: [1, 0] })
    check(hits, probe.hits as unknown as Expected, 0, offset, tolerance)
    // Vertices (integer x) lie exactly on the probe; interior roots are curve points P(t).
    hits.forEach((hit, i) => {
      const onVertex = Number.isInteger(probe.hits[i][0])
      expectClose(hit.point[1], probe.y + offset, onVertex ? tolerance : Math.max(tolerance, ROOT_TOLERANCE), 'y')
    })
  }
  for (const probe of glyph.verticalProbes) {
    const hits = intersectProbe(path, { type: 'line', origin: [probe.x + offset, offset - 100], direction: [0, 1] })
    check(hits, probe.hits as unknown as Expected, 1, offset, tolerance)
  }
}

describe('a quadratic glyph in font units', () => {
  const path = pathOf(glyph.path)

  it('has 16 segments in two closed subpaths', () => {
    expect(path.segments).toHaveLength(16)
    expect(path.subpaths.map((s) => s.closed)).toEqual([true, true])
  })

  it('finds every probe through on-curve points and extrema exactly once, at the exact integer point', () => {
    probeGlyph(path, 0, 0)
  })

  it('gives the expected winding for points in the stroke, the counter and outside', () => {
    for (const { at, winding } of glyph.points) expect(windingNumber(path, at as [number, number])).toBe(winding)
    const inside = containsPoints(path, glyph.points.map((p) => p.at as [number, number]), 'evenodd').map((r) => r.inside)
    expect(inside).toEqual(glyph.points.map((p) => p.winding % 2 !== 0))
  })
})

describe('the same glyph offset by 1e6', () => {
  const path = pathOf(translate(glyph.path, OFFSET))

  it('moves every hit by the offset and keeps kinds and windings', () => {
    probeGlyph(path, OFFSET, OFFSET_TOLERANCE)
  })

  it('keeps the windings of the points', () => {
    for (const { at, winding } of glyph.points) expect(windingNumber(path, [at[0] + OFFSET, at[1] + OFFSET])).toBe(winding)
  })
})
