/**
 * Drawing the canvas layers on a 2D context, in screen pixels (strokes never scale with the
 * zoom). Each function draws one layer's content; the Konva stage calls them from its
 * shapes' scene functions, so a layer is redrawn only when its own inputs change.
 */
import type { Bounds, Diagnostic, Hit, NormalisedPath, Point, Probe, Segment } from '../../shared/geometry'
import { evaluateSegment } from '../../shared/geometry'
import * as style from './canvas-style'
import type { CanvasPalette } from './canvas-style'
import { listPoints, segmentStart } from './edit-path'
import { clipProbeToRect, describeProbe } from './probe-geometry'
import type { EditPath, PointRef } from './types'
import type { ViewState } from '../composables/useViewTransform'

type Ctx = CanvasRenderingContext2D

/** Distance in pixels from a ray's or line's origin to the handle that sets its direction. */
export const DIRECTION_HANDLE_PX = 72

function sx(view: ViewState, x: number): number {
  return x * view.scale + view.offsetX
}
function sy(view: ViewState, y: number): number {
  return y * view.scale + view.offsetY
}

export function drawSheet(ctx: Ctx, view: ViewState, width: number, height: number, gridStep: number, palette: CanvasPalette, showGrid: boolean): void {
  ctx.fillStyle = palette.background
  ctx.fillRect(0, 0, width, height)
  if (!showGrid) return
  const x0 = -view.offsetX / view.scale
  const y0 = -view.offsetY / view.scale
  const x1 = (width - view.offsetX) / view.scale
  const y1 = (height - view.offsetY) / view.scale
  const stepPx = gridStep * view.scale
  ctx.lineWidth = style.GRID_LINE_WIDTH
  for (const major of [false, true]) {
    if (!major && stepPx < style.GRID_MIN_SPACING_PX) continue
    const step = major ? gridStep * style.GRID_MAJOR_EVERY : gridStep
    ctx.strokeStyle = major ? palette.gridMajor : palette.gridMinor
    ctx.beginPath()
    for (let k = Math.ceil(x0 / step); k * step <= x1; k++) {
      if (!major && k % style.GRID_MAJOR_EVERY === 0) continue
      const x = Math.round(sx(view, k * step)) + 0.5
      ctx.moveTo(x, 0)
      ctx.lineTo(x, height)
    }
    for (let k = Math.ceil(y0 / step); k * step <= y1; k++) {
      if (!major && k % style.GRID_MAJOR_EVERY === 0) continue
      const y = Math.round(sy(view, k * step)) + 0.5
      ctx.moveTo(0, y)
      ctx.lineTo(width, y)
    }
    ctx.stroke()
  }
}

/** Winding numbers sampled at cell centres (row-major), shown as shading with the number in big cells. */
export interface WindingGrid {
  readonly rect: Bounds
  readonly cols: number
  readonly rows: number
  readonly values: Int32Array
  readonly fillRule: 'nonzero' | 'evenodd'
}

export function drawContainment(ctx: Ctx, view: ViewState, grid: WindingGrid, palette: CanvasPalette): void {
  const [minX, minY, maxX, maxY] = grid.rect
  const cw = ((maxX - minX) / grid.cols) * view.scale
  const ch = ((maxY - minY) / grid.rows) * view.scale
  ctx.font = '10px "Roboto Mono", monospace'
  ctx.textAlign = 'center'
  ctx.textBaseline = 'middle'
  for (let r = 0; r < grid.rows; r++) {
    for (let c = 0; c < grid.cols; c++) {
      const w = grid.values[r * grid.cols + c]
      if (w === 0) continue
      const inside = grid.fillRule === 'nonzero' ? w !== 0 : (w & 1) !== 0
      const x = sx(view, minX) + c * cw
      const y = sy(view, minY) + r * ch
      ctx.globalAlpha = inside ? Math.min(0.12 + 0.08 * Math.abs(w), 0.4) : 0.06
      ctx.fillStyle = palette.selection
      ctx.fillRect(x, y, cw, ch)
      ctx.globalAlpha = 1
      if (w < 0) {
        // Negative windings are hatched, so the sign never rests on colour alone.
        ctx.strokeStyle = palette.selection
        ctx.lineWidth = 0.75
        ctx.beginPath()
        ctx.moveTo(x, y + ch)
        ctx.lineTo(x + cw, y)
        ctx.stroke()
      }
      if (cw >= 18 && ch >= 14) {
        ctx.fillStyle = palette.pathInk
        ctx.globalAlpha = 0.6
        ctx.fillText(String(w), x + cw / 2, y + ch / 2)
        ctx.globalAlpha = 1
      }
    }
  }
}

