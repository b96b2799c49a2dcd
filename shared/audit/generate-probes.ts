/**
 * Probe generators of an audit: random rays in the bounding box, pixel-centre scanlines,
 * lines through every on-curve vertex and lines tangent at every horizontal or vertical
 * tangent of the path. The cap on probes per path is a seeded uniform sample of the whole
 * list, drawn without building it (Floyd's sampling), and each probe is computed from its
 * own derived stream, so what a probe is never depends on which others were kept.
 */
import type { Probe } from '../geometry/intersect-probe'
import type { NormalisedPath } from '../geometry/path-data'
import { ARC_CODE, CUBIC_CODE, QUADRATIC_CODE, arcParameterOfAngle, computeSegmentBounds, endIndexOf, evaluatePackedInto } from '../geometry/segments'
import type { Segment } from '../geometry/segments'
import { solveQuadraticInto } from '../geometry/solve-quadratic'
import { COINCIDENT_REL } from '../geometry/diagnostics'
import { ROOT_T_SLACK } from '../geometry/internal/probe-tolerances'
import { createMulberry32, drawUnit, foldSeed, mixWord } from './random'
import type { AuditGenerators, GeneratedProbe, ProbeCategory } from './types'

// Read once: under a CommonJS transform (tsx, the piscina workers) every use of an imported name is a getter call.
const streamOf = createMulberry32
const unitOf = drawUnit
const mix = mixWord

/** Largest cap on the probes of one path. */
export const MAX_PROBES_PER_PATH = 10000
/** The bounding box is grown by this fraction of the path size (half on each side) for random rays. */
const RAY_BOX_GROWTH = 0.1
/** More sweep rows than this (spacing below 2^-40 of the box height) is a malformed request. */
const MAX_SWEEP_ROWS = 2 ** 40
/** Salts that separate the derived streams of the generators and of the cap. */
const SALT_RAY = 0x52415953, SALT_VERTEX = 0x56455254, SALT_CAP = 0x43415053

/** Bounding box, size and magnitude of a path, as the audit measures relative errors. */
export interface PathFrame {
  readonly minX: number
  readonly minY: number
  readonly maxX: number
  readonly maxY: number
  /** The larger side of the bounding box (1 when the box is a point): the unit of relative errors. */
  readonly size: number
  /** Largest |coordinate| of the box: the magnitude that scales rounding tolerances. */
  readonly magnitude: number
}

/** Tight bounding box of a path with its size; null for a path without segments. */
export function measurePath(path: NormalisedPath): PathFrame | null {
  if (path.segments.length === 0) return null
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity
  for (const segment of path.segments) {
    const [x0, y0, x1, y1] = computeSegmentBounds(segment)
    minX = Math.min(minX, x0); minY = Math.min(minY, y0)
    maxX = Math.max(maxX, x1); maxY = Math.max(maxY, y1)
  }
  const extent = Math.max(maxX - minX, maxY - minY)
  const magnitude = Math.max(Math.abs(minX), Math.abs(minY), Math.abs(maxX), Math.abs(maxY))
  return { minX, minY, maxX, maxY, size: extent > 0 ? extent : 1, magnitude }
}

function requireInteger(value: unknown, low: number, high: number, name: string): void {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < low || value > high) {
    throw new RangeError(`${name} must be an integer from ${low} to ${high}, got ${String(value)}`)
  }
}

/** Throws RangeError unless `generators` is a well-formed AuditGenerators. */
export function validateGenerators(generators: AuditGenerators): void {
  if (typeof generators !== 'object' || generators === null) throw new RangeError('generators must be an object')
  requireInteger(generators.randomRays, 0, Number.MAX_SAFE_INTEGER, 'generators.randomRays')
  requireInteger(generators.maxProbesPerPath, 1, MAX_PROBES_PER_PATH, 'generators.maxProbesPerPath')
  const spacing = generators.sweepSpacing
  if (spacing !== null && !(typeof spacing === 'number' && Number.isFinite(spacing) && spacing > 0)) {
    throw new RangeError(`generators.sweepSpacing must be a positive finite number or null, got ${String(spacing)}`)
  }
  if (typeof generators.vertexProbes !== 'boolean') throw new RangeError('generators.vertexProbes must be a boolean')
  if (typeof generators.extremumProbes !== 'boolean') throw new RangeError('generators.extremumProbes must be a boolean')
}

/** Throws RangeError unless the seed is a safe integer. */
export function validateSeed(seed: number): void {
  if (!Number.isSafeInteger(seed)) throw new RangeError(`seed must be a safe integer, got ${String(seed)}`)
}

