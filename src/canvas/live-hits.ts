/**
 * Live hits: every probe and sweep line of the sheet against every path, recomputed on each
 * pointer-move frame, with the winding verdict at each ray's origin; the comparison of live
 * hits with the server's; and a grid of winding numbers.
 *
 * Speed. The public intersectProbes and containsPoints pack the path (preparePath) on every
 * call, which for a large path costs more than probing it. Here each normalised path is
 * packed once per form (as drawn for hits, closed as filled for winding) and kept in a
 * WeakMap keyed by the path object: paths are immutable, so an edited path is a new object
 * and the stale packing goes with the old one. Each probe then runs only over the subpaths
 * whose bounding box it comes near (see cullFor): the core walks every segment of every
 * subpath it is given, so this is what makes a few probes across a glyph set cheap. The
 * probing itself runs through the same core routines the public functions use
 * (resolveProbe, collectHits, readHits, summariseHits), so the hits are identical to
 * intersectProbes' and the verdicts to containsPoints' (tested). One subpath of thousands
 * of segments is still walked whole by every probe that comes near it.
 */
import type { Bounds, Hit, NormalisedPath, Point, Probe } from '../../shared/geometry'
import type { ProbeLine } from '../../shared/geometry/intersect-probe'
import { collectHits, readHits, resolveProbe, summariseHits } from '../../shared/geometry/intersect-probe'
import type { PreparedPath } from '../../shared/geometry/internal/prepared-path'
import { preparePath } from '../../shared/geometry/internal/prepared-path'
import { ON_PROBE_REL, PROBE_END_REL } from '../../shared/geometry/internal/probe-tolerances'
import { ARC_CODE } from '../../shared/geometry/segments'
import { applyFillRule } from '../../shared/geometry/winding'
import { describeProbe, sweepLines, toCoreProbe } from './probe-geometry'
import type { CanvasProbe, CanvasSweep } from './types'

/** Winding at a ray's origin, as POST /contains answers for that point, under both fill rules. */
export interface OriginVerdict {
  readonly winding: number
  readonly onBoundary: boolean
  readonly nonzero: boolean
  readonly evenodd: boolean
}

export interface LivePathHits {
  readonly pathKey: string
  readonly hits: Hit[]
  /** Rays only. */
  readonly origin?: OriginVerdict
}

export interface LiveLine {
  /** The probe's id, or `${sweepId}#${i}` for line i of a sweep. */
  readonly lineId: string
  readonly probeId: string | null
  readonly sweepId: string | null
  readonly probe: Probe
  readonly perPath: LivePathHits[]
}

export interface LiveResult {
  readonly lines: LiveLine[]
}

/** A packed path and the bounds of each subpath (4 values per subpath), for culling. */
interface Packing {
  readonly prepared: PreparedPath
  readonly boxes: Float64Array
}

const packedAsDrawn = new WeakMap<NormalisedPath, Packing>()
const packedAsFilled = new WeakMap<NormalisedPath, Packing>()

/** Per subpath, a box holding every point of it: control points, and each arc's whole circle. */
function measureSubpathBoxes(prepared: PreparedPath): Float64Array {
  const { data, offsets, order, subpathStart, subpathCount } = prepared
  const boxes = new Float64Array(4 * subpathStart.length)
  for (let j = 0; j < subpathStart.length; j++) {
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity
    const include = (x: number, y: number): void => {
      if (x < minX) minX = x
      if (x > maxX) maxX = x
      if (y < minY) minY = y
      if (y > maxY) maxY = y
    }
    for (let k = subpathStart[j]; k < subpathStart[j] + subpathCount[j]; k++) {
      const o = offsets[order[k]]
      const code = offsets[order[k] + 1] - o
      if (code === ARC_CODE) {
        const radius = Math.max(data[o + 6], data[o + 7])
        include(data[o + 4] - radius, data[o + 5] - radius)
        include(data[o + 4] + radius, data[o + 5] + radius)
      } else {
        for (let i = 0; i < code; i += 2) include(data[o + i], data[o + i + 1])
      }
    }
    boxes.set([minX, minY, maxX, maxY], 4 * j)
  }
  return boxes
}