function traceSegment(ctx: Ctx, view: ViewState, seg: Segment, moveFirst: boolean): void {
  const s = view.scale
  if (moveFirst) ctx.moveTo(sx(view, seg[0]), sy(view, seg[1]))
  switch (seg.length) {
    case 4:
      ctx.lineTo(sx(view, seg[2]), sy(view, seg[3]))
      break
    case 6:
      ctx.quadraticCurveTo(sx(view, seg[2]), sy(view, seg[3]), sx(view, seg[4]), sy(view, seg[5]))
      break
    case 8:
      ctx.bezierCurveTo(sx(view, seg[2]), sy(view, seg[3]), sx(view, seg[4]), sy(view, seg[5]), sx(view, seg[6]), sy(view, seg[7]))
      break
    default: {
      // Arcs stay arcs: the centre parametrisation maps onto the canvas ellipse exactly.
      const a = seg as readonly number[]
      const rotation = Math.atan2(a[9], a[8])
      ctx.ellipse(sx(view, a[4]), sy(view, a[5]), a[6] * s, a[7] * s, rotation, a[10], a[10] + a[11], a[11] < 0)
    }
  }
}

/** Traces the subpaths of a normalised path (closing the closed ones). */
export function tracePath(ctx: Ctx, view: ViewState, path: NormalisedPath): void {
  for (const sub of path.subpaths) {
    for (let i = 0; i < sub.count; i++) traceSegment(ctx, view, path.segments[sub.start + i], i === 0)
    if (sub.closed) ctx.closePath()
  }
}

export function drawPaths(ctx: Ctx, view: ViewState, paths: readonly { path: NormalisedPath; fillRule: 'nonzero' | 'evenodd'; active: boolean }[], palette: CanvasPalette): void {
  for (const p of paths) {
    ctx.beginPath()
    tracePath(ctx, view, p.path)
    ctx.fillStyle = palette.pathFill
    ctx.fill(p.fillRule)
    ctx.strokeStyle = palette.pathInk
    ctx.lineWidth = p.active ? style.PATH_STROKE_WIDTH : style.PATH_STROKE_WIDTH * 0.75
    ctx.globalAlpha = p.active ? 1 : 0.7
    ctx.stroke()
    ctx.globalAlpha = 1
  }
}

function sameRef(a: PointRef, b: PointRef): boolean {
  return a.contour === b.contour && a.segment === b.segment && a.role === b.role
}

export function drawEditOverlay(
  ctx: Ctx,
  view: ViewState,
  edit: EditPath,
  options: { selection: readonly PointRef[]; selectedSegment: Segment | null; showControls: boolean },
  palette: CanvasPalette,
): void {
  if (options.selectedSegment) {
    ctx.beginPath()
    traceSegment(ctx, view, options.selectedSegment, true)
    ctx.strokeStyle = palette.selection
    ctx.lineWidth = style.PATH_STROKE_WIDTH + 2
    ctx.stroke()
  }
  if (options.showControls) {
    ctx.beginPath()
    edit.contours.forEach((contour, ci) => {
      contour.segments.forEach((seg, si) => {
        if (seg.kind !== 'quadratic' && seg.kind !== 'cubic') return
        const p0 = segmentStart(edit, ci, si)
        ctx.moveTo(sx(view, p0[0]), sy(view, p0[1]))
        ctx.lineTo(sx(view, seg.c1[0]), sy(view, seg.c1[1]))
        if (seg.kind === 'cubic') {
          ctx.moveTo(sx(view, seg.c2[0]), sy(view, seg.c2[1]))
        }
        ctx.lineTo(sx(view, seg.to[0]), sy(view, seg.to[1]))
      })
    })
    ctx.strokeStyle = palette.controlPolygon
    ctx.lineWidth = style.CONTROL_POLYGON_WIDTH
    ctx.stroke()
  }
  const half = style.ON_CURVE_SQUARE_SIZE / 2
  for (const { ref, point, onCurve } of listPoints(edit)) {
    if (!onCurve && !options.showControls) continue
    const selected = options.selection.some((s) => sameRef(s, ref))
    const x = sx(view, point[0])
    const y = sy(view, point[1])
    ctx.beginPath()
    if (onCurve) ctx.rect(x - half, y - half, 2 * half, 2 * half)
    else ctx.arc(x, y, style.CONTROL_CIRCLE_RADIUS, 0, 2 * Math.PI)
    ctx.fillStyle = selected ? palette.selection : palette.pointFill
    ctx.fill()
    ctx.strokeStyle = selected ? palette.selection : onCurve ? palette.onCurveStroke : palette.controlStroke
    ctx.lineWidth = 1
    ctx.stroke()
  }
}

