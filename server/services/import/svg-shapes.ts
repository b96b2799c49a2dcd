/**
 * SVG basic shapes → path data in the element's own user space, as SVG 1.1 §9 defines each
 * shape's equivalent path (rect §9.2 with the rx/ry rules, circle §9.3, ellipse §9.4, line
 * §9.5, polyline §9.6, polygon §9.7), and the lengths they are made of (§7.10 units).
 */
import { readNumberList } from './svg-transform'
import type { Size } from './svg-transform'

/** The elements that become paths. */
export type ShapeElement = 'path' | 'rect' | 'circle' | 'ellipse' | 'line' | 'polyline' | 'polygon'

/** The element kinds importSvg turns into paths. */
export const SHAPE_ELEMENTS: readonly ShapeElement[] = ['path', 'rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon']

/** What a shape conversion may read: the current viewport (for percentages) and a warning sink. */
export interface ShapeContext {
  /** The nearest viewport in user units, or null when no size is known (percentages cannot resolve). */
  readonly viewport: Size | null
  /** Records a warning about this element. */
  readonly warn: (message: string) => void
}

/** The result of a conversion: path data, or null when the element draws nothing (a warning says why). */
export type ShapeData = string | null

/** Pixels per unit for the absolute units of CSS and SVG 1.1 §7.10 (1in = 96px, common practice since CSS 2.1). */
const UNIT_PIXELS: Readonly<Record<string, number>> = {
  '': 1, px: 1, in: 96, cm: 96 / 2.54, mm: 96 / 25.4, pt: 96 / 72, pc: 16,
}
/** em and ex when no font size is known: the common browser default font size, 16px, and half of it. */
const FONT_RELATIVE_PIXELS: Readonly<Record<string, number>> = { em: 16, ex: 8 }

const LENGTH = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(px|in|cm|mm|pt|pc|em|ex|%)?\s*$/i

/** Which viewport dimension a percentage refers to (SVG 1.1 §7.10). */
export type LengthAxis = 'x' | 'y' | 'diagonal'

/**
 * A length attribute in user units: undefined when absent or invalid (invalid and unresolvable
 * values are warned about and then treated as absent, as SVG 2 treats invalid values).
 */
export function readLength(
  attributes: Readonly<Record<string, string>>, name: string, axis: LengthAxis, context: ShapeContext,
): number | undefined {
  const text = attributes[name]
  if (text === undefined) return undefined
  const match = LENGTH.exec(text)
  if (!match) {
    context.warn(`${name}="${text.slice(0, 40)}" is not a length; ignored`)
    return undefined
  }
  const value = Number(match[1])
  if (!Number.isFinite(value)) {
    context.warn(`${name}="${text.slice(0, 40)}" is out of range; ignored`)
    return undefined
  }
  const unit = (match[2] ?? '').toLowerCase()
  if (unit === '%') {
    const viewport = context.viewport
    if (!viewport) {
      context.warn(`${name}="${text}" is a percentage but no viewport size is known; ignored`)
      return undefined
    }
    const reference = axis === 'x' ? viewport.width : axis === 'y' ? viewport.height
      : Math.sqrt((viewport.width ** 2 + viewport.height ** 2) / 2)
    return (value / 100) * reference
  }
  if (unit in FONT_RELATIVE_PIXELS) {
    context.warn(`${name}="${text}" is font-relative; 1em taken as ${FONT_RELATIVE_PIXELS.em}px`)
    return value * FONT_RELATIVE_PIXELS[unit]
  }
  return value * UNIT_PIXELS[unit]
}

/** A size attribute that must not be negative; negative values are errors (SVG 1.1 §9) and warned. */
function readSize(attributes: Readonly<Record<string, string>>, name: string, axis: LengthAxis, context: ShapeContext): number | undefined {
  const value = readLength(attributes, name, axis, context)
  if (value !== undefined && value < 0) {
    context.warn(`${name} is negative (${attributes[name]}), which is an error`)
    return Number.NaN
  }
  return value
}

function zeroSize(context: ShapeContext, what: string): null {
  context.warn(`zero size (${what}), draws nothing`)
  return null
}

