/**
 * Seeded property tests (fast-check) of probes on random paths. fast-check prints the seed,
 * the run and the shrunk counterexample of any failure.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { containsPoints, evaluateSegment, intersectProbe, windingNumber } from '../../shared/geometry/index'
import type { Hit, NormalisedPath, Point, Probe } from '../../shared/geometry/index'
import { distanceToLine, pathOf } from './support/geometry-helpers'

const SEED = 20_261_201
const RUNS = 300
/**
 * Bound on a meeting point's distance from the probe line and on the agreement of points
 * under reversal and translation: 2^-30·L (≈ 1e-9 relative). A simple root is far closer
 * (ulps); near-tangent roots are conditioned like √ε, whose 1.5e-8 the bound would not cover,
 * but there |g| stays within the 2^-46 on-probe band, which is what the distance measures.
 */
const BOUND_REL = 2 ** -30

const coordinate = fc.oneof(fc.integer({ min: -40, max: 40 }), fc.double({ min: -40, max: 40, noNaN: true, noDefaultInfinity: true }))
/** Multiples of 1/64: translation by integers is then exact, so only the geometry moves. */
const dyadicCoordinate = fc.integer({ min: -2560, max: 2560 }).map((n) => n / 64)

function pathArbitraries(coordinateArb: fc.Arbitrary<number>) {
  const pointArb = fc.tuple(coordinateArb, coordinateArb)
  const command = fc.oneof(
    fc.tuple(fc.constant('L'), pointArb).map(([, p]) => `L${p[0]} ${p[1]}`),
    fc.tuple(pointArb, pointArb).map(([a, b]) => `Q${a[0]} ${a[1]} ${b[0]} ${b[1]}`),
    fc.tuple(pointArb, pointArb, pointArb).map(([a, b, c]) => `C${a[0]} ${a[1]} ${b[0]} ${b[1]} ${c[0]} ${c[1]}`),
    fc.tuple(fc.integer({ min: 1, max: 30 }), fc.integer({ min: 1, max: 30 }), fc.integer({ min: 0, max: 359 }), fc.boolean(), fc.boolean(), pointArb)
      .map(([rx, ry, rotation, large, sweep, p]) => `A${rx} ${ry} ${rotation} ${Number(large)} ${Number(sweep)} ${p[0]} ${p[1]}`),
  )
  const subpathArb = fc.tuple(pointArb, fc.array(command, { minLength: 1, maxLength: 5 }), fc.boolean())
    .map(([start, commands, close]) => `M${start[0]} ${start[1]} ${commands.join(' ')}${close ? ' Z' : ''}`)
  const pathArb = fc.array(subpathArb, { minLength: 1, maxLength: 3 }).map((subpaths) => subpaths.join(' '))
  const closedPathArb = fc.array(subpathArb.map((d) => (d.endsWith('Z') ? d : `${d} Z`)), { minLength: 1, maxLength: 3 }).map((s) => s.join(' '))
  /** Axis directions often (where joins and overlaps show up), random ones otherwise. */
  const directionArb = fc.oneof(
    fc.constantFrom<Point>([1, 0], [0, 1], [-1, 0], [0, -1], [1, 1], [3, -2]),
    fc.tuple(coordinateArb, coordinateArb).filter(([x, y]) => Math.hypot(x, y) > 1e-3),
  )
  const probeArb = fc.tuple(fc.constantFrom('ray', 'line', 'segment'), pointArb, directionArb).map(([type, origin, direction]): Probe =>
    type === 'segment'
      ? { type, from: origin, to: [origin[0] + direction[0], origin[1] + direction[1]] }
      : { type: type as 'ray' | 'line', origin, direction },
  )
  return { pointArb, pathArb, closedPathArb, probeArb, directionArb }
}
const { pointArb, pathArb, closedPathArb, probeArb, directionArb } = pathArbitraries(coordinate)
const dyadic = pathArbitraries(dyadicCoordinate)

function probeLine(probe: Probe): { origin: Point; direction: Point; sMin: number; sMax: number } {
  if (probe.type === 'segment') return { origin: probe.from, direction: [probe.to[0] - probe.from[0], probe.to[1] - probe.from[1]], sMin: 0, sMax: 1 }
  return { origin: probe.origin, direction: probe.direction, sMin: probe.type === 'ray' ? 0 : -Infinity, sMax: Infinity }
}
function magnitude(path: NormalisedPath, probe: Probe): number {
  const { origin } = probeLine(probe)
  let scale = Math.max(Math.abs(origin[0]), Math.abs(origin[1]), 1)
  for (const segment of path.segments) {
    const values = segment.length === 12 ? [...segment.slice(0, 4), Math.abs(segment[4]) + segment[6], Math.abs(segment[5]) + segment[7]] : segment
    for (const v of values) scale = Math.max(scale, Math.abs(v))
  }
  return scale
}
const options = { seed: SEED, numRuns: RUNS }