/** Where a diagnostic is drawn: its point, else the middle of its segment; null when neither. */
export function diagnosticAnchor(path: NormalisedPath, d: Diagnostic): Point | null {
  if (d.point) return d.point
  if (d.segment !== null && path.segments[d.segment]) return evaluateSegment(path.segments[d.segment], 0.5)
  return null
}

/** One letter per diagnostic kind, drawn in its marker (colour is never the only cue). */
export const DIAGNOSTIC_LETTER: Record<Diagnostic['kind'], string> = {
  cusp: 'C',
  loop: 'L',
  'zero-length-segment': 'Z',
  'degenerate-contour': 'D',
  'straight-curve': 'S',
  'open-subpath': 'O',
  'coincident-points': 'P',
}

export function drawDiagnostics(ctx: Ctx, view: ViewState, markers: readonly { point: Point; kind: Diagnostic['kind'] }[], palette: CanvasPalette): void {
  const r = style.DIAGNOSTIC_MARKER_RADIUS
  ctx.font = 'bold 9px Roboto, sans-serif'
  ctx.textAlign = 'center'
  ctx.textBaseline = 'middle'
  for (const m of markers) {
    const x = sx(view, m.point[0]) + r + 2
    const y = sy(view, m.point[1]) - r - 2
    ctx.beginPath()
    ctx.moveTo(x, y - r)
    ctx.lineTo(x + r, y)
    ctx.lineTo(x, y + r)
    ctx.lineTo(x - r, y)
    ctx.closePath()
    ctx.fillStyle = palette.diagnostic
    ctx.fill()
    ctx.fillStyle = palette.background
    ctx.fillText(DIAGNOSTIC_LETTER[m.kind], x, y + 0.5)
  }
}

/** The screen position of a probe's direction (or end) handle. */
export function directionHandle(view: ViewState, probe: Probe): Point {
  if (probe.type === 'segment') return [sx(view, probe.to[0]), sy(view, probe.to[1])]
  const [dx, dy] = probe.direction
  const len = Math.hypot(dx, dy)
  return [sx(view, probe.origin[0]) + (dx / len) * DIRECTION_HANDLE_PX, sy(view, probe.origin[1]) + (dy / len) * DIRECTION_HANDLE_PX]
}

export function probeStart(probe: Probe): Point {
  return probe.type === 'segment' ? probe.from : probe.origin
}

export interface DrawnLine {
  readonly probe: Probe
  readonly sweep: boolean
  readonly selected: boolean
  /** Handles are drawn for probes and for the first line of a sweep. */
  readonly handles: boolean
}

