/**
 * compareHits on hand-made hit lists: pairs just inside and just outside each tolerance,
 * greedy nearest pairing, missing and extra hits, kinds and winding under the rules, and a
 * seeded property (a list compared with a shuffled, slightly moved copy of itself).
 * The offsets are dyadic so that every distance below is exact in double precision.
 */
import { describe, expect, it } from 'vitest'
import type { Hit } from '../../shared/geometry'
import { compareHits, countDifferences, describeCheckOutcome, describeDifferences, type HitTolerance } from '../../shared/checks/compare-hits'
import { createSeededRandom } from '../helpers/seeded-random'

const STRICT = { matchKinds: true, matchWinding: true } as const
const LOOSE = { matchKinds: false, matchWinding: false } as const
/** Wide enough in t that only the point tolerance decides (t lies in [0, 1]). */
const ANY_T = 1
/** Wide enough in distance that only the t tolerance decides (test points lie within 100 units). */
const ANY_POINT = 1000

function hit(x: number, y: number, extra: Partial<Hit> = {}): Hit {
  return { segment: 2, t: 0.25, s: x, point: [x, y], kind: 'crossing', winding: 1, ...extra }
}

/** The next double below a positive number. */
function below(value: number): number {
  return value - value * Number.EPSILON / 2
}

describe('compareHits: the point tolerance', () => {
  // (0.375, 0.5) is a 3-4-5 triangle scaled by 1/8: the distance is exactly 0.625.
  const expected = [hit(8, 2)]
  const actual = [hit(8.375, 2.5)]

  it('accepts a hit exactly at the tolerance (inclusive)', () => {
    expect(compareHits(expected, actual, { point: 0.625, t: ANY_T }, STRICT)).toEqual([])
  })

  it('calls a hit one ulp beyond it moved, with its distance and |Δt|', () => {
    const diffs = compareHits(expected, actual, { point: below(0.625), t: ANY_T }, STRICT)
    expect(diffs).toEqual([{ kind: 'moved', expected: expected[0], actual: actual[0], distance: 0.625, tError: 0 }])
  })
})

describe('compareHits: the t tolerance', () => {
  const step = 2 ** -20
  const expected = [hit(4, 4, { t: 0.25 })]
  const actual = [hit(4, 4, { t: 0.25 + step })]

  it('accepts |Δt| exactly at the tolerance', () => {
    expect(compareHits(expected, actual, { point: ANY_POINT, t: step }, STRICT)).toEqual([])
  })

  it('calls |Δt| above it moved, even at the same point', () => {
    const diffs = compareHits(expected, actual, { point: ANY_POINT, t: below(step) }, STRICT)
    expect(diffs).toEqual([{ kind: 'moved', expected: expected[0], actual: actual[0], distance: 0, tError: step }])
  })

  it('takes the larger of |Δt| and |ΔtEnd| for two overlaps', () => {
    const e = hit(1, 0, { kind: 'overlap', winding: 0, sEnd: 3, tEnd: 0.75 })
    const a = hit(1, 0, { kind: 'overlap', winding: 0, sEnd: 3.5, tEnd: 0.875 })
    expect(compareHits([e], [a], { point: ANY_POINT, t: 0.125 }, STRICT)).toEqual([])
    expect(compareHits([e], [a], { point: ANY_POINT, t: 0.0625 }, STRICT)).toEqual([
      { kind: 'moved', expected: e, actual: a, distance: 0, tError: 0.125 },
    ])
  })
})

describe('compareHits: pairing', () => {
  const tight: HitTolerance = { point: 0.25, t: ANY_T }

  it('pairs only on the same segment: the same point on another segment is missing plus extra', () => {
    const e = hit(5, 5, { segment: 1 })
    const a = hit(5, 5, { segment: 3 })
    expect(compareHits([e], [a], tight, STRICT)).toEqual([
      { kind: 'missing', expected: e, actual: null, distance: null, tError: null },
      { kind: 'extra', expected: null, actual: a, distance: null, tError: null },
    ])
  })

  it('pairs nearest points first, whatever the order of the lists', () => {
    const expected = [hit(10, 0), hit(10.5, 0)]
    const actual = [hit(10.5, 0), hit(10.125, 0)]
    expect(compareHits(expected, actual, tight, STRICT)).toEqual([])
    expect(compareHits(expected, [...actual].reverse(), tight, STRICT)).toEqual([])
  })

  it('names what is missing and what is extra, in the order along the probe', () => {
    const expected = [hit(1, 0), hit(6, 0), hit(9, 0)]
    const actual = [hit(9, 0), hit(3, 0, { segment: 7 }), hit(1, 0)]
    const diffs = compareHits(expected, actual, tight, STRICT)
    expect(diffs.map((d) => [d.kind, (d.expected ?? d.actual)?.s])).toEqual([['extra', 3], ['missing', 6]])
  })

  it('calls the nearest leftover on the same segment moved, the rest missing', () => {
    const expected = [hit(2, 0), hit(7, 0)]
    const actual = [hit(3, 0)]
    const diffs = compareHits(expected, actual, tight, STRICT)
    expect(diffs).toEqual([
      { kind: 'moved', expected: expected[0], actual: actual[0], distance: 1, tError: 0 },
      { kind: 'missing', expected: expected[1], actual: null, distance: null, tError: null },
    ])
  })

  it('finds nothing for two empty lists and everything for one', () => {
    expect(compareHits([], [], tight, STRICT)).toEqual([])
    expect(compareHits([hit(1, 1), hit(2, 2)], [], tight, STRICT).map((d) => d.kind)).toEqual(['missing', 'missing'])
    expect(compareHits([], [hit(1, 1)], tight, STRICT).map((d) => d.kind)).toEqual(['extra'])
  })
})