function packed(path: NormalisedPath, closeForFill: boolean): Packing {
  const cache = closeForFill ? packedAsFilled : packedAsDrawn
  let packing = cache.get(path)
  if (packing === undefined) {
    const prepared = preparePath(path, closeForFill)
    packing = { prepared, boxes: measureSubpathBoxes(prepared) }
    cache.set(path, packing)
  }
  return packing
}

/**
 * Culling keeps a subpath unless its box lies farther from the probe than CULL_MARGIN times
 * the core's own tolerances (ON_PROBE_REL·L across, PROBE_END_REL·L beyond the ends).
 * Derivation: a subpath the core would answer with no hit has every point beyond those
 * tolerances; the box corners' distances here and the core's side values each carry a few
 * ε·L of rounding, far below the extra 3 tolerances (≥ 192ε·L) the factor 4 leaves.
 */
const CULL_MARGIN = 4

/**
 * The packed path reduced to the subpaths that can meet the probe (the same object when all
 * can). Subpaths are probed independently by the core and keep their order, so the hits of
 * the reduced path are the hits of the whole (tested against intersectProbes).
 */
function cullFor(packing: Packing, probe: ProbeLine): PreparedPath {
  const { prepared, boxes } = packing
  const { ox, oy, dx, dy, sMin, sMax } = probe
  const length = Math.hypot(dx, dy)
  const unitX = dx / length, unitY = dy / length
  const magnitude = Math.max(prepared.scale, Math.abs(ox), Math.abs(oy), Number.MIN_VALUE)
  const across = CULL_MARGIN * ON_PROBE_REL * magnitude
  const along = CULL_MARGIN * PROBE_END_REL * magnitude
  const alongLow = sMin * length - along, alongHigh = sMax * length + along
  const subpaths = prepared.subpathStart.length
  const kept: number[] = []
  for (let j = 0; j < subpaths; j++) {
    let sideLow = Infinity, sideHigh = -Infinity, reachLow = Infinity, reachHigh = -Infinity
    for (let corner = 0; corner < 4; corner++) {
      const rx = boxes[4 * j + (corner & 1 ? 2 : 0)] - ox
      const ry = boxes[4 * j + (corner & 2 ? 3 : 1)] - oy
      const side = unitX * ry - unitY * rx, reach = unitX * rx + unitY * ry
      if (side < sideLow) sideLow = side
      if (side > sideHigh) sideHigh = side
      if (reach < reachLow) reachLow = reach
      if (reach > reachHigh) reachHigh = reach
    }
    const missesAcross = sideLow > across || sideHigh < -across
    const missesAlong = reachHigh < alongLow || reachLow > alongHigh
    if (!missesAcross && !missesAlong) kept.push(j)
  }
  if (kept.length === subpaths) return prepared
  return {
    ...prepared,
    subpathStart: Int32Array.from(kept, (j) => prepared.subpathStart[j]),
    subpathCount: Int32Array.from(kept, (j) => prepared.subpathCount[j]),
    subpathClosed: Uint8Array.from(kept, (j) => prepared.subpathClosed[j]),
  }
}

/** collectHits on the subpaths that can meet the probe. */
function collectCulled(packing: Packing, probe: ProbeLine): number {
  return collectHits(cullFor(packing, probe), probe)
}

/** The core's boundary slack around a point (winding.ts: PROBE_END_REL of the magnitude). */
function boundarySlack(filled: Packing, x: number, y: number): number {
  return PROBE_END_REL * Math.max(filled.prepared.scale, Math.abs(x), Math.abs(y), Number.MIN_VALUE)
}

/** Winding number and boundary flag at (x, y) along the ray in +x, as winding.ts computes them. */
function windingAt(filled: Packing, x: number, y: number): { winding: number; onBoundary: boolean } {
  return summariseHits(collectCulled(filled, { ox: x, oy: y, dx: 1, dy: 0, sMin: 0, sMax: Infinity }), boundarySlack(filled, x, y))
}

/**
 * Containment of a ray's origin, step for step as containsPoints decides it (winding.ts):
 * the horizontal ray's summary, and a short vertical probe through the point that catches
 * a boundary running nearly parallel to that ray.
 */
