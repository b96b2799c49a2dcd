/**
 * The canvas's look as named constants, shared by the Konva drawing and the SVG export so
 * that both show the same thing. Colours follow the product's visual language: an
 * off-white sheet with a faint grid, dark slate path ink, a thin grey control polygon,
 * coral probes (sweeps thinner and translucent), and the app's deep teal accent for the
 * selection. Hues come from Tailwind CSS's published default palette
 * (tailwindcss.com/docs/colors), the palette src/plugins/vuetify.ts draws from; `pathInk`,
 * `probe` and `selection` repeat that file's 'path-ink', 'probe' and 'primary' colours
 * (it cannot be imported here: it loads styles and fonts).
 */

/** Every colour the canvas draws with; CSS colour strings. */
export interface CanvasPalette {
  /** The sheet behind everything. */
  readonly background: string
  /** Grid lines at every grid step, and at every GRID_MAJOR_EVERY-th step. */
  readonly gridMinor: string
  readonly gridMajor: string
  /** Path outline, and the faint fill that shows the fill rule. */
  readonly pathInk: string
  readonly pathFill: string
  /** Lines from on-curve points to their control points. */
  readonly controlPolygon: string
  /** On-curve points are small squares, control points small circles: fill and outline. */
  readonly pointFill: string
  readonly onCurveStroke: string
  readonly controlStroke: string
  /** Rays, lines and segments; sweeps use the same hue at SWEEP_OPACITY. */
  readonly probe: string
  readonly sweep: string
  /** Hit markers: crossing disc, tangent ring, overlap bar, winding chevron. */
  readonly hitCrossing: string
  readonly hitTangent: string
  readonly hitOverlap: string
  readonly hitChevron: string
  /** Selected points, segment, probe or hit. */
  readonly selection: string
  /** Markers of path diagnostics (cusps, loops, zero-length segments …). */
  readonly diagnostic: string
}

/** The light sheet (the default theme). */
export const LIGHT_CANVAS_PALETTE: CanvasPalette = {
  background: '#FAFAF9', // stone-50: off-white, warmer than the slate app background
  gridMinor: '#EDEFF2',
  gridMajor: '#D9DEE5',
  pathInk: '#1E293B', // slate-800
  pathFill: 'rgba(30, 41, 59, 0.08)',
  controlPolygon: '#94A3B8', // slate-400
  pointFill: '#FFFFFF',
  onCurveStroke: '#1E293B',
  controlStroke: '#64748B', // slate-500
  probe: '#E0603F', // coral
  sweep: '#E0603F',
  hitCrossing: '#9A3412', // orange-800: a darker coral that stands out on the probe
  hitTangent: '#9A3412',
  hitOverlap: '#C2410C', // orange-700
  hitChevron: '#1E293B',
  selection: '#0F766E', // teal-700, the app's primary
  diagnostic: '#B45309', // amber-700, the app's warning
}

/** The dark sheet. */
export const DARK_CANVAS_PALETTE: CanvasPalette = {
  background: '#131B2B',
  gridMinor: '#1C2638',
  gridMajor: '#2A3649',
  pathInk: '#CBD5E1', // slate-300
  pathFill: 'rgba(203, 213, 225, 0.10)',
  controlPolygon: '#64748B',
  pointFill: '#131B2B',
  onCurveStroke: '#CBD5E1',
  controlStroke: '#94A3B8',
  probe: '#FB8A6E',
  sweep: '#FB8A6E',
  hitCrossing: '#FDBA74', // orange-300
  hitTangent: '#FDBA74',
  hitOverlap: '#FB923C', // orange-400
  hitChevron: '#E2E8F0',
  selection: '#2DD4BF', // teal-400, the dark theme's primary
  diagnostic: '#FBBF24', // amber-400
}

/** The palette of a theme. */
export function selectCanvasPalette(dark: boolean): CanvasPalette {
  return dark ? DARK_CANVAS_PALETTE : LIGHT_CANVAS_PALETTE
}

// Sizes in screen pixels (strokes never scale with the zoom).

/** Path outline width. */
export const PATH_STROKE_WIDTH = 1.5
/** Control polygon width. */
export const CONTROL_POLYGON_WIDTH = 1
/** Side of an on-curve point's square. */
export const ON_CURVE_SQUARE_SIZE = 7
/** Radius of a control point's circle. */
export const CONTROL_CIRCLE_RADIUS = 3.5
/** Probe line width; sweeps are thinner and translucent. */
export const PROBE_STROKE_WIDTH = 1.5
export const SWEEP_STROKE_WIDTH = 1
export const SWEEP_OPACITY = 0.55
/** A ray's arrowhead: length along the ray and width across it. */
export const RAY_ARROW_LENGTH = 10
export const RAY_ARROW_WIDTH = 7
/** Length of the tick across each end of a segment probe. */
export const SEGMENT_TICK_LENGTH = 8
/** Crossing disc radius; tangent ring radius and line width. */
export const HIT_DISC_RADIUS = 4
export const HIT_RING_RADIUS = 5
export const HIT_RING_WIDTH = 1.5
/** Width of the bar drawn along the probe over an overlap. */
export const HIT_BAR_WIDTH = 5
/** Winding chevron: distance from its crossing along the probe, half its span, line width. */
export const CHEVRON_OFFSET = 10
export const CHEVRON_SIZE = 4
export const CHEVRON_WIDTH = 1.5
/** Selection outline width. */
export const SELECTION_WIDTH = 2
/** Diagnostic marker radius. */
export const DIAGNOSTIC_MARKER_RADIUS = 6
/** Every GRID_MAJOR_EVERY-th grid line is a major one (millimetre paper: every 10th). */
export const GRID_MAJOR_EVERY = 10
/** Minor grid lines closer than this on screen are left out (only the major ones remain). */
export const GRID_MIN_SPACING_PX = 6
/** Grid line width. */
export const GRID_LINE_WIDTH = 1