export function drawProbes(ctx: Ctx, view: ViewState, lines: readonly DrawnLine[], rect: Bounds, palette: CanvasPalette): void {
  for (const line of lines) {
    const piece = clipProbeToRect(line.probe, rect)
    if (piece && line.selected) {
      // The selection is a teal halo under the coral line, so probes stay coral.
      ctx.beginPath()
      ctx.moveTo(sx(view, piece[0][0]), sy(view, piece[0][1]))
      ctx.lineTo(sx(view, piece[1][0]), sy(view, piece[1][1]))
      ctx.strokeStyle = palette.selection
      ctx.globalAlpha = 0.35
      ctx.lineWidth = style.PROBE_STROKE_WIDTH + 4
      ctx.stroke()
    }
    ctx.globalAlpha = line.sweep ? style.SWEEP_OPACITY : 1
    ctx.strokeStyle = line.sweep ? palette.sweep : palette.probe
    ctx.lineWidth = line.sweep ? style.SWEEP_STROKE_WIDTH : style.PROBE_STROKE_WIDTH
    if (piece) {
      ctx.beginPath()
      ctx.moveTo(sx(view, piece[0][0]), sy(view, piece[0][1]))
      ctx.lineTo(sx(view, piece[1][0]), sy(view, piece[1][1]))
      ctx.stroke()
    }
    ctx.globalAlpha = 1
    if (!line.handles) continue
    const { direction } = describeProbe(line.probe)
    const len = Math.hypot(direction[0], direction[1])
    const ux = direction[0] / len
    const uy = direction[1] / len
    const [ax, ay] = probeStart(line.probe)
    const a: Point = [sx(view, ax), sy(view, ay)]
    const b = directionHandle(view, line.probe)
    ctx.fillStyle = ctx.strokeStyle
    if (line.probe.type === 'segment') {
      const t = style.SEGMENT_TICK_LENGTH / 2
      ctx.beginPath()
      for (const p of [a, b]) {
        ctx.moveTo(p[0] - uy * t, p[1] + ux * t)
        ctx.lineTo(p[0] + uy * t, p[1] - ux * t)
      }
      ctx.lineWidth = style.PROBE_STROKE_WIDTH
      ctx.stroke()
    } else if (line.probe.type === 'ray') {
      const l = style.RAY_ARROW_LENGTH
      const w = style.RAY_ARROW_WIDTH / 2
      ctx.beginPath()
      ctx.moveTo(b[0] + ux * l * 0.5, b[1] + uy * l * 0.5)
      ctx.lineTo(b[0] - ux * l * 0.5 - uy * w, b[1] - uy * l * 0.5 + ux * w)
      ctx.lineTo(b[0] - ux * l * 0.5 + uy * w, b[1] - uy * l * 0.5 - ux * w)
      ctx.closePath()
      ctx.fill()
    } else {
      ctx.beginPath()
      ctx.moveTo(b[0], b[1] - 4)
      ctx.lineTo(b[0] + 4, b[1])
      ctx.lineTo(b[0], b[1] + 4)
      ctx.lineTo(b[0] - 4, b[1])
      ctx.closePath()
      ctx.fill()
    }
    ctx.beginPath()
    ctx.arc(a[0], a[1], 4, 0, 2 * Math.PI)
    ctx.fillStyle = palette.background
    ctx.fill()
    ctx.lineWidth = 1.5
    ctx.stroke()
  }
}

export interface DrawnHit {
  readonly hit: Hit
  readonly probe: Probe
  readonly selected: boolean
  readonly sweep: boolean
}

/** The screen point at parameter s of a probe. */
export function probePointAt(view: ViewState, probe: Probe, s: number): Point {
  const { origin, direction } = describeProbe(probe)
  return [sx(view, origin[0] + s * direction[0]), sy(view, origin[1] + s * direction[1])]
}

export function drawHits(ctx: Ctx, view: ViewState, hits: readonly DrawnHit[], palette: CanvasPalette): void {
  for (const { hit, probe, selected } of hits) {
    const x = sx(view, hit.point[0])
    const y = sy(view, hit.point[1])
    const { direction } = describeProbe(probe)
    const len = Math.hypot(direction[0], direction[1])
    const ux = direction[0] / len
    const uy = direction[1] / len
    if (hit.kind === 'overlap') {
      const end = probePointAt(view, probe, hit.sEnd ?? hit.s)
      ctx.beginPath()
      ctx.moveTo(x, y)
      ctx.lineTo(end[0], end[1])
      ctx.strokeStyle = palette.hitOverlap
      ctx.lineWidth = style.HIT_BAR_WIDTH
      ctx.lineCap = 'butt'
      ctx.globalAlpha = 0.8
      ctx.stroke()
      ctx.globalAlpha = 1
    } else if (hit.kind === 'tangent') {
      ctx.beginPath()
      ctx.arc(x, y, style.HIT_RING_RADIUS, 0, 2 * Math.PI)
      ctx.strokeStyle = palette.hitTangent
      ctx.lineWidth = style.HIT_RING_WIDTH
      ctx.stroke()
    } else {
      ctx.beginPath()
      ctx.arc(x, y, style.HIT_DISC_RADIUS, 0, 2 * Math.PI)
      ctx.fillStyle = palette.hitCrossing
      ctx.fill()
      if (hit.winding !== 0) {
        // The chevron points the way the path crosses: along w·(−uy, ux), the probe's left normal.
        const nx = -uy * hit.winding
        const ny = ux * hit.winding
        const cx = x + ux * style.CHEVRON_OFFSET
        const cy = y + uy * style.CHEVRON_OFFSET
        const k = style.CHEVRON_SIZE
        ctx.beginPath()
        ctx.moveTo(cx - nx * k * 0.5 - ux * k, cy - ny * k * 0.5 - uy * k)
        ctx.lineTo(cx + nx * k * 0.5, cy + ny * k * 0.5)
        ctx.lineTo(cx - nx * k * 0.5 + ux * k, cy - ny * k * 0.5 + uy * k)
        ctx.strokeStyle = palette.hitChevron
        ctx.lineWidth = style.CHEVRON_WIDTH
        ctx.stroke()
      }
    }
    if (selected) {
      ctx.beginPath()
      ctx.arc(x, y, style.HIT_RING_RADIUS + 4, 0, 2 * Math.PI)
      ctx.strokeStyle = palette.selection
      ctx.lineWidth = style.SELECTION_WIDTH
      ctx.stroke()
    }
  }
}

