/**
 * The audit of paths: every probe against every cubic of the path (lines and quadratics
 * elevated, arcs skipped), the closed form as the reference, each engine's roots paired with
 * the reference roots, and the findings accumulated into bounded aggregates.
 *
 * Per pair (probe × cubic) the reference hits are the closed-form hits of the core on that
 * segment: the closed-form engine's roots, completed as intersectProbe completes them (see
 * completeReferenceRoots), so that a touch is not lost where rounding turns a double root
 * complex, nor a probe through a segment's end where its double root lies. Engine roots and
 * reference roots are paired one to one, nearest in t first, when within MATCH_WINDOW_REL of the
 * path size; an unpaired reference root is missed, an unpaired engine root spurious. A root's
 * kind and winding come from the curve's direction at its t (see TANGENT_SIN): a join met by
 * the probe is a root of both segments and is counted on each.
 *
 * The hot loop works on the packed cubics with module-level scratch (the audit is
 * single-threaded and not re-entrant); it allocates only for the worst cases that make the
 * list and for what the adapters of bezier-js and mathjs allocate inside themselves.
 */
import { parsePathData } from '../geometry/path-data'
import { resolveProbe } from '../geometry/intersect-probe'
import { CUBIC_CODE, evaluateDerivativePackedInto, evaluatePackedInto } from '../geometry/segments'
import { ON_PROBE_REL } from '../geometry/internal/probe-tolerances'
import { findBernsteinCubicCriticalInto } from '../geometry/internal/bernstein-roots'
import { closedFormEngine } from '../geometry/engines/closed-form'
import { DEFAULT_FLATNESS_REL, createSubdivisionEngine } from '../geometry/engines/subdivision'
import { newtonEngine } from '../geometry/engines/newton'
import { bezierJsEngine } from '../geometry/engines/bezier-js'
import { mathjsEngine } from '../geometry/engines/mathjs'
import type { IntersectionEngine } from '../geometry/engines/types'
import {
  binOfError, compareSamples, compareWorstCases, compareWorstFields, emptyAggregate, normaliseEngines, rankOfKind,
} from './aggregate'
import { packPathCubics } from './elevate-to-cubic'
import { generateProbes, measurePath, validateGenerators, validateSeed } from './generate-probes'
import { foldSeed, mixWord, spreadKey } from './random'
import type { AuditAggregate, AuditEngine, AuditOptions, AuditPathInput, AuditWorstCase, GeneratedProbe } from './types'
import {
  AUDIT_COUNT_FIELDS, AUDIT_ENGINES, AUDIT_HISTOGRAM_BINS, AUDIT_SCATTER_SIZE, AUDIT_WORST_SIZE, PROBE_CATEGORIES,
  SCATTER_DECIMALS, SCATTER_ZERO_LOG10,
} from './types'

// Imported bindings used in the hot loop, read once: under a CommonJS transform (tsx, the
// piscina workers) every use of an imported name is a getter call.
const evaluatePoint = evaluatePackedInto
const evaluateDerivative = evaluateDerivativePackedInto
const closedForm = closedFormEngine
const findCritical = findBernsteinCubicCriticalInto
const newton = newtonEngine
const bezierJs = bezierJsEngine
const mathjs = mathjsEngine
const CUBIC = CUBIC_CODE
const SCATTER_SIZE = AUDIT_SCATTER_SIZE
const WORST_SIZE = AUDIT_WORST_SIZE
const errorBin = binOfError
const compareSample = compareSamples
const compareWorst = compareWorstCases
const compareWorstScalars = compareWorstFields
const rankKind = rankOfKind
const mix = mixWord
const keyOf = spreadKey

/**
 * An engine root pairs with a reference root when their points are within MATCH_WINDOW_REL of
 * the path size. Derivation: 2^-10 ≈ 0.001 is one pixel of a 1024-pixel rendering, so a root
 * farther off was not found at any practical resolution; nearer ones are paired and their
 * error goes to the histograms (the subdivision engine's default chord error, ~2^-24, sits far
 * inside), so a coarse engine shows as large errors rather than as misses.
 */
export const MATCH_WINDOW_REL = 2 ** -10

