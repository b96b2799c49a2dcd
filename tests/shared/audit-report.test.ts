/**
 * The audit by hand on a staircase of straight lines, the option checks, the histogram bins,
 * the order of worst cases, and the report rows and CSV.
 */
import { describe, expect, it } from 'vitest'
import {
  AUDIT_HISTOGRAM_BINS, AUDIT_HISTOGRAM_LABELS, AUDIT_REPORT_COLUMNS, AUDIT_WORST_SIZE,
  auditPath, auditReportRows, emptyAggregate, formatAuditReportCsv, mergeAggregates,
} from '../../shared/audit/index'
import type { AuditGenerators, AuditOptions, AuditWorstCase } from '../../shared/audit/index'
import { binOfError } from '../../shared/audit/aggregate'

const SEED = 4242
const NONE: AuditGenerators = { randomRays: 0, sweepSpacing: null, vertexProbes: false, extremumProbes: false, maxProbesPerPath: 10000 }
/** The demo's stair icon: ten axis-aligned lines, risers at x = 3, 8, 13, 18 and the back wall x = 21 from y = 4 to 20. */
const STAIR = { pathId: 7, name: 'Stair', data: 'M3 20V16H8V12H13V8H18V4H21V20Z' }

describe('an audit by hand: the stair swept at the pixel-centre rows', () => {
  const options: AuditOptions = { engines: ['newton', 'subdivision'], generators: { ...NONE, sweepSpacing: 1 }, seed: SEED }
  const aggregate = auditPath(STAIR, options)

  it('16 rows y = 4.5 … 19.5, each crossing one riser and the back wall: 32 pairs, 32 reference hits', () => {
    expect(aggregate.probes).toBe(16)
    expect(aggregate.probesByCategory).toEqual({ 'random-ray': 0, sweep: 16, vertex: 0, extremum: 0 })
    // the treads (y = 4, 8, 12, 16, 20) lie half a unit or more from every row: the prefilter drops them
    expect(aggregate.pairs).toBe(32)
    expect([aggregate.overlapPairs, aggregate.skippedSegments]).toEqual([0, 0])
    expect(aggregate.engines).toEqual(['subdivision', 'newton'])
    for (const engine of aggregate.byEngine) {
      // a simple crossing of a straight segment: a sign change that neither bisection nor halving can lose
      expect(engine.categories.sweep, engine.engine).toEqual({ referenceHits: 32, matched: 32, missed: 0, spurious: 0, wrongWinding: 0, wrongKind: 0 })
      expect(engine.pointErrorHistogram.reduce((a, b) => a + b, 0)).toBe(32)
    }
  })

  it('vertex probes: one line through each of the ten corners', () => {
    expect(auditPath(STAIR, { ...options, generators: { ...NONE, vertexProbes: true } }).probesByCategory.vertex).toBe(10)
  })

  it('report rows per engine and category, then the engine total, and their CSV', () => {
    const rows = auditReportRows(aggregate)
    expect(rows).toHaveLength(10)
    expect(rows[0]).toEqual(['subdivision', 'random-ray', 0, 0, 0, 0, 0, 0, 0])
    expect(rows[6]).toEqual(['newton', 'sweep', 16, 32, 32, 0, 0, 0, 0])
    expect(rows[9]).toEqual(['newton', 'all', 16, 32, 32, 0, 0, 0, 0])
    const csv = formatAuditReportCsv(aggregate)
    const lines = csv.split('\r\n')
    expect(lines[0]).toBe('engine,category,probes,referenceHits,matched,missed,spurious,wrongWinding,wrongKind')
    expect(AUDIT_REPORT_COLUMNS).toHaveLength(9)
    expect(lines[7]).toBe('newton,sweep,16,32,32,0,0,0,0')
    expect(lines).toHaveLength(12)
    expect(lines[11]).toBe('')
  })
})