/** A short ruler label: up to 6 significant digits, no trailing zeros. */
export function formatRulerValue(v: number): string {
  if (v === 0) return '0'
  return String(Number(v.toPrecision(6)))
}

export const RULER_SIZE = 20

export function drawRulers(
  ctx: Ctx,
  view: ViewState,
  width: number,
  height: number,
  gridStep: number,
  shownY: (y: number) => number,
  palette: CanvasPalette,
  cursor: Point | null,
): void {
  const size = RULER_SIZE
  ctx.fillStyle = palette.background
  ctx.globalAlpha = 0.94
  ctx.fillRect(0, 0, width, size)
  ctx.fillRect(0, 0, size, height)
  ctx.globalAlpha = 1
  ctx.strokeStyle = palette.gridMajor
  ctx.lineWidth = 1
  ctx.beginPath()
  ctx.moveTo(0, size + 0.5)
  ctx.lineTo(width, size + 0.5)
  ctx.moveTo(size + 0.5, 0)
  ctx.lineTo(size + 0.5, height)
  ctx.stroke()
  // A label every major step that is at least 60 px wide (then every half or fifth of it).
  let labelStep = gridStep * style.GRID_MAJOR_EVERY
  while (labelStep * view.scale > 240) labelStep /= 2
  while (labelStep * view.scale < 60) labelStep *= 2
  ctx.fillStyle = palette.controlStroke
  ctx.strokeStyle = palette.controlStroke
  ctx.font = '10px "Roboto Mono", monospace'
  ctx.textBaseline = 'top'
  ctx.textAlign = 'left'
  ctx.beginPath()
  const x0 = -view.offsetX / view.scale
  const x1 = (width - view.offsetX) / view.scale
  for (let k = Math.ceil(x0 / labelStep); k * labelStep <= x1; k++) {
    const x = Math.round(sx(view, k * labelStep)) + 0.5
    if (x < size) continue
    ctx.moveTo(x, size - 7)
    ctx.lineTo(x, size)
    ctx.fillText(formatRulerValue(k * labelStep), x + 3, 3)
  }
  ctx.stroke()
  ctx.save()
  ctx.beginPath()
  const y0 = -view.offsetY / view.scale
  const y1 = (height - view.offsetY) / view.scale
  for (let k = Math.ceil(y0 / labelStep); k * labelStep <= y1; k++) {
    const y = Math.round(sy(view, k * labelStep)) + 0.5
    if (y < size) continue
    ctx.moveTo(size - 7, y)
    ctx.lineTo(size, y)
    ctx.save()
    ctx.translate(3, y - 3)
    ctx.rotate(-Math.PI / 2)
    ctx.fillText(formatRulerValue(shownY(k * labelStep)), 0, 0)
    ctx.restore()
  }
  ctx.stroke()
  ctx.restore()
  if (cursor) {
    ctx.strokeStyle = palette.probe
    ctx.beginPath()
    ctx.moveTo(Math.round(cursor[0]) + 0.5, 0)
    ctx.lineTo(Math.round(cursor[0]) + 0.5, size)
    ctx.moveTo(0, Math.round(cursor[1]) + 0.5)
    ctx.lineTo(size, Math.round(cursor[1]) + 0.5)
    ctx.stroke()
  }
  ctx.fillStyle = palette.background
  ctx.fillRect(0, 0, size, size)
}