describe('properties of probe hits', () => {
  it('puts every hit on its segment and on the probe, inside the probe range', () => {
    fc.assert(fc.property(pathArb, probeArb, (pathData, probe) => {
      const path = pathOf(pathData)
      const bound = BOUND_REL * magnitude(path, probe)
      const { origin, direction, sMin, sMax } = probeLine(probe)
      for (const hit of intersectProbe(path, probe)) {
        const [x, y] = evaluateSegment(path.segments[hit.segment], hit.t)
        expect(Math.hypot(x - hit.point[0], y - hit.point[1])).toBeLessThanOrEqual(bound)
        expect(distanceToLine(x, y, origin[0], origin[1], direction[0], direction[1])).toBeLessThanOrEqual(bound)
        expect(Math.hypot(origin[0] + hit.s * direction[0] - x, origin[1] + hit.s * direction[1] - y)).toBeLessThanOrEqual(bound)
        expect(hit.s).toBeGreaterThanOrEqual(sMin)
        expect(hit.s).toBeLessThanOrEqual(sMax)
        if (hit.kind === 'overlap') {
          const [ex, ey] = evaluateSegment(path.segments[hit.segment], hit.tEnd as number)
          expect(Math.hypot(origin[0] + (hit.sEnd as number) * direction[0] - ex, origin[1] + (hit.sEnd as number) * direction[1] - ey))
            .toBeLessThanOrEqual(bound)
        } else {
          expect(Math.abs(hit.winding) === 1).toBe(hit.kind === 'crossing')
        }
      }
    }), options)
  })

  it('gives the same points when a line is reversed, with s and windings negated', () => {
    fc.assert(fc.property(pathArb, pointArb, directionArb, (pathData, origin, direction) => {
      const path = pathOf(pathData)
      const forward = intersectProbe(path, { type: 'line', origin, direction })
      const backward = intersectProbe(path, { type: 'line', origin, direction: [-direction[0], -direction[1]] })
      const bound = BOUND_REL * magnitude(path, { type: 'line', origin, direction })
      expect(backward).toHaveLength(forward.length)
      const key = (h: Hit): string => `${h.segment}:${h.kind}`
      const sortedForward = [...forward].sort((a, b) => a.segment - b.segment || a.t - b.t)
      const sortedBackward = [...backward].sort((a, b) => a.segment - b.segment || a.t - b.t)
      sortedForward.forEach((hit, i) => {
        const other = sortedBackward[i]
        expect(key(other)).toBe(key(hit))
        if (hit.kind === 'overlap') {
          // Reversed, the overlap's low-s end is its other end: compare the two ends as a set.
          const ends = (h: Hit): number[] => [h.t, h.tEnd as number].sort((a, b) => a - b)
          ends(other).forEach((t, k) => expect(Math.abs(t - ends(hit)[k])).toBeLessThanOrEqual(bound))
        } else {
          expect(Math.hypot(other.point[0] - hit.point[0], other.point[1] - hit.point[1])).toBeLessThanOrEqual(bound)
          expect(other.winding + hit.winding).toBe(0)
          expect(Math.abs(other.s + hit.s)).toBeLessThanOrEqual(bound)
        }
      })
    }), options)
  })

  it('moves the hits with the path and probe when both are translated, and nothing else', () => {
    const shift = fc.tuple(fc.integer({ min: -1000, max: 1000 }), fc.integer({ min: -1000, max: 1000 }))
    fc.assert(fc.property(dyadic.pathArb, dyadic.probeArb, shift, (pathData, probe, [tx, ty]) => {
      const path = pathOf(pathData)
      const moved: NormalisedPath = {
        subpaths: path.subpaths,
        segments: path.segments.map((segment) => {
          const values = [...segment]
          const points = segment.length === 12 ? 3 : segment.length / 2
          for (let k = 0; k < points; k++) {
            const index = segment.length === 12 && k === 2 ? 4 : 2 * k
            values[index] += tx
            values[index + 1] += ty
          }
          return values as unknown as typeof segment
        }),
      }
      const movedProbe: Probe = probe.type === 'segment'
        ? { type: 'segment', from: [probe.from[0] + tx, probe.from[1] + ty], to: [probe.to[0] + tx, probe.to[1] + ty] }
        : { ...probe, origin: [probe.origin[0] + tx, probe.origin[1] + ty] }
      const before = intersectProbe(path, probe)
      const after = intersectProbe(moved, movedProbe)
      const bound = BOUND_REL * magnitude(moved, movedProbe)
      expect(after.map((h) => `${h.segment}:${h.kind}:${h.winding}`).sort()).toEqual(before.map((h) => `${h.segment}:${h.kind}:${h.winding}`).sort())
      const order = (hits: Hit[]): Hit[] => [...hits].sort((a, b) => a.segment - b.segment || a.t - b.t)
      order(after).forEach((hit, i) => {
        const original = order(before)[i]
        expect(Math.hypot(hit.point[0] - tx - original.point[0], hit.point[1] - ty - original.point[1])).toBeLessThanOrEqual(bound)
      })
    }), options)
  })

  it('sums the windings along any ray from a point to its containment winding', () => {
    fc.assert(fc.property(closedPathArb, pointArb, directionArb, (pathData, point, direction) => {
      const path = pathOf(pathData)
      const [containment] = containsPoints(path, [point])
      fc.pre(!containment.onBoundary)
      const sum = intersectProbe(path, { type: 'ray', origin: point, direction }).reduce((total, hit) => total + hit.winding, 0)
      expect(sum).toBe(containment.winding)
      expect(windingNumber(path, point)).toBe(containment.winding)
    }), options)
  })
})
