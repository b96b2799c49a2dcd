/**
 * The audit's probe generators, by hand on a unit square and on circles made of four cubics
 * and of four arcs; the seeded cap; and the seeded generator against the tests' own copy.
 */
import { describe, expect, it } from 'vitest'
import { generateProbes } from '../../shared/audit/index'
import type { AuditGenerators, GeneratedProbe } from '../../shared/audit/index'
import { countByCategory } from '../../shared/audit/generate-probes'
import { createMulberry32 as createAuditMulberry32 } from '../../shared/audit/random'
import { intersectProbe } from '../../shared/geometry/index'
import type { Probe } from '../../shared/geometry/index'
import { createMulberry32 } from '../helpers/seeded-random'
import { pathOf } from '../geometry/support/geometry-helpers'

const SEED = 913
const NONE: AuditGenerators = { randomRays: 0, sweepSpacing: null, vertexProbes: false, extremumProbes: false, maxProbesPerPath: 10000 }
const UNIT_SQUARE = pathOf('M0 0H1V1H0Z')
/**
 * Circle of radius 1 about the origin from four cubics, control distance k = 4(√2 − 1)/3
 * (common practice: the cubic then meets the circle at its ends and midpoint).
 */
const K = (4 * (Math.SQRT2 - 1)) / 3
const CUBIC_CIRCLE = pathOf(`M1 0C1 ${K} ${K} 1 0 1C${-K} 1 -1 ${K} -1 0C-1 ${-K} ${-K} -1 0 -1C${K} -1 1 ${-K} 1 0Z`)
/** The same circle from four SVG quarter arcs. */
const ARC_CIRCLE = pathOf('M1 0A1 1 0 0 1 0 1A1 1 0 0 1 -1 0A1 1 0 0 1 0 -1A1 1 0 0 1 1 0Z')
/**
 * Arc end points and extrema are computed through cos/sin of the arc angles: a few ulps of
 * the radius 1, so 2^-48 (≈ 3.6e-15, 16 ulps of 1) bounds their distance from the exact point.
 */
const ARC_POINT_TOLERANCE = 2 ** -48

function originOf(probe: Probe): readonly [number, number] {
  if (probe.type === 'segment') throw new Error('the generators make rays and lines only')
  return probe.origin
}
function directionOf(probe: Probe): readonly [number, number] {
  if (probe.type === 'segment') throw new Error('the generators make rays and lines only')
  return probe.direction
}

describe('vertex probes', () => {
  const probes = generateProbes(UNIT_SQUARE, { ...NONE, vertexProbes: true }, SEED)

  it('give one line through each of the four corners of a unit square', () => {
    expect(probes.map((p) => p.category)).toEqual(['vertex', 'vertex', 'vertex', 'vertex'])
    expect(probes.map((p) => p.probe.type)).toEqual(['line', 'line', 'line', 'line'])
    expect(probes.map((p) => originOf(p.probe))).toEqual([[0, 0], [1, 0], [1, 1], [0, 1]])
  })

  it('at seeded angles: unit directions, different per vertex, each line meeting the square at its corner', () => {
    const angles = probes.map((p) => Math.atan2(directionOf(p.probe)[1], directionOf(p.probe)[0]))
    for (const [x, y] of probes.map((p) => directionOf(p.probe))) expect(Math.abs(Math.hypot(x, y) - 1)).toBeLessThan(4 * Number.EPSILON)
    expect(new Set(angles).size).toBe(4)
    for (const { probe } of probes) {
      const [cx, cy] = originOf(probe)
      const hits = intersectProbe(UNIT_SQUARE, probe)
      expect(hits.some((hit) => hit.point[0] === cx && hit.point[1] === cy), `corner (${cx}, ${cy}), seed ${SEED}`).toBe(true)
    }
  })

  it('an open subpath adds its end; a square has no extremum probes (its sides are lines)', () => {
    const open = generateProbes(pathOf('M0 0L4 0L4 3'), { ...NONE, vertexProbes: true }, SEED)
    expect(open.map((p) => originOf(p.probe))).toEqual([[0, 0], [4, 0], [4, 3]])
    expect(generateProbes(UNIT_SQUARE, { ...NONE, extremumProbes: true }, SEED)).toEqual([])
  })
})