describe('kinds and windings where the parameter is awkward', () => {
  it('a loop whose ends meet and a control point on an end point: every engine agrees with the reference on kind and winding', () => {
    // the demo's knot (each cubic starts and ends at (12, 12)) and map pin (its tip (12, 22) is also a control point)
    const inputs = [
      { pathId: 12, name: 'Crossing knot', data: 'M12 12C4 2 4 22 12 12C20 2 20 22 12 12Z' },
      { pathId: 4, name: 'Map pin', data: 'M12 2C8.13 2 5 5.13 5 9C5 14.25 12 22 12 22S19 14.25 19 9C19 5.13 15.87 2 12 2Z' },
    ]
    const generators = { ...NONE, vertexProbes: true, extremumProbes: true }
    for (const input of inputs) {
      const aggregate = auditPath(input, { engines: ['subdivision', 'newton', 'bezier-js', 'mathjs'], generators, seed: SEED })
      for (const engine of aggregate.byEngine) {
        for (const category of ['vertex', 'extremum'] as const) {
          const counts = engine.categories[category]
          expect(counts.referenceHits, `${input.name} ${engine.engine} ${category}`).toBeGreaterThan(0)
          expect([counts.wrongKind, counts.wrongWinding], `${input.name} ${engine.engine} ${category}, seed ${SEED}`).toEqual([0, 0])
        }
      }
    }
  })
})

describe('options and inputs', () => {
  const valid: AuditOptions = { engines: ['newton'], generators: { ...NONE, randomRays: 3 }, seed: SEED }

  it('malformed options throw RangeError', () => {
    const bad: unknown[] = [
      { ...valid, engines: [] }, { ...valid, engines: ['closed-form'] }, { ...valid, seed: 1.5 }, { ...valid, seed: Number.NaN },
      { ...valid, subdivisionTolerance: 0 }, { ...valid, subdivisionTolerance: 1 }, { ...valid, subdivisionTolerance: Number.NaN },
      { ...valid, generators: { ...NONE, maxProbesPerPath: 0 } }, null,
    ]
    for (const options of bad) expect(() => auditPath(STAIR, options as AuditOptions), JSON.stringify(options)).toThrow(RangeError)
    expect(() => emptyAggregate([])).toThrow(RangeError)
  })

  it('unparsable data counts as an invalid path; a path without segments has no probes; neither throws', () => {
    const invalid = auditPath({ pathId: 1, name: 'broken', data: 'M0 0 L' }, valid)
    expect([invalid.paths, invalid.invalidPaths, invalid.probes, invalid.pairs]).toEqual([0, 1, 0, 0])
    const empty = auditPath({ pathId: 2, name: 'moveto only', data: 'M5 5' }, valid)
    expect([empty.paths, empty.invalidPaths, empty.probes]).toEqual([1, 0, 0])
  })

  it('arcs are skipped segments; a coarser subdivision tolerance changes the errors, not the reference', () => {
    // the demo's map pin: four cubics and a hole of two arcs
    const pin = { pathId: 3, name: 'Map pin', data: 'M12 2C8.13 2 5 5.13 5 9C5 14.25 12 22 12 22S19 14.25 19 9C19 5.13 15.87 2 12 2Z M12 6.5A2.5 2.5 0 1 1 12 11.5A2.5 2.5 0 1 1 12 6.5Z' }
    const fine = auditPath(pin, { engines: ['subdivision'], generators: { ...NONE, randomRays: 40 }, seed: SEED })
    const coarse = auditPath(pin, { engines: ['subdivision'], generators: { ...NONE, randomRays: 40 }, seed: SEED, subdivisionTolerance: 2 ** -8 })
    expect(fine.skippedSegments).toBe(2)
    expect(coarse.byEngine[0].categories['random-ray'].referenceHits).toBe(fine.byEngine[0].categories['random-ray'].referenceHits)
    expect(JSON.stringify(coarse.byEngine[0].pointErrorHistogram)).not.toBe(JSON.stringify(fine.byEngine[0].pointErrorHistogram))
  })

  it('emptyAggregate deduplicates the engines into canonical order and is the identity of the merge', () => {
    expect(emptyAggregate(['mathjs', 'newton', 'mathjs']).engines).toEqual(['newton', 'mathjs'])
    const one = auditPath(STAIR, { ...valid, generators: { ...NONE, randomRays: 20 } })
    expect(JSON.stringify(mergeAggregates(emptyAggregate(['newton']), one))).toBe(JSON.stringify(one))
    expect(JSON.stringify(mergeAggregates(one, emptyAggregate(['newton'])))).toBe(JSON.stringify(one))
  })
})