function rectData(attributes: Readonly<Record<string, string>>, context: ShapeContext): ShapeData {
  const x = readLength(attributes, 'x', 'x', context) ?? 0
  const y = readLength(attributes, 'y', 'y', context) ?? 0
  const width = readSize(attributes, 'width', 'x', context) ?? 0
  const height = readSize(attributes, 'height', 'y', context) ?? 0
  if (Number.isNaN(width) || Number.isNaN(height)) return null
  if (width === 0 || height === 0) return zeroSize(context, `width ${width}, height ${height}`)
  // SVG 1.1 §9.2: a missing (or, here, negative) rx or ry takes the other's value; each is then
  // clamped to half the width / height. A zero radius gives square corners (SVG 2, 'rect').
  let rx = readSize(attributes, 'rx', 'x', context)
  let ry = readSize(attributes, 'ry', 'y', context)
  if (Number.isNaN(rx)) rx = undefined
  if (Number.isNaN(ry)) ry = undefined
  rx ??= ry ?? 0
  ry ??= rx
  rx = Math.min(rx, width / 2)
  ry = Math.min(ry, height / 2)
  const right = x + width
  const bottom = y + height
  if (rx === 0 || ry === 0) return `M${x} ${y} H${right} V${bottom} H${x} Z`
  // The path of SVG 1.1 §9.2; straight pieces of zero length (rx = width/2) are left out.
  const arc = (endX: number, endY: number): string => `A${rx} ${ry} 0 0 1 ${endX} ${endY}`
  const parts = [`M${x + rx} ${y}`]
  if (width > 2 * rx) parts.push(`H${right - rx}`)
  parts.push(arc(right, y + ry))
  if (height > 2 * ry) parts.push(`V${bottom - ry}`)
  parts.push(arc(right - rx, bottom))
  if (width > 2 * rx) parts.push(`H${x + rx}`)
  parts.push(arc(x, bottom - ry))
  if (height > 2 * ry) parts.push(`V${y + ry}`)
  parts.push(arc(x + rx, y), 'Z')
  return parts.join(' ')
}

/** An ellipse as four quarter arcs from its rightmost point, in the positive-angle direction (SVG 2, the 'ellipse' element). */
function ellipseData(cx: number, cy: number, rx: number, ry: number): string {
  const arc = (endX: number, endY: number): string => `A${rx} ${ry} 0 0 1 ${endX} ${endY}`
  return `M${cx + rx} ${cy} ${arc(cx, cy + ry)} ${arc(cx - rx, cy)} ${arc(cx, cy - ry)} ${arc(cx + rx, cy)} Z`
}

function circleData(attributes: Readonly<Record<string, string>>, context: ShapeContext): ShapeData {
  const r = readSize(attributes, 'r', 'diagonal', context) ?? 0
  if (Number.isNaN(r)) return null
  if (r === 0) return zeroSize(context, 'r 0')
  return ellipseData(readLength(attributes, 'cx', 'x', context) ?? 0, readLength(attributes, 'cy', 'y', context) ?? 0, r, r)
}

function ellipseElementData(attributes: Readonly<Record<string, string>>, context: ShapeContext): ShapeData {
  let rx = readSize(attributes, 'rx', 'x', context)
  let ry = readSize(attributes, 'ry', 'y', context)
  if (Number.isNaN(rx) || Number.isNaN(ry)) return null
  // SVG 2, the 'ellipse' element: an absent radius ("auto") takes the other's value.
  rx ??= ry ?? 0
  ry ??= rx
  if (rx === 0 || ry === 0) return zeroSize(context, `rx ${rx}, ry ${ry}`)
  return ellipseData(readLength(attributes, 'cx', 'x', context) ?? 0, readLength(attributes, 'cy', 'y', context) ?? 0, rx, ry)
}

function lineData(attributes: Readonly<Record<string, string>>, context: ShapeContext): ShapeData {
  const [x1, y1, x2, y2] = (['x1', 'y1', 'x2', 'y2'] as const).map((name) => readLength(attributes, name, name[0] as LengthAxis, context) ?? 0)
  return `M${x1} ${y1} L${x2} ${y2}`
}

function pointsData(attributes: Readonly<Record<string, string>>, context: ShapeContext, closed: boolean): ShapeData {
  const read = readNumberList(attributes.points ?? '')
  let values = read.values
  // SVG 1.1 §9.6: render up to the first error, so the numbers before it are kept.
  if (!read.complete) context.warn(`points has an error after ${values.length} numbers; the points before it are kept`)
  if (values.length % 2 === 1) {
    context.warn('points has an odd number of coordinates; the last one is dropped')
    values = values.slice(0, -1)
  }
  if (values.length < 4) return zeroSize(context, `${values.length / 2} point${values.length === 2 ? '' : 's'}`)
  const parts = [`M${values[0]} ${values[1]}`]
  for (let i = 2; i < values.length; i += 2) parts.push(`L${values[i]} ${values[i + 1]}`)
  if (closed) parts.push('Z')
  return parts.join(' ')
}

/**
 * The equivalent path data of a shape element in its own user space (before any transform),
 * or null when it draws nothing; every problem is reported through `context.warn`.
 * @example convertShapeToPathData('rect', { width: '10', height: '5' }, context) // 'M0 0 H10 V5 H0 Z'
 */
export function convertShapeToPathData(element: ShapeElement, attributes: Readonly<Record<string, string>>, context: ShapeContext): ShapeData {
  switch (element) {
    case 'path': {
      const data = attributes.d
      if (data === undefined || data.trim() === '') return zeroSize(context, 'no path data')
      return data
    }
    case 'rect': return rectData(attributes, context)
    case 'circle': return circleData(attributes, context)
    case 'ellipse': return ellipseElementData(attributes, context)
    case 'line': return lineData(attributes, context)
    case 'polyline': return pointsData(attributes, context, false)
    case 'polygon': return pointsData(attributes, context, true)
  }
}