describe('compareHits: kinds and winding', () => {
  const tol: HitTolerance = { point: 0.5, t: ANY_T }
  const e = hit(3, 3, { kind: 'crossing', winding: -1 })

  it('reports a changed kind only when the rules ask for kinds', () => {
    const a = hit(3, 3, { kind: 'tangent', winding: -1 })
    expect(compareHits([e], [a], tol, STRICT)).toEqual([{ kind: 'kind', expected: e, actual: a, distance: 0, tError: 0 }])
    expect(compareHits([e], [a], tol, { matchKinds: false, matchWinding: true })).toEqual([])
  })

  it('reports a changed winding only when the rules ask for winding', () => {
    const a = hit(3, 3, { winding: 1 })
    expect(compareHits([e], [a], tol, STRICT).map((d) => d.kind)).toEqual(['winding'])
    expect(compareHits([e], [a], tol, { matchKinds: true, matchWinding: false })).toEqual([])
  })

  it('reports a moved hit that also changed kind and winding three times, moved first', () => {
    const a = hit(4, 3, { kind: 'tangent', winding: 0 })
    expect(compareHits([e], [a], tol, STRICT).map((d) => d.kind)).toEqual(['moved', 'kind', 'winding'])
    expect(compareHits([e], [a], tol, LOOSE).map((d) => d.kind)).toEqual(['moved'])
  })
})

describe('compareHits: malformed calls', () => {
  it('refuses a negative or non-finite tolerance', () => {
    expect(() => compareHits([], [], { point: -0.5, t: 0 }, STRICT)).toThrow(RangeError)
    expect(() => compareHits([], [], { point: 0, t: Number.NaN }, STRICT)).toThrow(RangeError)
    expect(() => compareHits([], [], { point: Infinity, t: 0 }, STRICT)).toThrow(RangeError)
  })
})

describe('compareHits: a shuffled copy moved by less than the tolerance', () => {
  /** Hits in the property stay at least this far apart, four times the perturbation below. */
  const SPACING = 1
  /** Each coordinate moves by at most a quarter of the spacing, so the nearest pairing is the true one. */
  const WIGGLE = SPACING / 4

  it('has no differences, and loses exactly the hits removed from it', () => {
    for (const seed of [11, 2027, 90210]) {
      const random = createSeededRandom(seed)
      const count = random.integer(3, 12)
      const expected = Array.from({ length: count }, (_, i) =>
        hit(i * 4 * SPACING, random.uniform(-50, 50), { segment: random.integer(0, 2), t: random.next() }))
      const moved = expected.map((h) => ({ ...h, point: [h.point[0] + random.uniform(-WIGGLE, WIGGLE), h.point[1] + random.uniform(-WIGGLE, WIGGLE)] as const }))
      const shuffled = [...moved].sort(() => random.next() - 0.5)
      const where = `seed ${seed}, hits ${JSON.stringify(expected)}`
      expect(compareHits(expected, shuffled, { point: 2 * WIGGLE, t: 0 }, STRICT), where).toEqual([])
      const removed = shuffled.slice(1)
      const diffs = compareHits(expected, removed, { point: 2 * WIGGLE, t: 0 }, STRICT)
      expect(countDifferences(diffs), where).toEqual({ missing: 1, extra: 0, moved: 0, kind: 0, winding: 0 })
      expect(diffs[0].expected?.s, where).toBe(expected.find((h) => h.s === shuffled[0].s)?.s)
    }
  })
})

describe('describeDifferences', () => {
  it('counts each kind in a fixed order, and says so when there is none', () => {
    const kinds = ['missing', 'moved', 'missing', 'winding', 'extra'] as const
    expect(describeDifferences(kinds.map((kind) => ({ kind })))).toBe('2 missing, 1 extra, 1 moved, 1 changed winding')
    expect(describeDifferences([])).toBe('no differences')
  })
})

describe('describeCheckOutcome', () => {
  it('gives the error first, then the summary, then only the count when the list was cut', () => {
    const differences = [{ kind: 'moved' as const }, { kind: 'extra' as const }]
    expect(describeCheckOutcome({ error: 'The path data does not parse.', differences: [], differenceCount: 0 })).toBe('The path data does not parse.')
    expect(describeCheckOutcome({ error: null, differences, differenceCount: 2 })).toBe('1 extra, 1 moved')
    expect(describeCheckOutcome({ error: null, differences, differenceCount: 1500 })).toBe('1500 differences')
  })
})