describe('histogram bins', () => {
  it('exact zero, below 1e-17, the decades with their lower edge inside, then ≥ 1', () => {
    const cases: [number, number][] = [
      [0, 0], [5e-19, 1], [9.99e-18, 1], [1e-17, 2], [1e-16, 3], [3e-9, 10], [0.0999, 17], [0.1, 18], [0.5, 18], [1, 19], [7, 19],
    ]
    for (const [error, bin] of cases) expect(binOfError(error), `error ${error}`).toBe(bin)
    expect(AUDIT_HISTOGRAM_BINS).toBe(20)
    expect([AUDIT_HISTOGRAM_LABELS[0], AUDIT_HISTOGRAM_LABELS[1], AUDIT_HISTOGRAM_LABELS[2], AUDIT_HISTOGRAM_LABELS[18], AUDIT_HISTOGRAM_LABELS[19]])
      .toEqual(['0', '<1e-17', '>=1e-17', '>=1e-1', '>=1'])
  })
})

describe('worst cases', () => {
  const probe = { type: 'line', origin: [0, 0], direction: [1, 0] } as const
  const entry = (kind: AuditWorstCase['kind'], error: number, pathId: number, probeIndex = 0): AuditWorstCase => ({
    pathId, pathName: `path ${pathId}`, probeIndex, probe, category: 'sweep', segment: 0,
    tReference: kind === 'spurious' ? null : 0.5, tEngine: kind === 'missed' ? null : 0.5, error, kind,
  })
  const withWorst = (worst: AuditWorstCase[]) => {
    const aggregate = emptyAggregate(['newton'])
    aggregate.byEngine[0].worst = worst
    return aggregate
  }

  it('merge worst first: missed, then spurious, then errors; larger error first; then path id and probe', () => {
    const a = withWorst([entry('error', 1e-3, 5), entry('spurious', 1e-9, 2)])
    const b = withWorst([entry('missed', 0, 9), entry('error', 1e-3, 4), entry('error', 1e-3, 4, 1), entry('error', 1e-2, 8)])
    const merged = mergeAggregates(a, b).byEngine[0].worst
    expect(merged.map((c) => [c.kind, c.error, c.pathId, c.probeIndex])).toEqual([
      ['missed', 0, 9, 0], ['spurious', 1e-9, 2, 0], ['error', 1e-2, 8, 0], ['error', 1e-3, 4, 0], ['error', 1e-3, 4, 1], ['error', 1e-3, 5, 0],
    ])
    expect(mergeAggregates(b, a).byEngine[0].worst).toEqual(merged)
  })

  it(`keep the ${AUDIT_WORST_SIZE} worst`, () => {
    const many = (from: number) => withWorst(Array.from({ length: AUDIT_WORST_SIZE }, (_, i) => entry('error', 1 / (from + i + 1), from + i)))
    const merged = mergeAggregates(many(0), many(AUDIT_WORST_SIZE)).byEngine[0].worst
    expect(merged).toHaveLength(AUDIT_WORST_SIZE)
    expect(merged.map((c) => c.pathId)).toEqual(Array.from({ length: AUDIT_WORST_SIZE }, (_, i) => i))
  })
})