/**
 * A root is tangent when sin(angle between probe and curve direction) ≤ TANGENT_SIN, or the
 * curve has no direction there (P′(t) = 0); else a crossing with winding sign(d × P′(t)).
 * Derivation: a double root computed in doubles is off by about √ε ≈ 2^-26 in t, which turns
 * the curve's direction by about 2^-26·|P″|/|P′|; 2^-20 leaves a factor of 64 for curvature,
 * and a crossing at under 2^-20 rad (6e-5°) is a graze at any drawing precision.
 * (The core's hit classification looks at the sides of the path around a meeting point; a
 * single cubic root has no such neighbourhood, hence this simpler rule, used for both t.)
 */
export const TANGENT_SIN = 2 ** -20

/**
 * A pair is given to the engines unless the cubic's control points all lie beyond
 * PREFILTER_REL·|d|·L on one side of the probe line, or project beyond its s-range by as much
 * (L: the largest |coordinate| of path and probe). Derivation: the curve then cannot meet the
 * probe (convex hull), and an engine's rounding in forming g is ~16ε·|d|·L ≈ 2^-48·|d|·L, far
 * below 2^-40, so no engine can report a root there either.
 */
export const PREFILTER_REL = 2 ** -40

const RADIANS_TO_DEGREES = 180 / Math.PI
const SCATTER_SCALE = 10 ** SCATTER_DECIMALS
const COUNT_FIELDS = AUDIT_COUNT_FIELDS.length
const REFERENCE_HITS = 0, MATCHED = 1, MISSED = 2, SPURIOUS = 3, WRONG_WINDING = 4, WRONG_KIND = 5
const KIND_CROSSING = 0, KIND_TANGENT = 1
/** Root slots per pair: the closed form gives ≤ 3, the numeric engines a few more at most. */
const ROOT_SLOTS = 8

/** Observer of every missed and spurious case (for tests and drill-down); not part of the options' JSON. */
export type AuditCaseObserver = (found: AuditWorstCase) => void

/** Running state of one engine while paths are audited. */
interface EngineAccumulator {
  readonly engine: AuditEngine
  readonly code: number
  /** Counts per category: COUNT_FIELDS values each, in PROBE_CATEGORIES order. */
  readonly counts: Float64Array
  readonly pointHistogram: Float64Array
  readonly tHistogram: Float64Array
  sampleKeys: number[]
  sampleX: number[]
  sampleY: number[]
  /** Samples with a key above this can no longer be among the smallest SCATTER_SIZE. */
  sampleThreshold: number
  /** Sorted worst first, at most WORST_SIZE. */
  readonly worst: AuditWorstCase[]
}

/** Running state of an audit over any number of paths. */
interface AuditAccumulator {
  readonly engines: AuditEngine[]
  paths: number
  invalidPaths: number
  probes: number
  readonly probesByCategory: Float64Array
  pairs: number
  overlapPairs: number
  skippedSegments: number
  readonly byEngine: EngineAccumulator[]
}

function createAccumulator(engines: AuditEngine[]): AuditAccumulator {
  return {
    engines,
    paths: 0, invalidPaths: 0, probes: 0, probesByCategory: new Float64Array(PROBE_CATEGORIES.length),
    pairs: 0, overlapPairs: 0, skippedSegments: 0,
    byEngine: engines.map((engine) => ({
      engine,
      code: AUDIT_ENGINES.indexOf(engine),
      counts: new Float64Array(PROBE_CATEGORIES.length * COUNT_FIELDS),
      pointHistogram: new Float64Array(AUDIT_HISTOGRAM_BINS),
      tHistogram: new Float64Array(AUDIT_HISTOGRAM_BINS),
      sampleKeys: [], sampleX: [], sampleY: [], sampleThreshold: Infinity,
      worst: [],
    })),
  }
}

/** Keeps the SCATTER_SIZE smallest samples (in compareSamples order), in place. */
function compactSamples(engine: EngineAccumulator): void {
  const order = engine.sampleKeys.map((_, i) => i)
  order.sort((a, b) => compareSample(engine.sampleKeys[a], engine.sampleX[a], engine.sampleY[a], engine.sampleKeys[b], engine.sampleX[b], engine.sampleY[b]))
  const kept = order.slice(0, SCATTER_SIZE)
  engine.sampleKeys = kept.map((i) => engine.sampleKeys[i])
  engine.sampleX = kept.map((i) => engine.sampleX[i])
  engine.sampleY = kept.map((i) => engine.sampleY[i])
  if (kept.length === SCATTER_SIZE) engine.sampleThreshold = engine.sampleKeys[SCATTER_SIZE - 1]
}

