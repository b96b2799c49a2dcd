/**
 * The canvas view as a standalone SVG document: the sheet, its grid, the paths, the probes
 * clipped to the view and the hit markers, drawn as the canvas draws them (canvas-style.ts).
 * Screen x = world x·scale + offsetX, likewise y; paths keep their own data under a
 * transform matrix and non-scaling strokes, everything else is placed in screen pixels.
 */
import type { Bounds, FillRule, Hit, Point, Probe } from '../../shared/geometry'
import {
  CHEVRON_OFFSET, CHEVRON_SIZE, CHEVRON_WIDTH, GRID_LINE_WIDTH, GRID_MAJOR_EVERY, GRID_MIN_SPACING_PX, HIT_BAR_WIDTH,
  HIT_DISC_RADIUS, HIT_RING_RADIUS, HIT_RING_WIDTH, PATH_STROKE_WIDTH, PROBE_STROKE_WIDTH, RAY_ARROW_LENGTH, RAY_ARROW_WIDTH,
  SEGMENT_TICK_LENGTH, SWEEP_OPACITY, SWEEP_STROKE_WIDTH, selectCanvasPalette,
} from './canvas-style'
import type { CanvasPalette } from './canvas-style'
import { clipProbeToRect, describeProbe } from './probe-geometry'

/** Class names of the drawn elements (one class per kind of element, for styling and tests). */
export const VIEW_SVG_CLASS = {
  background: 'rc-background',
  gridMinor: 'rc-grid-minor',
  gridMajor: 'rc-grid-major',
  path: 'rc-path',
  probe: 'rc-probe',
  sweepLine: 'rc-sweep-line',
  rayArrow: 'rc-ray-arrow',
  segmentTick: 'rc-segment-tick',
  crossing: 'rc-hit-crossing',
  tangent: 'rc-hit-tangent',
  overlap: 'rc-hit-overlap',
  chevron: 'rc-hit-chevron',
} as const

export interface ViewTransform {
  readonly scale: number
  readonly offsetX: number
  readonly offsetY: number
}

export interface ViewSvgInput {
  /** Size of the view in screen pixels. */
  readonly width: number
  readonly height: number
  readonly view: ViewTransform
  readonly dark: boolean
  readonly paths: readonly { readonly data: string; readonly fillRule: FillRule }[]
  /** Probes and sweep lines (`sweep` true: drawn thinner and translucent). */
  readonly lines: readonly { readonly probe: Probe; readonly sweep: boolean }[]
  /** Hits with the direction of the probe they lie on (for a segment probe, to − from). */
  readonly hits: readonly { readonly hit: Hit; readonly direction: Point }[]
  /** Grid step in path units; null or absent for no grid. */
  readonly grid?: number | null
}

/** Text safe inside an XML attribute value or element. */
export function escapeXml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c] as string)
}

/** A screen coordinate to 1/1000 px (plenty for a drawing; keeps the document small). */
function formatPixel(value: number): string {
  const rounded = Math.round(value * 1000) / 1000
  return String(rounded === 0 ? 0 : rounded)
}

type AttributeValue = string | number

function element(name: string, attributes: Record<string, AttributeValue>): string {
  const text = Object.entries(attributes)
    .map(([key, value]) => ` ${key}="${escapeXml(typeof value === 'number' ? formatPixel(value) : value)}"`)
    .join('')
  return `<${name}${text}/>`
}

function toScreen(view: ViewTransform, point: Point): Point {
  return [point[0] * view.scale + view.offsetX, point[1] * view.scale + view.offsetY]
}

function toScreenProbe(view: ViewTransform, probe: Probe): Probe {
  if (probe.type === 'segment') return { type: 'segment', from: toScreen(view, probe.from), to: toScreen(view, probe.to) }
  return { type: probe.type, origin: toScreen(view, probe.origin), direction: [probe.direction[0] * view.scale, probe.direction[1] * view.scale] }
}

/** Unit vector of a direction; null for a zero one. */
function unitOf(direction: Point): Point | null {
  const length = Math.hypot(direction[0], direction[1])
  return length === 0 || !Number.isFinite(length) ? null : [direction[0] / length, direction[1] / length]
}

function polylinePoints(points: readonly Point[]): string {
  return points.map(([x, y]) => `${formatPixel(x)},${formatPixel(y)}`).join(' ')
}

function isInside(point: Point, rect: Bounds): boolean {
  return point[0] >= rect[0] && point[0] <= rect[2] && point[1] >= rect[1] && point[1] <= rect[3]
}

