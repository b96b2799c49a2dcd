/**
 * The public entry of Rootcast's audit core: closed-form hits compared with the numeric
 * engines across the paths of a library. Pure TypeScript on plain data (no DOM, Node or
 * database); the same inputs and seed give byte-identical JSON, and aggregates of chunks
 * merge exactly, so workers can audit chunks anywhere and merge them in any order.
 */

/**
 * The option, input and result types: engines, probe categories, generators, options, a
 * path to audit, a generated probe, the counts, worst cases and the aggregate (plain JSON).
 */
export type {
  AuditEngine, ProbeCategory, AuditGenerators, AuditOptions, AuditPathInput, GeneratedProbe,
  AuditCounts, AuditWorstCase, AuditEngineAggregate, AuditAggregate,
} from './types'

/** Observer of every missed and spurious case that auditPath and auditPaths take (tests, drill-down). */
export type { AuditCaseObserver } from './audit-path'

/** One report row: engine, category, probes, then the counts in AUDIT_COUNT_FIELDS order. */
export type { AuditReportRow } from './report'

/** The engines and probe categories in canonical order; the count fields in report order. */
export { AUDIT_ENGINES, PROBE_CATEGORIES, AUDIT_COUNT_FIELDS } from './types'

/**
 * Histogram bins (20): exactly 0; below 1e-17; the decades [1e-17, 1e-16) … [1e-1, 1); ≥ 1.
 * AUDIT_HISTOGRAM_EDGES are their lower edges, AUDIT_HISTOGRAM_LABELS their labels.
 */
export { AUDIT_HISTOGRAM_BINS, AUDIT_HISTOGRAM_EDGES, AUDIT_HISTOGRAM_LABELS } from './types'

/** Bounds of an aggregate: ≤ 1500 scatter points and 25 worst cases per engine; scatter's log10 for an exact match (−20) and its rounding (4 decimals). */
export { AUDIT_SCATTER_SIZE, AUDIT_WORST_SIZE, SCATTER_ZERO_LOG10, SCATTER_DECIMALS } from './types'

/**
 * Tolerances of the comparison: the matching window (2^-10 of the path size), the tangency
 * test (sin of the angle ≤ 2^-20) and the pair prefilter (2^-40·|d|·L); derivations beside them.
 */
export { MATCH_WINDOW_REL, TANGENT_SIN, PREFILTER_REL } from './audit-path'

/** Largest maxProbesPerPath (10000). */
export { MAX_PROBES_PER_PATH } from './generate-probes'

/**
 * The probes of one path: random rays in the bounding box grown by 10% of the path size,
 * scanlines y = (k + ½)·spacing, a line through every on-curve vertex at a seeded angle, and
 * a horizontal (vertical) line through every point where the tangent is horizontal (vertical),
 * in that order; then a seeded uniform sample of maxProbesPerPath of them, order kept. Each
 * probe comes from its own derived stream: changing the cap never changes a kept probe.
 * A path without segments gives []. RangeError for malformed generators or a seed that is
 * not a safe integer.
 * @example generateProbes(unitSquare, { randomRays: 0, sweepSpacing: null, vertexProbes: true, extremumProbes: false, maxProbesPerPath: 10 }, 7).length // 4: one line per corner
 */
export { generateProbes } from './generate-probes'

/**
 * The audit of one path: every probe against every segment as a cubic (lines and quadratics
 * by exact degree elevation, arcs counted in skippedSegments), the closed form's roots as the
 * reference, each engine's roots paired one to one (nearest in t first) when their points
 * are within MATCH_WINDOW_REL of the path size. Counts per engine and category (reference hits, matched, missed, spurious, wrong
 * winding, wrong kind), error histograms, a seeded scatter sample and the worst cases.
 * Probes depend on the seed and the path id. Unparsable data gives an aggregate with
 * invalidPaths 1; a path without segments, one with no probes. RangeError for malformed
 * options. `onCase`, when given, sees every missed and spurious case.
 * @example auditPath({ pathId: 1, name: 'Stair', data: 'M3 20V16H8V12H13V8H18V4H21V20Z' }, options).byEngine[0].categories.vertex.missed
 */
export { auditPath } from './audit-path'

/**
 * The aggregate of several paths in one pass, equal to the merge of their auditPath
 * aggregates in any grouping and order (byte for byte as JSON).
 * @example auditPaths(chunk, options) // one aggregate for the chunk
 */
export { auditPaths } from './audit-path'

/**
 * An aggregate of no paths for these engines (deduplicated, in AUDIT_ENGINES order): the
 * identity of mergeAggregates. RangeError for an empty list or an unknown engine.
 * @example mergeAggregates(emptyAggregate(['newton']), a) // equal to a
 */
export { emptyAggregate } from './aggregate'

/**
 * The aggregate of two disjoint sets of paths: associative and commutative, exactly (counts
 * and histograms add; scatter samples keep the smallest seeded keys; worst cases one total
 * order, worst first). Inputs are not changed. RangeError for different engine lists.
 * @example chunks.reduce(mergeAggregates, emptyAggregate(options.engines))
 */
export { mergeAggregates } from './aggregate'

/**
 * The report rows: per engine, a row per probe category and one for all categories, with the
 * probes and the counts (AUDIT_REPORT_COLUMNS); formatAuditReportCsv writes them as CSV.
 * @example auditReportRows(stairSweptAtUnitRows)[6] // ['newton', 'sweep', 16, 32, 32, 0, 0, 0, 0] (tested)
 */
export { auditReportRows, formatAuditReportCsv, AUDIT_REPORT_COLUMNS } from './report'

/**
 * A segment as the engines take it: a line or quadratic raised to the cubic with the same
 * parameter t, a cubic as it is, null for an arc.
 * @example elevateToCubic([0, 0, 3, 0]) // [0, 0, 1, 0, 2, 0, 3, 0]
 */
export { elevateToCubic } from './elevate-to-cubic'