function offerSample(engine: EngineAccumulator, key: number, x: number, y: number): void {
  if (key > engine.sampleThreshold) return
  engine.sampleKeys.push(key)
  engine.sampleX.push(x)
  engine.sampleY.push(y)
  if (engine.sampleKeys.length >= 2 * SCATTER_SIZE) compactSamples(engine)
}

/** Rounds to SCATTER_DECIMALS decimals; + 0 turns −0 into 0 (JSON has no −0). */
function roundForScatter(value: number): number {
  return Math.round(value * SCATTER_SCALE) / SCATTER_SCALE + 0
}

// The path and probe being audited, for the worst cases (module-level: the loop passes scalars).
let currentInput: AuditPathInput = { pathId: 0, name: '', data: '' }
let currentProbe: GeneratedProbe | null = null
let currentProbeIndex = 0
let currentObserver: AuditCaseObserver | undefined

function makeCase(kind: AuditWorstCase['kind'], error: number, segment: number, tReference: number | null, tEngine: number | null): AuditWorstCase {
  const generated = currentProbe!
  return {
    pathId: currentInput.pathId, pathName: currentInput.name, probeIndex: currentProbeIndex,
    probe: generated.probe, category: generated.category, segment, tReference, tEngine, error, kind,
  }
}

function offerWorst(
  engine: EngineAccumulator, kind: AuditWorstCase['kind'], error: number, segment: number,
  tReference: number | null, tEngine: number | null,
): void {
  const worst = engine.worst
  const rank = rankKind(kind)
  if (worst.length === WORST_SIZE
    && compareWorstScalars(rank, error, currentInput.pathId, currentProbeIndex, segment, tReference, tEngine, worst[worst.length - 1]) >= 0) return
  const entry = makeCase(kind, error, segment, tReference, tEngine)
  let at = worst.length
  while (at > 0 && compareWorst(entry, worst[at - 1]) < 0) at--
  worst.splice(at, 0, entry)
  if (worst.length > WORST_SIZE) worst.pop()
}

// Scratch of the pair being compared: reference and engine roots with their points and kinds.
const referenceT = new Float64Array(ROOT_SLOTS)
const referenceX = new Float64Array(ROOT_SLOTS)
const referenceY = new Float64Array(ROOT_SLOTS)
const referenceKind = new Uint8Array(ROOT_SLOTS)
const referenceWinding = new Int8Array(ROOT_SLOTS)
const referenceAngle = new Float64Array(ROOT_SLOTS)
const referencePriority = new Uint8Array(ROOT_SLOTS)
const critical = new Float64Array(2)
const engineT = new Float64Array(ROOT_SLOTS)
const engineX = new Float64Array(ROOT_SLOTS)
const engineY = new Float64Array(ROOT_SLOTS)
const pairedEngine = new Int32Array(ROOT_SLOTS)
const engineUsed = new Uint8Array(ROOT_SLOTS)
const vector = new Float64Array(2)

// The probe of the pair (module-level so that the helpers take scalars only).
let ox = 0, oy = 0, dx = 0, dy = 0, directionLength = 1
/** Kind and winding of the root last classified by classifyRoot. */
let rootKind = KIND_CROSSING, rootWinding = 0, rootAngle = 0

/**
 * Where |P′(t)| is at most DEGENERATE_SPEED_REL of the cubic's extent (a control point on an
 * end point, a cusp) the derivative gives no direction, and the chord P(t + CHORD_T) − P(t − CHORD_T)
 * (clamped to [0, 1]) stands in for it: the curve's direction of travel there. Derivation: at a
 * regular point |P′| is of the order of the extent, so 2^-20 of it means the derivative has
 * vanished up to rounding of t; the chord over 2^-16 is long enough (its length ~2^-32 of the
 * extent even at a double zero of P′) for rounding (~2^-52) to leave its angle within 2^-18,
 * and short enough for the curve to turn by only ~2^-16 along it.
 */
const DEGENERATE_SPEED_REL = 2 ** -20
const CHORD_T = 2 ** -16

