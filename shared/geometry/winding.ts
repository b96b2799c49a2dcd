/**
 * Winding number and containment of points, for the nonzero and even-odd fill rules.
 *
 * Every subpath is treated as closed, as SVG fills it. The winding number of a point is the
 * sum of the hit windings along the ray from the point in +x, with the sign convention of
 * /intersect (direction × tangent, y down).
 */
import type { NormalisedPath } from './path-data'
import type { Point } from './segments'
import type { PreparedPath } from './internal/prepared-path'
import { preparePath } from './internal/prepared-path'
import { collectHits, summariseHits } from './intersect-probe'
import { PROBE_END_REL } from './internal/probe-tolerances'

export type FillRule = 'nonzero' | 'evenodd'

/** Containment of one point. */
export interface Containment {
  readonly inside: boolean
  readonly winding: number
  readonly onBoundary: boolean
}

/** Applies a fill rule to a winding number. */
export function applyFillRule(winding: number, fillRule: FillRule): boolean {
  return fillRule === 'evenodd' ? winding % 2 !== 0 : winding !== 0
}

function containPrepared(prepared: PreparedPath, x: number, y: number, fillRule: FillRule): Containment {
  if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError('point coordinates must be finite numbers')
  const slack = PROBE_END_REL * Math.max(prepared.scale, Math.abs(x), Math.abs(y), Number.MIN_VALUE)
  const { winding, onBoundary } = summariseHits(
    collectHits(prepared, { ox: x, oy: y, dx: 1, dy: 0, sMin: 0, sMax: Infinity }),
    slack,
  )
  // The horizontal ray misses a boundary running nearly parallel to it just above or below
  // the point; a short vertical probe through the point catches that.
  const touches = onBoundary || collectHits(prepared, { ox: x, oy: y - slack, dx: 0, dy: 2 * slack, sMin: 0, sMax: 1 }) > 0
  return { inside: applyFillRule(winding, fillRule), winding, onBoundary: touches }
}

/**
 * Winding number of a path around a point: the sum of hit windings along the ray from the
 * point in +x, every subpath closed. For a point on the boundary it is the winding just to
 * the right of the point along that ray.
 */
export function windingNumber(path: NormalisedPath, point: Point): number {
  return containPrepared(preparePath(path, true), point[0], point[1], 'nonzero').winding
}

/** Containment of each point (see the contract of /contains); the path is packed once. */
export function containsPoints(path: NormalisedPath, points: readonly Point[], fillRule: FillRule = 'nonzero'): Containment[] {
  const prepared = preparePath(path, true)
  return points.map(([x, y]) => containPrepared(prepared, x, y, fillRule))
}