function judgeOrigin(filled: Packing, x: number, y: number): OriginVerdict {
  const { winding, onBoundary } = windingAt(filled, x, y)
  const slack = boundarySlack(filled, x, y)
  const touches = onBoundary || collectCulled(filled, { ox: x, oy: y - slack, dx: 0, dy: 2 * slack, sMin: 0, sMax: 1 }) > 0
  return { winding, onBoundary: touches, nonzero: applyFillRule(winding, 'nonzero'), evenodd: applyFillRule(winding, 'evenodd') }
}

interface PendingLine {
  readonly line: LiveLine
  /** null for a zero direction (a probe still being drawn): no hits, no throw. */
  readonly resolved: ProbeLine | null
  /** A ray's origin, where its verdict is taken; null for lines and segments. */
  readonly rayOrigin: Point | null
}

function resolveLive(probe: Probe): ProbeLine | null {
  const { origin, direction } = describeProbe(probe)
  if (![origin[0], origin[1], direction[0], direction[1]].every(Number.isFinite)) {
    throw new RangeError('probe coordinates must be finite numbers')
  }
  return direction[0] === 0 && direction[1] === 0 ? null : resolveProbe(probe)
}

/**
 * Hits of every probe and every sweep line on every path: probes first in their order, then
 * each sweep's lines. Each path's hits equal intersectProbes(path, [probe])[0] (the path as
 * drawn, open subpaths open), and each ray carries the containment of its origin (the path
 * closed as filled, as containsPoints). A probe with a zero direction (a segment from a
 * point to itself, as while a probe is being drawn) has no hits on any path instead of
 * throwing; a ray's origin verdict is still given. RangeError for non-finite numbers or a
 * sweep count that is not a non-negative integer.
 */
export function computeLiveHits(
  paths: readonly { key: string; path: NormalisedPath }[],
  probes: readonly CanvasProbe[],
  sweeps: readonly CanvasSweep[],
): LiveResult {
  const pending: PendingLine[] = []
  const add = (lineId: string, probeId: string | null, sweepId: string | null, probe: Probe): void => {
    const rayOrigin = probe.type === 'ray' ? probe.origin : null
    pending.push({ line: { lineId, probeId, sweepId, probe, perPath: [] }, resolved: resolveLive(probe), rayOrigin })
  }
  for (const p of probes) add(p.id, p.id, null, toCoreProbe(p))
  for (const sweep of sweeps) {
    sweepLines(sweep).forEach(({ origin, direction }, i) => add(`${sweep.id}#${i}`, null, sweep.id, { type: 'line', origin, direction }))
  }
  for (const { key, path } of paths) {
    const drawn = packed(path, false)
    const filled = pending.some((entry) => entry.rayOrigin !== null) ? packed(path, true) : null
    for (const { line, resolved, rayOrigin } of pending) {
      // The core's scratch holds one probe's hits at a time: read them before the next call.
      const hits = resolved === null ? [] : readHits(collectCulled(drawn, resolved))
      if (rayOrigin !== null && filled !== null) {
        line.perPath.push({ pathKey: key, hits, origin: judgeOrigin(filled, rayOrigin[0], rayOrigin[1]) })
      } else {
        line.perPath.push({ pathKey: key, hits })
      }
    }
  }
  return { lines: pending.map((entry) => entry.line) }
}

/**
 * Allowed distance between a live hit and the server's, as a fraction of the path's size.
 * Derivation: client and server run the same core on the same doubles, so hits should agree
 * exactly; a different JavaScript engine's Math.cos/sqrt may differ by an ulp or so, which
 * moves a well-conditioned hit by a few ε·L ≈ 1e-15·L; 1e-9 allows that amplified by a
 * condition number up to ~10^6 (a near-tangent hit) and still flags any real disagreement.
 */
export const SERVER_AGREEMENT_REL = 1e-9

export type HitDifferenceKind = 'missing-on-server' | 'extra-on-server' | 'moved' | 'kind' | 'winding' | 'segment'

export interface HitDifference {
  readonly kind: HitDifferenceKind
  readonly live: Hit | null
  readonly server: Hit | null
  /** Distance between the paired points; null for an unpaired hit. */
  readonly distance: number | null
}

function distanceBetween(a: Hit, b: Hit): number {
  return Math.hypot(a.point[0] - b.point[0], a.point[1] - b.point[1])
}