/** On-curve vertices: each segment's start, and an open subpath's end when it is away from its start. */
function collectVertices(path: NormalisedPath): number[] {
  const points: number[] = []
  for (const subpath of path.subpaths) {
    for (let k = 0; k < subpath.count; k++) {
      const segment = path.segments[subpath.start + k]
      points.push(segment[0], segment[1])
    }
    const first = path.segments[subpath.start]
    const last = path.segments[subpath.start + subpath.count - 1]
    const end = endIndexOf(last.length)
    if (!subpath.closed && (last[end] !== first[0] || last[end + 1] !== first[1])) points.push(last[end], last[end + 1])
  }
  return points
}

const AXIS_X = 0, AXIS_Y = 1
const roots = new Float64Array(2)
const point = new Float64Array(2)

/**
 * Parameters in [0, 1] where a segment's derivative along `axis` vanishes (ends snapped
 * within ROOT_T_SLACK); none for an axis along which the segment does not move at all.
 */
function findAxisTangents(segment: Segment, axis: number): number[] {
  const code = segment.length
  const found: number[] = []
  if (code === ARC_CODE) {
    const rx = segment[6], ry = segment[7], c = segment[8], s = segment[9]
    // x′(θ) ∝ −rx·c·sin θ − ry·s·cos θ and y′(θ) ∝ −rx·s·sin θ + ry·c·cos θ vanish at these angles (+π)
    const angle = axis === AXIS_X ? Math.atan2(-ry * s, rx * c) : Math.atan2(ry * c, rx * s)
    for (const a of [angle, angle + Math.PI]) found.push(arcParameterOfAngle(a, segment[10], segment[11]))
  } else if (code === QUADRATIC_CODE) {
    const p0 = segment[axis], p1 = segment[2 + axis], p2 = segment[4 + axis]
    const curvature = p0 - 2 * p1 + p2
    if (curvature !== 0) found.push((p0 - p1) / curvature)
  } else if (code === CUBIC_CODE) {
    const p0 = segment[axis], p1 = segment[2 + axis], p2 = segment[4 + axis], p3 = segment[6 + axis]
    const a = p3 - 3 * p2 + 3 * p1 - p0, b = 2 * (p2 - 2 * p1 + p0), c = p1 - p0
    if (a !== 0 || b !== 0 || c !== 0) {
      const count = solveQuadraticInto(a, b, c, roots)
      for (let i = 0; i < count; i++) found.push(roots[i])
    }
  }
  const kept: number[] = []
  for (const t of found) {
    if (!(t >= -ROOT_T_SLACK && t <= 1 + ROOT_T_SLACK)) continue
    kept.push(t <= ROOT_T_SLACK ? 0 : t >= 1 - ROOT_T_SLACK ? 1 : t)
  }
  return kept
}

/**
 * Lines tangent to the path where its tangent is horizontal (a y-extremum of a segment,
 * interior or at an end: a horizontal line) or vertical (an x-extremum: a vertical line).
 * Lines along one axis give none (a probe along them is an overlap, not a tangent). Lines
 * within the coincidence distance of one already made are the same line and are left out.
 * Packed as [axis, x, y] triples in path order.
 */
function collectExtremumLines(path: NormalisedPath, frame: PathFrame): number[] {
  const candidates: { axis: number; x: number; y: number; order: number }[] = []
  for (const segment of path.segments) {
    for (const axis of [AXIS_Y, AXIS_X]) {
      for (const t of findAxisTangents(segment, axis)) {
        evaluatePackedInto(segment, 0, segment.length, t, point)
        candidates.push({ axis, x: point[0], y: point[1], order: candidates.length })
      }
    }
  }
  const coincident = COINCIDENT_REL * Math.max(frame.magnitude, frame.size)
  // a horizontal line is known by its y, a vertical one by its x
  const valueOf = (c: { axis: number; x: number; y: number }): number => (c.axis === AXIS_Y ? c.y : c.x)
  const sorted = [...candidates].sort((a, b) => a.axis - b.axis || valueOf(a) - valueOf(b) || a.order - b.order)
  const kept: typeof candidates = []
  let clusterAxis = -1, clusterStart = 0, clusterBest: (typeof candidates)[number] | null = null
  for (const c of sorted) {
    if (c.axis !== clusterAxis || valueOf(c) - clusterStart > coincident) {
      if (clusterBest) kept.push(clusterBest)
      clusterAxis = c.axis
      clusterStart = valueOf(c)
      clusterBest = c
    } else if (clusterBest && c.order < clusterBest.order) {
      clusterBest = c
    }
  }
  if (clusterBest) kept.push(clusterBest)
  kept.sort((a, b) => a.order - b.order)
  return kept.flatMap((c) => [c.axis, c.x, c.y])
}

