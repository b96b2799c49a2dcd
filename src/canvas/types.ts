/**
 * The canvas's own data: an editable form of a path (contours of segments with their
 * control points, arcs kept as SVG arc commands), probes and sweeps as drawn on the sheet.
 * Coordinates are the path's own (y down, as in SVG); everything here is plain, immutable
 * data: an edit returns a new object and shares what it did not change.
 */
import type { Point } from '../../shared/geometry'

export type { Point }

/** One drawing command of a contour, in absolute coordinates; it starts where the previous one ends. */
export type EditSegment =
  | { readonly kind: 'line'; readonly to: Point }
  | { readonly kind: 'quadratic'; readonly c1: Point; readonly to: Point }
  | { readonly kind: 'cubic'; readonly c1: Point; readonly c2: Point; readonly to: Point }
  | {
    readonly kind: 'arc'
    readonly rx: number
    readonly ry: number
    /** x-axis rotation in degrees, as in the SVG A command. */
    readonly rotation: number
    readonly largeArc: boolean
    readonly sweep: boolean
    readonly to: Point
  }

export type EditSegmentKind = EditSegment['kind']

/** A subpath: a start point (the M), its segments, and whether Z closes it. */
export interface EditContour {
  readonly start: Point
  readonly segments: readonly EditSegment[]
  readonly closed: boolean
}

export interface EditPath {
  readonly contours: readonly EditContour[]
}

/**
 * Which point of an EditPath: the start of a contour (`segment` −1, role 'start'), a
 * segment's end (`to`), or one of its control points (`c1`, `c2`).
 */
export type PointRole = 'start' | 'to' | 'c1' | 'c2'
export interface PointRef {
  readonly contour: number
  readonly segment: number
  readonly role: PointRole
}

/** A segment of an EditPath. */
export interface SegmentRef {
  readonly contour: number
  readonly segment: number
}

/**
 * A probe on the sheet, in the computation contract's own terms so typed numbers stay
 * exact: a ray or line has its origin in `a` and its direction vector in `b`; a segment
 * runs from `a` to `b`. `id` is unique on the sheet.
 */
export interface CanvasProbe {
  readonly id: string
  readonly type: 'ray' | 'line' | 'segment'
  readonly a: Point
  readonly b: Point
}

/**
 * Parallel lines: line i (0 ≤ i < count) passes through origin + i·spacing·n, where
 * n = (−sin angle, cos angle), and runs along (cos angle, sin angle). `angle` is in degrees
 * from +x towards +y (clockwise on screen in the path's y-down frame).
 */
export interface CanvasSweep {
  readonly id: string
  readonly angle: number
  readonly spacing: number
  readonly count: number
  readonly origin: Point
}