/** Kind, winding and tangency angle (degrees, 0..90) at t of the cubic at `offset`, into rootKind/rootWinding/rootAngle. */
function classifyRoot(data: Float64Array, offset: number, t: number): void {
  evaluateDerivative(data, offset, CUBIC, t, vector)
  let tx = vector[0], ty = vector[1]
  let speed = Math.hypot(tx, ty)
  if (speed <= DEGENERATE_SPEED_REL * cubicExtent) {
    evaluatePoint(data, offset, CUBIC, Math.min(1, t + CHORD_T), vector)
    tx = vector[0]; ty = vector[1]
    evaluatePoint(data, offset, CUBIC, Math.max(0, t - CHORD_T), vector)
    tx -= vector[0]; ty -= vector[1]
    speed = Math.hypot(tx, ty)
  }
  const cross = dx * ty - dy * tx
  const tangent = speed === 0 || Math.abs(cross) <= TANGENT_SIN * directionLength * speed
  rootKind = tangent ? KIND_TANGENT : KIND_CROSSING
  rootWinding = tangent ? 0 : cross > 0 ? 1 : -1
  rootAngle = speed === 0 ? 0 : Math.atan2(Math.abs(cross), Math.abs(dx * tx + dy * ty)) * RADIANS_TO_DEGREES
}

/** Largest |coordinate difference| between the first control point and the others, of the cubic being compared. */
let cubicExtent = 0

/** Sets cubicExtent for the cubic at `offset`. */
function measureCubic(data: Float64Array, offset: number): void {
  let extent = 0
  for (let i = 2; i < 8; i++) extent = Math.max(extent, Math.abs(data[offset + i] - data[offset + (i & 1)]))
  cubicExtent = extent
}

/** Distance of (x, y) from the probe line. */
function distanceFromProbe(x: number, y: number): number {
  return Math.abs(dx * (y - oy) - dy * (x - ox)) / directionLength
}

let subdivision: IntersectionEngine = createSubdivisionEngine(DEFAULT_FLATNESS_REL)
let subdivisionFlatness = DEFAULT_FLATNESS_REL

/** One call site per engine, so that each stays monomorphic. */
function runEngine(
  code: number, data: Float64Array, offset: number, sMin: number, sMax: number, out: Float64Array,
): number {
  switch (code) {
    case 0: return subdivision.intersectCubic(data, offset, ox, oy, dx, dy, sMin, sMax, out)
    case 1: return newton.intersectCubic(data, offset, ox, oy, dx, dy, sMin, sMax, out)
    case 2: return bezierJs.intersectCubic(data, offset, ox, oy, dx, dy, sMin, sMax, out)
    default: return mathjs.intersectCubic(data, offset, ox, oy, dx, dy, sMin, sMax, out)
  }
}

const PRIORITY_ROOT = 0, PRIORITY_TOUCH = 1, PRIORITY_END = 2

/** g(t) = d × (P(t) − o) of the cubic at `offset`, from the evaluated point (as the core's sideAt). */
function sideAt(data: Float64Array, offset: number, t: number): number {
  evaluatePoint(data, offset, CUBIC, t, vector)
  return dx * (vector[1] - oy) - dy * (vector[0] - ox)
}

/** True when P(t) projects into [low, high] (the s-range times |d|²). */
function projectsInto(data: Float64Array, offset: number, t: number, low: number, high: number): boolean {
  evaluatePoint(data, offset, CUBIC, t, vector)
  const projection = dx * (vector[0] - ox) + dy * (vector[1] - oy)
  return projection >= low && projection <= high
}

let candidateCount = 0

/** Appends t to the reference candidates when P(t) projects into the s-range. */
function addCandidate(data: Float64Array, offset: number, t: number, priority: number, low: number, high: number): void {
  if (!projectsInto(data, offset, t, low, high)) return
  referenceT[candidateCount] = t
  referencePriority[candidateCount++] = priority
}

/**
 * Completes the closed-form engine's `count` roots in referenceT as intersectProbe completes
 * them (steps 1, 3 and 4 of its method): an end of the segment whose point is on the probe
 * (|g| ≤ `onProbe`, the core's ON_PROBE_REL band) and an interior critical point of g inside
 * the band are candidates too; then candidates between which the curve stays in the band
 * (tested at the midpoint) are one meeting, represented by its end, else its touch point,
 * else its middle root. Only candidates that project into the s-range [low, high]·|d|² count.
 * Returns the new count, ascending in referenceT.
 */
