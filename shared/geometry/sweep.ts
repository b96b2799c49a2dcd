/**
 * Sweeps: families of parallel line probes across a path, each row answered with its
 * crossings, the winding number along the row and the filled spans.
 */
import type { NormalisedPath } from './path-data'
import type { Point } from './segments'
import type { Hit } from './intersect-probe'
import { collectHits, readHits, resolveProbe } from './intersect-probe'
import { preparePath } from './internal/prepared-path'
import type { FillRule } from './winding'
import { applyFillRule } from './winding'

/** Parallel lines at `angle` (radians from +x, y down), `count` of them `spacing` apart. */
export interface AngleSweep {
  readonly angle: number
  readonly spacing: number
  readonly count: number
  /** A point on the first line; line i passes through origin + i·spacing·(−sin angle, cos angle). */
  readonly origin: Point
  readonly fillRule?: FillRule
}

/** Horizontal scanlines y = rows[i], each directed along +x (so s is the x coordinate). */
export interface RowSweep {
  readonly rows: readonly number[]
  readonly fillRule?: FillRule
}

/** A stretch of a row between consecutive hit parameters, with its winding number. */
export interface RowSpan {
  readonly sStart: number
  readonly sEnd: number
  readonly winding: number
}

export interface SweepRow {
  readonly origin: Point
  readonly direction: Point
  readonly hits: readonly Hit[]
  /** Finite stretches between consecutive breakpoints (hit s, and sEnd of overlaps). */
  readonly spans: readonly RowSpan[]
  /** Merged stretches that the fill rule fills (overlaps next to a filled stretch included). */
  readonly filled: readonly (readonly [sStart: number, sEnd: number])[]
}

function spansOf(hits: readonly Hit[], fillRule: FillRule): Pick<SweepRow, 'spans' | 'filled'> {
  // A span's winding is the sum along the ray from inside it in +s: the hits that begin at or
  // after the span's end (an overlap counts once it lies wholly ahead).
  const breaks = [...new Set(hits.flatMap((hit) => (hit.kind === 'overlap' ? [hit.s, hit.sEnd as number] : [hit.s])))].sort((a, b) => a - b)
  const spans: RowSpan[] = []
  for (let i = 0; i + 1 < breaks.length; i++) {
    const sEnd = breaks[i + 1]
    const winding = hits.reduce((sum, hit) => (hit.s >= sEnd ? sum + hit.winding : sum), 0)
    spans.push({ sStart: breaks[i], sEnd, winding })
  }
  const boundary = (span: RowSpan): boolean =>
    hits.some((hit) => hit.kind === 'overlap' && hit.s <= span.sStart && (hit.sEnd as number) >= span.sEnd)
  const filledFlags = spans.map((span) => applyFillRule(span.winding, fillRule))
  const filled: [number, number][] = []
  spans.forEach((span, i) => {
    const isFilled = filledFlags[i] || (boundary(span) && (filledFlags[i - 1] === true || filledFlags[i + 1] === true))
    if (!isFilled) return
    const last = filled[filled.length - 1]
    if (last !== undefined && last[1] === span.sStart) last[1] = span.sEnd
    else filled.push([span.sStart, span.sEnd])
  })
  return { spans, filled }
}

/**
 * Runs a family of parallel line probes across a path (every subpath closed, as filled):
 * by angle, spacing and count, or by explicit horizontal rows. A span's winding is the sum of
 * hit windings ahead of it along the row, the winding number of its points (as /contains).
 * Hits on the implicit closing line of an open subpath report segment −1.
 */
export function sweepPath(path: NormalisedPath, sweep: AngleSweep | RowSweep): SweepRow[] {
  const fillRule = sweep.fillRule ?? 'nonzero'
  const lines: { origin: Point; direction: Point }[] = []
  if ('rows' in sweep) {
    for (const row of sweep.rows) lines.push({ origin: [0, row], direction: [1, 0] })
  } else {
    const { angle, spacing, count, origin } = sweep
    if (!Number.isInteger(count) || count < 0) throw new RangeError(`sweep count must be a non-negative integer, got ${count}`)
    if (!Number.isFinite(spacing) || !Number.isFinite(angle)) throw new RangeError('sweep angle and spacing must be finite')
    const cos = Math.cos(angle), sin = Math.sin(angle)
    for (let i = 0; i < count; i++) {
      lines.push({ origin: [origin[0] - i * spacing * sin, origin[1] + i * spacing * cos], direction: [cos, sin] })
    }
  }
  const prepared = preparePath(path, true)
  return lines.map(({ origin, direction }) => {
    const line = resolveProbe({ type: 'line', origin, direction })
    const hits = readHits(collectHits(prepared, line)).map((hit) =>
      hit.segment >= prepared.segmentCount ? { ...hit, segment: -1 } : hit,
    )
    return { origin, direction, hits, ...spansOf(hits, fillRule) }
  })
}
