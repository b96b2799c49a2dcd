/**
 * Types and constants of an audit: closed-form hits compared with the numeric engines over
 * the paths of a library. Everything here is plain JSON data (no functions, no typed
 * arrays, no Infinity or NaN), so an aggregate can be stored, sent and merged anywhere.
 */
import type { Probe } from '../geometry/intersect-probe'

/** The numeric engines an audit compares with the closed form (the reference). */
export type AuditEngine = 'subdivision' | 'newton' | 'bezier-js' | 'mathjs'

/** The engines in their canonical order: aggregates list them in this order. */
export const AUDIT_ENGINES: readonly AuditEngine[] = ['subdivision', 'newton', 'bezier-js', 'mathjs']

/** How a probe was made. */
export type ProbeCategory = 'random-ray' | 'sweep' | 'vertex' | 'extremum'

/** The categories in their canonical order (the order of generation and of the report). */
export const PROBE_CATEGORIES: readonly ProbeCategory[] = ['random-ray', 'sweep', 'vertex', 'extremum']

/** Probe generators of an audit, applied to each path. */
export interface AuditGenerators {
  /** Rays with origin uniform in the bounding box (grown by 10% of the path size) and direction uniform. */
  readonly randomRays: number
  /** Horizontal scanlines at the pixel-centre rows y = (k + ½)·spacing across the bounding box; null: none. */
  readonly sweepSpacing: number | null
  /** A line through every on-curve vertex, at a seeded angle. */
  readonly vertexProbes: boolean
  /** A horizontal line through every point where the path's tangent is horizontal, a vertical one where it is vertical. */
  readonly extremumProbes: boolean
  /** Cap on the probes of one path (1..10000), applied after generation by seeded sampling. */
  readonly maxProbesPerPath: number
}

/** What an audit runs: the engines compared with the closed form, the generators and the seed. */
export interface AuditOptions {
  readonly engines: readonly AuditEngine[]
  readonly generators: AuditGenerators
  /** Any safe integer; the same seed gives byte-identical aggregates. */
  readonly seed: number
  /** Flatness of the subdivision engine relative to the curve size, in (0, 1); default 2^-24. */
  readonly subdivisionTolerance?: number
}

/** One path to audit: its id and name (for the worst cases) and its SVG path data. */
export interface AuditPathInput {
  readonly pathId: number
  readonly name: string
  readonly data: string
}

/** One generated probe and how it was made. */
export interface GeneratedProbe {
  readonly probe: Probe
  readonly category: ProbeCategory
}

/** Counts of one engine in one probe category. */
export interface AuditCounts {
  /** Closed-form hits on the pairs of this category (the engine's roots completed as intersectProbe completes them). */
  referenceHits: number
  /** Reference roots paired with an engine root within the matching window. */
  matched: number
  /** Reference roots with no engine root within the window. */
  missed: number
  /** Engine roots left over after the pairing. */
  spurious: number
  /** Matched crossings whose winding sign differs (sign of direction × P′(t) at each t). */
  wrongWinding: number
  /** Matched roots that the tangency test calls tangent at one t and crossing at the other. */
  wrongKind: number
}

/** The count fields in their canonical order (the report's columns). */
export const AUDIT_COUNT_FIELDS: readonly (keyof AuditCounts)[] = ['referenceHits', 'matched', 'missed', 'spurious', 'wrongWinding', 'wrongKind']

/** One of the worst cases of an engine, enough to reopen it on the canvas. */
export interface AuditWorstCase {
  pathId: number
  pathName: string
  /** Index of the probe in generateProbes' list for this path. */
  probeIndex: number
  probe: Probe
  category: ProbeCategory
  /** Index of the segment in the normalised path. */
  segment: number
  tReference: number | null
  tEngine: number | null
  /**
   * 'error': the distance between the matched points, relative to the path size;
   * 'missed' / 'spurious': the distance of the unpaired point from the probe line, relative
   * to the path size (tiny for a missed reference root; large for a spurious root far off).
   */
  error: number
  kind: 'missed' | 'spurious' | 'error'
}

/** Everything an audit found for one engine. */
export interface AuditEngineAggregate {
  engine: AuditEngine
  /** Counts per probe category, in PROBE_CATEGORIES order. */
  categories: Record<ProbeCategory, AuditCounts>
  /** Matched roots by |P(t_engine) − P(t_reference)| / path size, in AUDIT_HISTOGRAM_BINS bins. */
  pointErrorHistogram: number[]
  /** Matched roots by |t_engine − t_reference|, in AUDIT_HISTOGRAM_BINS bins. */
  tErrorHistogram: number[]
  /**
   * A seeded sample (≤ AUDIT_SCATTER_SIZE) of matched roots: [tangency angle in degrees between
   * probe and curve at the reference t, log10 of the relative point error (SCATTER_ZERO_LOG10 for 0)].
   */
  scatter: [number, number][]
  /** The sample keys of scatter (same order), kept so that samples merge exactly. */
  scatterKeys: number[]
  /** The AUDIT_WORST_SIZE worst cases, worst first (see compareWorstCases). */
  worst: AuditWorstCase[]
}

/** The result of an audit over some paths; merged chunk by chunk, bounded in size. */
export interface AuditAggregate {
  version: 1
  /** The engines compared, in AUDIT_ENGINES order. */
  engines: AuditEngine[]
  /** Paths audited (their data parsed). */
  paths: number
  /** Paths whose data did not parse (nothing else counted for them). */
  invalidPaths: number
  probes: number
  probesByCategory: Record<ProbeCategory, number>
  /** Probe × segment pairs given to the engines (the reference and every engine). */
  pairs: number
  /** Pairs left out because the cubic lies along the probe (an overlap is not a set of roots). */
  overlapPairs: number
  /** Arc segments, which the engines do not take, counted once per path. */
  skippedSegments: number
  /** Per engine, in `engines` order. */
  byEngine: AuditEngineAggregate[]
}

/** Lower edges of the histogram bins: an exact-zero bin, the decades 1e-18 … 1e-1, then ≥ 1. */
export const AUDIT_HISTOGRAM_EDGES: readonly number[] = [0, ...Array.from({ length: 18 }, (_, i) => Number(`1e${i - 18}`)), 1]

/**
 * Number of histogram bins: [0] exactly 0; [1] (0, 1e-17) (the 1e-18 decade and below);
 * [k] [1e(k−19), 1e(k−18)) for k = 2 … 18; [19] ≥ 1.
 */
export const AUDIT_HISTOGRAM_BINS = AUDIT_HISTOGRAM_EDGES.length

/** Labels of the histogram bins, for charts and CSV. */
export const AUDIT_HISTOGRAM_LABELS: readonly string[] = AUDIT_HISTOGRAM_EDGES.map((edge, k) =>
  k === 0 ? '0' : k === 1 ? '<1e-17' : k === AUDIT_HISTOGRAM_BINS - 1 ? '>=1' : `>=1e${k - 19}`)

/** At most this many scatter points per engine. */
export const AUDIT_SCATTER_SIZE = 1500

/** At most this many worst cases per engine. */
export const AUDIT_WORST_SIZE = 25

/** The scatter's log10 error for an exact match (below the histogram's lowest decade). */
export const SCATTER_ZERO_LOG10 = -20

/** Scatter coordinates are rounded to this many decimals (angle in degrees, log10 error): ample for a plot, and compact JSON. */
export const SCATTER_DECIMALS = 4