function completeReferenceRoots(
  data: Float64Array, offset: number, count: number, f0: number, f1: number, f2: number, f3: number,
  onProbe: number, low: number, high: number,
): number {
  candidateCount = count
  for (let i = 0; i < count; i++) referencePriority[i] = PRIORITY_ROOT
  if (Math.abs(f0) <= onProbe) addCandidate(data, offset, 0, PRIORITY_END, low, high)
  if (Math.abs(f3) <= onProbe) addCandidate(data, offset, 1, PRIORITY_END, low, high)
  const criticalCount = findCritical(f0, f1, f2, f3, critical)
  for (let i = 0; i < criticalCount; i++) {
    if (Math.abs(sideAt(data, offset, critical[i])) <= onProbe) addCandidate(data, offset, critical[i], PRIORITY_TOUCH, low, high)
  }
  const n = candidateCount
  if (n < 2) return n
  for (let i = 1; i < n; i++) {
    const t = referenceT[i], priority = referencePriority[i]
    let j = i - 1
    while (j >= 0 && referenceT[j] > t) { referenceT[j + 1] = referenceT[j]; referencePriority[j + 1] = referencePriority[j]; j-- }
    referenceT[j + 1] = t
    referencePriority[j + 1] = priority
  }
  let written = 0
  for (let first = 0; first < n;) {
    let last = first
    while (last + 1 < n && Math.abs(sideAt(data, offset, (referenceT[last] + referenceT[last + 1]) / 2)) <= onProbe) last++
    let chosen = first + ((last - first + 1) >> 1)
    for (let i = first; i <= last; i++) if (referencePriority[i] > referencePriority[chosen]) chosen = i
    referenceT[written++] = referenceT[chosen]
    first = last + 1
  }
  return written
}

/**
 * Pairs the engine's roots with the reference's one to one: among the pairs whose points are
 * within `window`, nearest in t first (then nearer in points, lower reference index, lower
 * engine index), so that a segment whose ends meet (a closed loop) pairs t = 0 with t = 0 and
 * t = 1 with t = 1; pairedEngine[i] = engine index or −1.
 */
function pairRoots(referenceCount: number, engineCount: number, window: number): void {
  for (let i = 0; i < referenceCount; i++) pairedEngine[i] = -1
  for (let j = 0; j < engineCount; j++) engineUsed[j] = 0
  for (;;) {
    let bestT = Infinity, bestDistance = Infinity, bestI = -1, bestJ = -1
    for (let i = 0; i < referenceCount; i++) {
      if (pairedEngine[i] >= 0) continue
      for (let j = 0; j < engineCount; j++) {
        if (engineUsed[j] === 1) continue
        const distance = Math.hypot(engineX[j] - referenceX[i], engineY[j] - referenceY[i])
        if (!(distance <= window)) continue
        const gap = Math.abs(engineT[j] - referenceT[i])
        if (gap < bestT || (gap === bestT && distance < bestDistance)) { bestT = gap; bestDistance = distance; bestI = i; bestJ = j }
      }
    }
    if (bestI < 0) return
    pairedEngine[bestI] = bestJ
    engineUsed[bestJ] = 1
  }
}