function drawGrid(input: ViewSvgInput, palette: CanvasPalette): string[] {
  const step = input.grid
  if (step === null || step === undefined) return []
  if (!(step > 0) || !Number.isFinite(step)) throw new RangeError(`grid step must be a positive number, got ${step}`)
  const { scale, offsetX, offsetY } = input.view
  const spacing = step * scale
  if (spacing * GRID_MAJOR_EVERY < GRID_MIN_SPACING_PX) return []
  const withMinor = spacing >= GRID_MIN_SPACING_PX
  const minor: string[] = [], major: string[] = []
  // Grid line k lies at world k·step; the spacing bound keeps the count below size / 6 px.
  const addLines = (offset: number, extent: number, across: number, vertical: boolean): void => {
    const first = Math.ceil(-offset / spacing), last = Math.floor((extent - offset) / spacing)
    for (let k = first; k <= last; k++) {
      const isMajor = k % GRID_MAJOR_EVERY === 0
      if (!isMajor && !withMinor) continue
      const at = formatPixel(k * spacing + offset)
      ;(isMajor ? major : minor).push(vertical ? `M${at} 0V${formatPixel(across)}` : `M0 ${at}H${formatPixel(across)}`)
    }
  }
  addLines(offsetX, input.width, input.height, true)
  addLines(offsetY, input.height, input.width, false)
  const gridPath = (className: string, d: string[], colour: string): string[] =>
    d.length === 0 ? [] : [element('path', { class: className, d: d.join(''), fill: 'none', stroke: colour, 'stroke-width': GRID_LINE_WIDTH })]
  return [...gridPath(VIEW_SVG_CLASS.gridMinor, minor, palette.gridMinor), ...gridPath(VIEW_SVG_CLASS.gridMajor, major, palette.gridMajor)]
}

function drawLine(from: Point, to: Point, attributes: Record<string, AttributeValue>): string {
  return element('line', { ...attributes, x1: from[0], y1: from[1], x2: to[0], y2: to[1] })
}

function drawProbe(view: ViewTransform, rect: Bounds, probe: Probe, sweep: boolean, palette: CanvasPalette): string[] {
  const screen = toScreenProbe(view, probe)
  const piece = clipProbeToRect(screen, rect)
  if (piece === null) return []
  const stroke: Record<string, AttributeValue> = sweep
    ? { stroke: palette.sweep, 'stroke-width': SWEEP_STROKE_WIDTH, 'stroke-opacity': SWEEP_OPACITY }
    : { stroke: palette.probe, 'stroke-width': PROBE_STROKE_WIDTH }
  const drawn = [drawLine(piece[0], piece[1], { class: sweep ? VIEW_SVG_CLASS.sweepLine : VIEW_SVG_CLASS.probe, ...stroke })]
  const unit = unitOf(describeProbe(screen).direction)
  if (unit === null || sweep) return drawn
  const normal: Point = [-unit[1], unit[0]]
  if (screen.type === 'ray') {
    const tip = piece[1]
    const base: Point = [tip[0] - unit[0] * RAY_ARROW_LENGTH, tip[1] - unit[1] * RAY_ARROW_LENGTH]
    const half = RAY_ARROW_WIDTH / 2
    const corners: Point[] = [tip, [base[0] + normal[0] * half, base[1] + normal[1] * half], [base[0] - normal[0] * half, base[1] - normal[1] * half]]
    drawn.push(element('polygon', { class: VIEW_SVG_CLASS.rayArrow, points: polylinePoints(corners), fill: palette.probe }))
  } else if (screen.type === 'segment') {
    const half = SEGMENT_TICK_LENGTH / 2
    for (const end of [screen.from, screen.to]) {
      if (!isInside(end, rect)) continue
      const a: Point = [end[0] + normal[0] * half, end[1] + normal[1] * half]
      const b: Point = [end[0] - normal[0] * half, end[1] - normal[1] * half]
      drawn.push(drawLine(a, b, { class: VIEW_SVG_CLASS.segmentTick, ...stroke }))
    }
  }
  return drawn
}