describe('extremum probes', () => {
  for (const [label, circle, tolerance] of [['four cubics', CUBIC_CIRCLE, 0], ['four arcs', ARC_CIRCLE, ARC_POINT_TOLERANCE]] as const) {
    it(`of a circle from ${label}: a horizontal line at the top and bottom, a vertical one left and right, each tangent`, () => {
      const probes = generateProbes(circle, { ...NONE, extremumProbes: true }, SEED)
      expect(probes).toHaveLength(4)
      const expected = [
        { origin: [0, 1], direction: [1, 0] }, { origin: [0, -1], direction: [1, 0] },
        { origin: [1, 0], direction: [0, 1] }, { origin: [-1, 0], direction: [0, 1] },
      ]
      for (const want of expected) {
        const found = probes.find(({ probe }) => directionOf(probe)[0] === want.direction[0]
          && Math.hypot(originOf(probe)[0] - want.origin[0], originOf(probe)[1] - want.origin[1]) <= tolerance)
        expect(found, `${label}: no probe through (${want.origin}) along (${want.direction})`).toBeDefined()
        const hits = intersectProbe(circle, found!.probe)
        expect(hits.map((hit) => [hit.kind, hit.winding]), `${label} at (${want.origin})`).toEqual([['tangent', 0]])
      }
    })
  }

  it('of a quadratic arch: one horizontal line through its apex, none vertical', () => {
    // y(t) = 10(1 − t)² + 10t² is lowest at t = ½, where x(t) = 10t is 5; x′ = 10 never vanishes
    const probes = generateProbes(pathOf('M0 10Q5 0 10 10'), { ...NONE, extremumProbes: true }, SEED)
    expect(probes.map((p) => p.probe)).toEqual([{ type: 'line', origin: [5, 5], direction: [1, 0] }])
  })
})

describe('sweep rows and random rays', () => {
  it('sweep rows sit at the pixel centres y = (k + ½)·spacing across the box, directed +x from its left edge', () => {
    const rows = generateProbes(pathOf('M2 0H6V1.5H2Z'), { ...NONE, sweepSpacing: 0.25 }, SEED)
    expect(rows.map((p) => p.probe)).toEqual([0.125, 0.375, 0.625, 0.875, 1.125, 1.375].map((y) => ({ type: 'line', origin: [2, y], direction: [1, 0] })))
    expect(generateProbes(UNIT_SQUARE, { ...NONE, sweepSpacing: 3 }, SEED)).toEqual([])
  })

  it('random rays start inside the box grown by 5% of the size on each side, with unit directions', () => {
    // box [0, 4] × [0, 2]: size 4, grown by 0.2 on each side
    const rays = generateProbes(pathOf('M0 0H4V2H0Z'), { ...NONE, randomRays: 400 }, SEED)
    expect(rays).toHaveLength(400)
    let left = Infinity, right = -Infinity, top = Infinity, bottom = -Infinity
    for (const { probe, category } of rays) {
      expect(category).toBe('random-ray')
      expect(probe.type).toBe('ray')
      const [x, y] = originOf(probe)
      left = Math.min(left, x); right = Math.max(right, x); top = Math.min(top, y); bottom = Math.max(bottom, y)
      expect(Math.abs(Math.hypot(...directionOf(probe)) - 1)).toBeLessThan(4 * Number.EPSILON)
    }
    expect(left).toBeGreaterThanOrEqual(-0.2)
    expect(right).toBeLessThan(4.2)
    expect(top).toBeGreaterThanOrEqual(-0.2)
    expect(bottom).toBeLessThan(2.2)
    // 400 uniform origins reach within 0.1 of every side of the box (each miss has odds below 1e-8)
    expect([left < -0.1, right > 4.1, top < -0.1, bottom > 2.1]).toEqual([true, true, true, true])
  })

  it('each ray comes from its own stream: the first rays do not change when more are asked for', () => {
    const ten = generateProbes(UNIT_SQUARE, { ...NONE, randomRays: 10 }, SEED)
    const twenty = generateProbes(UNIT_SQUARE, { ...NONE, randomRays: 20 }, SEED)
    expect(twenty.slice(0, 10)).toEqual(ten)
    expect(generateProbes(UNIT_SQUARE, { ...NONE, randomRays: 10 }, SEED + 1)).not.toEqual(ten)
  })
})