/** Compares one engine with the reference on one pair and accumulates what it found. */
function compareEngine(
  engine: EngineAccumulator, category: number, data: Float64Array, offset: number, segment: number,
  referenceCount: number, engineCount: number, size: number, keyState: number,
): void {
  const counts = engine.counts
  const base = category * COUNT_FIELDS
  for (let j = 0; j < engineCount; j++) {
    evaluatePoint(data, offset, CUBIC, engineT[j], vector)
    engineX[j] = vector[0]
    engineY[j] = vector[1]
  }
  pairRoots(referenceCount, engineCount, MATCH_WINDOW_REL * size)
  for (let i = 0; i < referenceCount; i++) {
    counts[base + REFERENCE_HITS]++
    const j = pairedEngine[i]
    if (j < 0) {
      counts[base + MISSED]++
      const error = distanceFromProbe(referenceX[i], referenceY[i]) / size
      offerWorst(engine, 'missed', error, segment, referenceT[i], null)
      if (currentObserver) currentObserver(makeCase('missed', error, segment, referenceT[i], null))
      continue
    }
    counts[base + MATCHED]++
    const pointError = Math.hypot(engineX[j] - referenceX[i], engineY[j] - referenceY[i]) / size
    engine.pointHistogram[errorBin(pointError)]++
    engine.tHistogram[errorBin(Math.abs(engineT[j] - referenceT[i]))]++
    classifyRoot(data, offset, engineT[j])
    if (rootKind !== referenceKind[i]) counts[base + WRONG_KIND]++
    else if (rootWinding !== referenceWinding[i]) counts[base + WRONG_WINDING]++
    const logError = pointError === 0 ? SCATTER_ZERO_LOG10 : Math.log10(pointError)
    offerSample(engine, keyOf(mix(mix(keyState, i), engine.code)), roundForScatter(referenceAngle[i]), roundForScatter(logError))
    if (pointError > 0) offerWorst(engine, 'error', pointError, segment, referenceT[i], engineT[j])
  }
  for (let j = 0; j < engineCount; j++) {
    if (engineUsed[j] === 1) continue
    counts[base + SPURIOUS]++
    const error = distanceFromProbe(engineX[j], engineY[j]) / size
    offerWorst(engine, 'spurious', error, segment, null, engineT[j])
    if (currentObserver) currentObserver(makeCase('spurious', error, segment, null, engineT[j]))
  }
}

/** Validates the options (RangeError) and returns the engines in canonical order. */
function prepareOptions(options: AuditOptions): AuditEngine[] {
  if (typeof options !== 'object' || options === null) throw new RangeError('options must be an object')
  const engines = normaliseEngines(options.engines)
  validateGenerators(options.generators)
  validateSeed(options.seed)
  const flatness = options.subdivisionTolerance ?? DEFAULT_FLATNESS_REL
  if (!(typeof flatness === 'number' && flatness > 0 && flatness < 1)) {
    throw new RangeError(`subdivisionTolerance must lie in (0, 1), got ${String(options.subdivisionTolerance)}`)
  }
  if (flatness !== subdivisionFlatness) {
    subdivision = createSubdivisionEngine(flatness)
    subdivisionFlatness = flatness
  }
  return engines
}

/** The seed of one path's probes: the audit seed mixed with the path id. */
export function derivePathSeed(seed: number, pathId: number): number {
  return mix(mix(foldSeed(seed), pathId >>> 0), Math.floor(pathId / 4294967296) >>> 0)
}