function drawHit(view: ViewTransform, rect: Bounds, hit: Hit, direction: Point, palette: CanvasPalette): string[] {
  const at = toScreen(view, hit.point)
  const unit = unitOf(direction)
  if (hit.kind === 'overlap') {
    const length = (hit.sEnd ?? hit.s) - hit.s
    const end = toScreen(view, [hit.point[0] + length * direction[0], hit.point[1] + length * direction[1]])
    const piece = clipProbeToRect({ type: 'segment', from: at, to: end }, rect)
    if (piece === null) return []
    return [drawLine(piece[0], piece[1], { class: VIEW_SVG_CLASS.overlap, stroke: palette.hitOverlap, 'stroke-width': HIT_BAR_WIDTH, 'stroke-linecap': 'butt' })]
  }
  if (!isInside(at, rect)) return []
  if (hit.kind === 'tangent') {
    return [element('circle', { class: VIEW_SVG_CLASS.tangent, cx: at[0], cy: at[1], r: HIT_RING_RADIUS, fill: 'none', stroke: palette.hitTangent, 'stroke-width': HIT_RING_WIDTH })]
  }
  const drawn = [element('circle', { class: VIEW_SVG_CLASS.crossing, cx: at[0], cy: at[1], r: HIT_DISC_RADIUS, fill: palette.hitCrossing })]
  if (unit === null || hit.winding === 0) return drawn
  // winding = sign(direction × tangent): the path crosses towards (−dy, dx) for +1. The
  // view's transform is a positive uniform scale, so that holds on screen too.
  const across: Point = [-unit[1] * hit.winding, unit[0] * hit.winding]
  const centre: Point = [at[0] + unit[0] * CHEVRON_OFFSET, at[1] + unit[1] * CHEVRON_OFFSET]
  const half = CHEVRON_SIZE / 2
  const tip: Point = [centre[0] + across[0] * half, centre[1] + across[1] * half]
  const back: Point = [centre[0] - across[0] * half, centre[1] - across[1] * half]
  const arms: Point[] = [
    [back[0] + unit[0] * CHEVRON_SIZE, back[1] + unit[1] * CHEVRON_SIZE],
    tip,
    [back[0] - unit[0] * CHEVRON_SIZE, back[1] - unit[1] * CHEVRON_SIZE],
  ]
  drawn.push(element('polyline', {
    class: VIEW_SVG_CLASS.chevron, points: polylinePoints(arms), fill: 'none', stroke: palette.hitChevron,
    'stroke-width': CHEVRON_WIDTH, 'stroke-linecap': 'round', 'stroke-linejoin': 'round',
  }))
  return drawn
}

/**
 * A standalone SVG document of the view, width × height pixels: the sheet's background; the
 * grid when `grid` is a step (every GRID_MAJOR_EVERY-th line major, minor lines left out
 * when closer than GRID_MIN_SPACING_PX, no grid when even the major ones would be); each
 * path with its own data under transform matrix(scale, 0, 0, scale, offsetX, offsetY) and
 * non-scaling strokes; each probe clipped to the view (rays with an arrowhead where they
 * leave it, segments with a tick across each end inside it, sweep lines thinner and
 * translucent); and hit markers inside the view (crossing: filled disc with a chevron
 * beside it, CHEVRON_OFFSET along the probe, pointing the way the path crosses — its
 * winding sign; tangent: open ring; overlap: thick bar along the probe, clipped). Every
 * attribute value is escaped. RangeError for a non-positive or non-finite size, scale or grid
 * step, or non-finite offsets.
 */
export function buildViewSvg(input: ViewSvgInput): string {
  const { width, height, view } = input
  for (const [name, value] of [['width', width], ['height', height], ['scale', view.scale]] as const) {
    if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be a positive finite number, got ${value}`)
  }
  if (!Number.isFinite(view.offsetX) || !Number.isFinite(view.offsetY)) throw new RangeError('view offsets must be finite numbers')
  const palette = selectCanvasPalette(input.dark)
  const rect: Bounds = [0, 0, width, height]
  const transform = `matrix(${view.scale},0,0,${view.scale},${view.offsetX},${view.offsetY})`
  const body = [
    element('rect', { class: VIEW_SVG_CLASS.background, x: 0, y: 0, width, height, fill: palette.background }),
    ...drawGrid(input, palette),
    ...input.paths.map(({ data, fillRule }) => element('path', {
      class: VIEW_SVG_CLASS.path, d: data, 'fill-rule': fillRule, transform, fill: palette.pathFill,
      stroke: palette.pathInk, 'stroke-width': PATH_STROKE_WIDTH, 'vector-effect': 'non-scaling-stroke',
    })),
    ...input.lines.flatMap(({ probe, sweep }) => drawProbe(view, rect, probe, sweep, palette)),
    ...input.hits.flatMap(({ hit, direction }) => drawHit(view, rect, hit, direction, palette)),
  ]
  const size = `width="${formatPixel(width)}" height="${formatPixel(height)}" viewBox="0 0 ${formatPixel(width)} ${formatPixel(height)}"`
  return `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" ${size}>\n${body.join('\n')}\n</svg>\n`
}
