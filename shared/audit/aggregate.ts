/**
 * Audit aggregates: the empty one, the exact merge, and the orders that make merging
 * associative and commutative. Counts and histograms add. The scatter sample is a bottom-k
 * sample: every matched root carries a seeded 53-bit key (a hash of where it was found), and
 * a sample keeps the AUDIT_SCATTER_SIZE smallest (key, angle, error) triples, so the sample
 * of a union is the bottom-k of the two samples, whatever the chunking. The worst cases are
 * kept under one total order and truncated the same way.
 */
import type {
  AuditAggregate, AuditCounts, AuditEngine, AuditEngineAggregate, AuditWorstCase, ProbeCategory,
} from './types'
import {
  AUDIT_COUNT_FIELDS, AUDIT_ENGINES, AUDIT_HISTOGRAM_BINS, AUDIT_HISTOGRAM_EDGES, AUDIT_SCATTER_SIZE, AUDIT_WORST_SIZE,
  PROBE_CATEGORIES,
} from './types'

/** The engines deduplicated in AUDIT_ENGINES order; RangeError for an empty list or an unknown name. */
export function normaliseEngines(engines: readonly AuditEngine[]): AuditEngine[] {
  if (!Array.isArray(engines) || engines.length === 0) throw new RangeError('engines must be a non-empty list')
  for (const engine of engines) {
    if (!AUDIT_ENGINES.includes(engine)) throw new RangeError(`engine must be one of ${AUDIT_ENGINES.join(', ')}, got ${String(engine)}`)
  }
  return AUDIT_ENGINES.filter((engine) => engines.includes(engine))
}

function zeroCounts(): AuditCounts {
  return { referenceHits: 0, matched: 0, missed: 0, spurious: 0, wrongWinding: 0, wrongKind: 0 }
}

function byCategory<T>(make: (category: ProbeCategory) => T): Record<ProbeCategory, T> {
  return Object.fromEntries(PROBE_CATEGORIES.map((category) => [category, make(category)])) as Record<ProbeCategory, T>
}

/** An aggregate of nothing for these engines (deduplicated, in canonical order). */
export function emptyAggregate(engines: readonly AuditEngine[]): AuditAggregate {
  return {
    version: 1,
    engines: normaliseEngines(engines),
    paths: 0,
    invalidPaths: 0,
    probes: 0,
    probesByCategory: byCategory(() => 0),
    pairs: 0,
    overlapPairs: 0,
    skippedSegments: 0,
    byEngine: normaliseEngines(engines).map((engine) => ({
      engine,
      categories: byCategory(zeroCounts),
      pointErrorHistogram: new Array<number>(AUDIT_HISTOGRAM_BINS).fill(0),
      tErrorHistogram: new Array<number>(AUDIT_HISTOGRAM_BINS).fill(0),
      scatter: [],
      scatterKeys: [],
      worst: [],
    })),
  }
}

/** The bin edges as a local array (an imported binding costs a getter call per use under a CommonJS transform). */
const EDGES = Float64Array.from(AUDIT_HISTOGRAM_EDGES)

/** Histogram bin of a non-negative error (see AUDIT_HISTOGRAM_BINS). */
export function binOfError(error: number): number {
  const last = EDGES.length - 1
  if (error === 0) return 0
  if (error >= 1) return last
  if (error < EDGES[2]) return 1
  // the decade from log10, then corrected against the exact edges (log10 may round at a power of ten)
  let bin = Math.min(last - 1, Math.max(2, Math.floor(Math.log10(error)) + 19))
  while (bin < last - 1 && error >= EDGES[bin + 1]) bin++
  while (bin > 2 && error < EDGES[bin]) bin--
  return bin
}

const KIND_RANK: Readonly<Record<AuditWorstCase['kind'], number>> = { missed: 0, spurious: 1, error: 2 }

/** Rank of a worst-case kind: missed hits first, then spurious ones, then matched ones with an error. */
export function rankOfKind(kind: AuditWorstCase['kind']): number {
  return KIND_RANK[kind]
}

/** null (no root) orders before every t. */
function compareT(a: number | null, b: number | null): number {
  return (a ?? -1) - (b ?? -1)
}