/** Audits one path into the accumulator. */
function auditInto(accumulator: AuditAccumulator, input: AuditPathInput, options: AuditOptions): void {
  const parsed = parsePathData(input.data)
  if (!parsed.ok) { accumulator.invalidPaths++; return }
  accumulator.paths++
  const path = parsed.path
  const cubics = packPathCubics(path)
  accumulator.skippedSegments += cubics.skipped
  const frame = measurePath(path)
  if (frame === null) return
  const pathSeed = derivePathSeed(options.seed, input.pathId)
  const probes = generateProbes(path, options.generators, pathSeed)
  accumulator.probes += probes.length
  currentInput = input
  const data = cubics.data
  const size = frame.size
  const magnitude = Math.max(cubics.magnitude, frame.magnitude)
  const engines = accumulator.byEngine
  for (let p = 0; p < probes.length; p++) {
    const generated = probes[p]
    const category = PROBE_CATEGORIES.indexOf(generated.category)
    accumulator.probesByCategory[category]++
    currentProbe = generated
    currentProbeIndex = p
    const line = resolveProbe(generated.probe)
    ox = line.ox; oy = line.oy; dx = line.dx; dy = line.dy
    const sMin = line.sMin, sMax = line.sMax
    directionLength = Math.hypot(dx, dy)
    const directionSquared = dx * dx + dy * dy
    const reach = directionLength * Math.max(magnitude, Math.abs(ox), Math.abs(oy))
    const onProbe = ON_PROBE_REL * reach
    const margin = PREFILTER_REL * reach
    const rangeLow = sMin * directionSquared, rangeHigh = sMax * directionSquared
    const low = rangeLow - margin, high = rangeHigh + margin
    const probeState = mix(pathSeed, p)
    for (let k = 0; k < cubics.count; k++) {
      const o = 8 * k
      const f0 = dx * (data[o + 1] - oy) - dy * (data[o] - ox)
      const f1 = dx * (data[o + 3] - oy) - dy * (data[o + 2] - ox)
      const f2 = dx * (data[o + 5] - oy) - dy * (data[o + 4] - ox)
      const f3 = dx * (data[o + 7] - oy) - dy * (data[o + 6] - ox)
      const fMin = Math.min(f0, f1, f2, f3), fMax = Math.max(f0, f1, f2, f3)
      if (fMin > margin || fMax < -margin) continue
      if (fMin >= -onProbe && fMax <= onProbe) { accumulator.overlapPairs++; continue }
      const p0 = dx * (data[o] - ox) + dy * (data[o + 1] - oy)
      const p1 = dx * (data[o + 2] - ox) + dy * (data[o + 3] - oy)
      const p2 = dx * (data[o + 4] - ox) + dy * (data[o + 5] - oy)
      const p3 = dx * (data[o + 6] - ox) + dy * (data[o + 7] - oy)
      if (Math.max(p0, p1, p2, p3) < low || Math.min(p0, p1, p2, p3) > high) continue
      accumulator.pairs++
      measureCubic(data, o)
      const found = closedForm.intersectCubic(data, o, ox, oy, dx, dy, sMin, sMax, referenceT)
      const referenceCount = completeReferenceRoots(data, o, found, f0, f1, f2, f3, onProbe, rangeLow, rangeHigh)
      for (let i = 0; i < referenceCount; i++) {
        evaluatePoint(data, o, CUBIC, referenceT[i], vector)
        referenceX[i] = vector[0]
        referenceY[i] = vector[1]
        classifyRoot(data, o, referenceT[i])
        referenceKind[i] = rootKind
        referenceWinding[i] = rootWinding
        referenceAngle[i] = rootAngle
      }
      const segment = cubics.segment[k]
      const keyState = mix(probeState, segment)
      for (let e = 0; e < engines.length; e++) {
        const engineCount = runEngine(engines[e].code, data, o, sMin, sMax, engineT)
        if (referenceCount === 0 && engineCount === 0) continue
        compareEngine(engines[e], category, data, o, segment, referenceCount, engineCount, size, keyState)
      }
    }
  }
  currentProbe = null
}

function finishAccumulator(accumulator: AuditAccumulator): AuditAggregate {
  const aggregate = emptyAggregate(accumulator.engines)
  aggregate.paths = accumulator.paths
  aggregate.invalidPaths = accumulator.invalidPaths
  aggregate.probes = accumulator.probes
  PROBE_CATEGORIES.forEach((category, c) => { aggregate.probesByCategory[category] = accumulator.probesByCategory[c] })
  aggregate.pairs = accumulator.pairs
  aggregate.overlapPairs = accumulator.overlapPairs
  aggregate.skippedSegments = accumulator.skippedSegments
  accumulator.byEngine.forEach((engine, e) => {
    const target = aggregate.byEngine[e]
    PROBE_CATEGORIES.forEach((category, c) => {
      AUDIT_COUNT_FIELDS.forEach((field, f) => { target.categories[category][field] = engine.counts[c * COUNT_FIELDS + f] })
    })
    target.pointErrorHistogram = Array.from(engine.pointHistogram)
    target.tErrorHistogram = Array.from(engine.tHistogram)
    compactSamples(engine)
    target.scatterKeys = [...engine.sampleKeys]
    target.scatter = engine.sampleX.map((x, i) => [x, engine.sampleY[i]])
    target.worst = engine.worst.map((c) => ({ ...c }))
  })
  return aggregate
}

/**
 * The aggregate of several paths in one pass; equal to merging their auditPath aggregates
 * in any grouping. RangeError for malformed options; unparsable path data counts as invalid.
 */
export function auditPaths(inputs: readonly AuditPathInput[], options: AuditOptions, onCase?: AuditCaseObserver): AuditAggregate {
  const accumulator = createAccumulator(prepareOptions(options))
  currentObserver = onCase
  try {
    for (const input of inputs) auditInto(accumulator, input, options)
  } finally {
    currentObserver = undefined
  }
  return finishAccumulator(accumulator)
}

/** The aggregate of one path (see auditPaths). */
export function auditPath(input: AuditPathInput, options: AuditOptions, onCase?: AuditCaseObserver): AuditAggregate {
  return auditPaths([input], options, onCase)
}