describe('the cap on probes per path', () => {
  const all: AuditGenerators = { randomRays: 30, sweepSpacing: 0.1, vertexProbes: true, extremumProbes: true, maxProbesPerPath: 10000 }
  const uncapped = generateProbes(CUBIC_CIRCLE, all, SEED)
  const key = (p: GeneratedProbe): string => JSON.stringify(p)

  it('keeps a seeded sample of the full list, in its order', () => {
    // 30 rays, 20 rows across [−1, 1], 4 vertices, 4 extremum lines
    expect(countByCategory(uncapped)).toEqual({ 'random-ray': 30, sweep: 20, vertex: 4, extremum: 4 })
    const capped = generateProbes(CUBIC_CIRCLE, { ...all, maxProbesPerPath: 12 }, SEED)
    expect(capped).toHaveLength(12)
    const positions = capped.map((p) => uncapped.findIndex((q) => key(q) === key(p)))
    expect(positions.every((i) => i >= 0), `positions ${positions}`).toBe(true)
    expect([...positions].sort((a, b) => a - b)).toEqual(positions)
    expect(new Set(positions).size).toBe(12)
    expect(generateProbes(CUBIC_CIRCLE, { ...all, maxProbesPerPath: 12 }, SEED)).toEqual(capped)
    expect(generateProbes(CUBIC_CIRCLE, { ...all, maxProbesPerPath: 12 }, SEED + 1).map(key)).not.toEqual(capped.map(key))
  })

  it('keeps everything when the list is no longer than the cap', () => {
    expect(generateProbes(CUBIC_CIRCLE, { ...all, maxProbesPerPath: uncapped.length }, SEED)).toEqual(uncapped)
  })

  it('throws RangeError for malformed generators and seeds; a path without segments has no probes', () => {
    for (const bad of [
      { ...all, maxProbesPerPath: 0 }, { ...all, maxProbesPerPath: 10001 }, { ...all, maxProbesPerPath: 2.5 },
      { ...all, randomRays: -1 }, { ...all, sweepSpacing: 0 }, { ...all, sweepSpacing: Number.NaN },
      { ...all, sweepSpacing: 1e-300 }, { ...all, vertexProbes: 'yes' as unknown as boolean },
    ]) {
      expect(() => generateProbes(CUBIC_CIRCLE, bad, SEED), JSON.stringify(bad)).toThrow(RangeError)
    }
    expect(() => generateProbes(CUBIC_CIRCLE, all, 0.5)).toThrow(RangeError)
    expect(generateProbes(pathOf('M3 3'), all, SEED)).toEqual([])
  })
})

describe('the audit generator', () => {
  it('is mulberry32: the same stream as the tests own copy, for several seeds', () => {
    for (const seed of [0, 1, SEED, 0xffffffff]) {
      const ours = createAuditMulberry32(seed), theirs = createMulberry32(seed)
      const a = Array.from({ length: 8 }, () => ours()), b = Array.from({ length: 8 }, () => theirs())
      expect(a, `seed ${seed}`).toEqual(b)
    }
  })
})