/** Distinct indices in [0, total) chosen uniformly, `count` of them, ascending (Floyd's algorithm). */
function sampleIndices(total: number, count: number, seed: number): number[] {
  if (total <= count) return Array.from({ length: total }, (_, i) => i)
  const next32 = streamOf(mix(seed, SALT_CAP))
  const chosen = new Set<number>()
  for (let j = total - count; j < total; j++) {
    const candidate = Math.floor(unitOf(next32) * (j + 1))
    chosen.add(chosen.has(candidate) ? j : candidate)
  }
  return [...chosen].sort((a, b) => a - b)
}

/** Rows y = (k + ½)·spacing inside [minY, maxY]: the first k and the count (common practice: a rasterizer samples pixel centres). */
function pixelCentreRows(frame: PathFrame, spacing: number | null): { first: number; count: number } {
  if (spacing === null) return { first: 0, count: 0 }
  const first = Math.ceil(frame.minY / spacing - 0.5)
  const last = Math.floor(frame.maxY / spacing - 0.5)
  const count = Math.max(0, last - first + 1)
  if (!(count <= MAX_SWEEP_ROWS)) throw new RangeError(`generators.sweepSpacing ${spacing} gives ${count} rows across the path, more than ${MAX_SWEEP_ROWS}`)
  return { first, count }
}

/**
 * The audit's probes of one path, in category order (random rays, sweep rows, vertex lines,
 * extremum lines), then capped to maxProbesPerPath by a seeded uniform sample that keeps
 * their order. Rays: origin uniform in the bounding box grown by 10% of the path size (5% on
 * each side), direction at a uniform angle. Sweep: lines y = (k + ½)·spacing across the box,
 * origin at its left edge, direction +x. Vertex lines: through each segment's start (and an
 * open subpath's end), at a uniform angle in [0, π). Extremum lines: see collectExtremumLines.
 * A path without segments has no probes. Throws RangeError for malformed generators or seed.
 */
export function generateProbes(path: NormalisedPath, generators: AuditGenerators, seed: number): GeneratedProbe[] {
  validateGenerators(generators)
  validateSeed(seed)
  const frame = measurePath(path)
  if (frame === null) return []
  const state = foldSeed(seed)
  const rows = pixelCentreRows(frame, generators.sweepSpacing)
  const vertices = generators.vertexProbes ? collectVertices(path) : []
  const extrema = generators.extremumProbes ? collectExtremumLines(path, frame) : []
  const counts = [generators.randomRays, rows.count, vertices.length / 2, extrema.length / 3]
  const total = counts[0] + counts[1] + counts[2] + counts[3]
  const grow = (RAY_BOX_GROWTH / 2) * frame.size
  const boxX = frame.minX - grow, boxY = frame.minY - grow
  const boxWidth = frame.maxX - frame.minX + 2 * grow, boxHeight = frame.maxY - frame.minY + 2 * grow
  const make = (category: number, i: number): GeneratedProbe => {
    if (category === 0) {
      const next32 = streamOf(mix(mix(state, SALT_RAY), i))
      const x = boxX + unitOf(next32) * boxWidth
      const y = boxY + unitOf(next32) * boxHeight
      const angle = 2 * Math.PI * unitOf(next32)
      return { category: 'random-ray', probe: { type: 'ray', origin: [x, y], direction: [Math.cos(angle), Math.sin(angle)] } }
    }
    if (category === 1) {
      const y = (rows.first + i + 0.5) * generators.sweepSpacing!
      return { category: 'sweep', probe: { type: 'line', origin: [frame.minX, y], direction: [1, 0] } }
    }
    if (category === 2) {
      const angle = Math.PI * unitOf(streamOf(mix(mix(state, SALT_VERTEX), i)))
      return { category: 'vertex', probe: { type: 'line', origin: [vertices[2 * i], vertices[2 * i + 1]], direction: [Math.cos(angle), Math.sin(angle)] } }
    }
    const horizontal = extrema[3 * i] === AXIS_Y
    const probe: Probe = { type: 'line', origin: [extrema[3 * i + 1], extrema[3 * i + 2]], direction: horizontal ? [1, 0] : [0, 1] }
    return { category: 'extremum', probe }
  }
  return sampleIndices(total, generators.maxProbesPerPath, state).map((index) => {
    let category = 0
    let i = index
    while (i >= counts[category]) i -= counts[category++]
    return make(category, i)
  })
}

/** Number of probes per category in a generated list, in PROBE_CATEGORIES order. */
export function countByCategory(probes: readonly GeneratedProbe[]): Record<ProbeCategory, number> {
  const counts: Record<ProbeCategory, number> = { 'random-ray': 0, sweep: 0, vertex: 0, extremum: 0 }
  for (const { category } of probes) counts[category]++
  return counts
}