/**
 * The order of worst cases on the scalar fields: kind rank, then larger error first, then
 * path id, probe index, segment, t of the reference and of the engine, ascending.
 */
export function compareWorstFields(
  rank: number, error: number, pathId: number, probeIndex: number, segment: number,
  tReference: number | null, tEngine: number | null, other: AuditWorstCase,
): number {
  return rank - KIND_RANK[other.kind] || other.error - error || pathId - other.pathId || probeIndex - other.probeIndex
    || segment - other.segment || compareT(tReference, other.tReference) || compareT(tEngine, other.tEngine)
}

/** The total order of worst cases, worst first (compareWorstFields, then the path name). */
export function compareWorstCases(a: AuditWorstCase, b: AuditWorstCase): number {
  const order = compareWorstFields(KIND_RANK[a.kind], a.error, a.pathId, a.probeIndex, a.segment, a.tReference, a.tEngine, b)
  return order !== 0 ? order : a.pathName < b.pathName ? -1 : a.pathName > b.pathName ? 1 : 0
}

/** Order of scatter samples: key, then angle, then error, ascending. */
export function compareSamples(keyA: number, xA: number, yA: number, keyB: number, xB: number, yB: number): number {
  return keyA - keyB || xA - xB || yA - yB
}

function mergeScatter(a: AuditEngineAggregate, b: AuditEngineAggregate): Pick<AuditEngineAggregate, 'scatter' | 'scatterKeys'> {
  const scatter: [number, number][] = []
  const scatterKeys: number[] = []
  let i = 0, j = 0
  while (scatter.length < AUDIT_SCATTER_SIZE && (i < a.scatter.length || j < b.scatter.length)) {
    const takeA = j >= b.scatter.length || (i < a.scatter.length
      && compareSamples(a.scatterKeys[i], a.scatter[i][0], a.scatter[i][1], b.scatterKeys[j], b.scatter[j][0], b.scatter[j][1]) <= 0)
    const [keys, points, k] = takeA ? [a.scatterKeys, a.scatter, i++] : [b.scatterKeys, b.scatter, j++]
    scatterKeys.push(keys[k])
    scatter.push([points[k][0], points[k][1]])
  }
  return { scatter, scatterKeys }
}

function mergeEngine(a: AuditEngineAggregate, b: AuditEngineAggregate): AuditEngineAggregate {
  const categories = byCategory((category) => {
    const counts = zeroCounts()
    for (const field of AUDIT_COUNT_FIELDS) counts[field] = a.categories[category][field] + b.categories[category][field]
    return counts
  })
  return {
    engine: a.engine,
    categories,
    pointErrorHistogram: a.pointErrorHistogram.map((count, k) => count + b.pointErrorHistogram[k]),
    tErrorHistogram: a.tErrorHistogram.map((count, k) => count + b.tErrorHistogram[k]),
    ...mergeScatter(a, b),
    worst: [...a.worst, ...b.worst].sort(compareWorstCases).slice(0, AUDIT_WORST_SIZE).map((c) => ({ ...c })),
  }
}

/**
 * The aggregate of two disjoint sets of paths (inputs unchanged). Associative and commutative:
 * counts and histograms add, samples and worst cases merge under their total orders and are
 * truncated. RangeError when the two were made for different engines or are not aggregates.
 */
export function mergeAggregates(a: AuditAggregate, b: AuditAggregate): AuditAggregate {
  if (a?.version !== 1 || b?.version !== 1) throw new RangeError('mergeAggregates takes two audit aggregates of version 1')
  if (a.engines.join() !== b.engines.join()) {
    throw new RangeError(`aggregates of different engines cannot merge: ${a.engines.join(', ')} and ${b.engines.join(', ')}`)
  }
  return {
    version: 1,
    engines: [...a.engines],
    paths: a.paths + b.paths,
    invalidPaths: a.invalidPaths + b.invalidPaths,
    probes: a.probes + b.probes,
    probesByCategory: byCategory((category) => a.probesByCategory[category] + b.probesByCategory[category]),
    pairs: a.pairs + b.pairs,
    overlapPairs: a.overlapPairs + b.overlapPairs,
    skippedSegments: a.skippedSegments + b.skippedSegments,
    byEngine: a.byEngine.map((engine, e) => mergeEngine(engine, b.byEngine[e])),
  }
}