function indicesByS(hits: readonly Hit[]): number[] {
  return hits.map((_, i) => i).sort((a, b) => hits[a].s - hits[b].s || a - b)
}

/**
 * Differences between live hits and the server's for one probe on one path. Pairing is
 * greedy in s order in two passes: first each live hit takes the nearest unpaired server hit
 * within SERVER_AGREEMENT_REL·size (an agreeing pair, then compared for kind, winding and
 * segment, reported once in that order of importance); then each live hit still unpaired
 * takes the nearest server hit still unpaired, a 'moved' pair however far. What is left is
 * 'missing-on-server' (live only) or 'extra-on-server'. Overlaps are paired by their start
 * points. Sorted by the s of the live hit (else the server's). [] when all agree.
 */
export function compareHits(live: readonly Hit[], server: readonly Hit[], size: number): HitDifference[] {
  const tolerance = SERVER_AGREEMENT_REL * size
  const liveOrder = indicesByS(live)
  const partnerOfServer = new Int32Array(server.length).fill(-1)
  const partnerOfLive = new Int32Array(live.length).fill(-1)
  const pair = (withinTolerance: boolean): void => {
    for (const i of liveOrder) {
      if (partnerOfLive[i] >= 0) continue
      let best = -1, bestDistance = Infinity
      for (let j = 0; j < server.length; j++) {
        if (partnerOfServer[j] >= 0) continue
        const distance = distanceBetween(live[i], server[j])
        if (distance < bestDistance && (!withinTolerance || distance <= tolerance)) { best = j; bestDistance = distance }
      }
      if (best >= 0) { partnerOfLive[i] = best; partnerOfServer[best] = i }
    }
  }
  pair(true)
  const agreeing = new Set(liveOrder.filter((i) => partnerOfLive[i] >= 0))
  pair(false)
  const differences: { s: number; difference: HitDifference }[] = []
  const note = (s: number, kind: HitDifferenceKind, a: Hit | null, b: Hit | null): void => {
    differences.push({ s, difference: { kind, live: a, server: b, distance: a !== null && b !== null ? distanceBetween(a, b) : null } })
  }
  for (const i of liveOrder) {
    const a = live[i]
    if (partnerOfLive[i] < 0) { note(a.s, 'missing-on-server', a, null); continue }
    const b = server[partnerOfLive[i]]
    if (!agreeing.has(i)) note(a.s, 'moved', a, b)
    else if (a.kind !== b.kind) note(a.s, 'kind', a, b)
    else if (a.winding !== b.winding) note(a.s, 'winding', a, b)
    else if (a.segment !== b.segment) note(a.s, 'segment', a, b)
  }
  for (const j of indicesByS(server)) if (partnerOfServer[j] < 0) note(server[j].s, 'extra-on-server', null, server[j])
  return differences.sort((x, y) => x.s - y.s).map((entry) => entry.difference)
}

/**
 * Winding numbers at the centres of a cols × rows grid over rect [minX, minY, maxX, maxY],
 * row-major (index row·cols + col, rows along y): cell (col, row) is centred at
 * minX + (col + ½)·(maxX − minX)/cols, likewise y. Each equals windingNumber(path, centre).
 * An empty grid (0 cols or rows) is an empty array. RangeError for counts that are not
 * non-negative integers or a non-finite rectangle.
 */
export function sampleWindingGrid(path: NormalisedPath, rect: Bounds, cols: number, rows: number): Int32Array {
  if (!Number.isInteger(cols) || !Number.isInteger(rows) || cols < 0 || rows < 0) {
    throw new RangeError(`grid counts must be non-negative integers, got ${cols} × ${rows}`)
  }
  if (!rect.every(Number.isFinite)) throw new RangeError('grid rectangle must be finite numbers')
  const grid = new Int32Array(cols * rows)
  if (grid.length === 0) return grid
  const filled = packed(path, true)
  const [minX, minY, maxX, maxY] = rect
  const cellWidth = (maxX - minX) / cols, cellHeight = (maxY - minY) / rows
  for (let row = 0; row < rows; row++) {
    const y = minY + (row + 0.5) * cellHeight
    for (let col = 0; col < cols; col++) grid[row * cols + col] = windingAt(filled, minX + (col + 0.5) * cellWidth, y).winding
  }
  return grid
}
