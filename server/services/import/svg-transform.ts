/**
 * SVG coordinate systems: transform lists (SVG 1.1 §7.6), matrix composition (§7.4) and the
 * viewBox / preserveAspectRatio mapping of a viewport (§7.7, §7.8).
 */

/** An affine map [a, b, c, d, e, f]: (x, y) → (a·x + c·y + e, b·x + d·y + f), SVG 1.1 §7.4. */
export type Matrix = readonly [number, number, number, number, number, number]

/** The identity map. */
export const IDENTITY: Matrix = [1, 0, 0, 1, 0, 0]

/** A viewport or viewBox size in user units. */
export interface Size {
  readonly width: number
  readonly height: number
}

/** A parsed viewBox attribute: min-x, min-y, width, height (SVG 1.1 §7.7). */
export type ViewBox = readonly [number, number, number, number]

/** preserveAspectRatio (SVG 1.1 §7.8): alignment of the viewBox in the viewport, or 'none'. */
export interface AspectRatio {
  readonly x: 'min' | 'mid' | 'max' | 'none'
  readonly y: 'min' | 'mid' | 'max' | 'none'
  readonly slice: boolean
}

/** The default preserveAspectRatio, xMidYMid meet (SVG 1.1 §7.8). */
export const DEFAULT_ASPECT_RATIO: AspectRatio = { x: 'mid', y: 'mid', slice: false }

/** The number grammar of SVG 1.1 §4.2 basic data types (and of path data, §8.3.9). */
export const NUMBER_PATTERN = '[+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?'
const NUMBER = new RegExp(NUMBER_PATTERN, 'y')
const SEPARATOR = /\s*(,?)\s*/y

/**
 * Numbers separated by commas and/or white space, read greedily as SVG 1.1 §8.3.9 says
 * ("1.5.5-2" is 1.5, .5, −2): the numbers read and whether the whole text followed the
 * grammar (when not, `values` holds the numbers before the first error). Linear time.
 */
export function readNumberList(text: string): { readonly values: number[]; readonly complete: boolean } {
  const values: number[] = []
  SEPARATOR.lastIndex = 0
  if (SEPARATOR.exec(text)?.[1]) return { values, complete: false }
  let at = SEPARATOR.lastIndex
  while (at < text.length) {
    NUMBER.lastIndex = at
    const number = NUMBER.exec(text)
    if (!number) return { values, complete: false }
    values.push(Number(number[0]))
    const end = NUMBER.lastIndex
    SEPARATOR.lastIndex = end
    const comma = SEPARATOR.exec(text)![1]
    const next = SEPARATOR.lastIndex
    if (next === text.length) return { values, complete: !comma }
    if (next === end && !'+-.'.includes(text[next])) return { values, complete: false }
    at = next
  }
  return { values, complete: true }
}

/** Numbers separated by commas and/or white space (see readNumberList); null when the text breaks the grammar. */
export function parseNumberList(text: string): number[] | null {
  const { values, complete } = readNumberList(text)
  return complete ? values : null
}

/** outer ∘ inner: the map that applies `inner` first, then `outer` (SVG 1.1 §7.4 matrix product). */
export function multiplyMatrices(outer: Matrix, inner: Matrix): Matrix {
  const [a, b, c, d, e, f] = outer
  const [p, q, r, s, t, u] = inner
  return [a * p + c * q, b * p + d * q, a * r + c * s, b * r + d * s, a * t + c * u + e, b * t + d * u + f]
}

/** Determinant a·d − b·c; 0 means the map collapses the plane onto a line or a point. */
export function computeDeterminant(matrix: Matrix): number {
  return matrix[0] * matrix[3] - matrix[1] * matrix[2]
}

/** cos and sin of an angle in degrees, exact (0, ±1) for multiples of 90°. */
function cosSinDegrees(angle: number): readonly [number, number] {
  if (Number.isInteger(angle / 90)) {
    const quarter = (((angle / 90) % 4) + 4) % 4
    return ([[1, 0], [0, 1], [-1, 0], [0, -1]] as const)[quarter]
  }
  const radians = (angle * Math.PI) / 180
  return [Math.cos(radians), Math.sin(radians)]
}

/** tan of an angle in degrees, exact for multiples of 45°; Infinity at ±90° (not a valid skew). */
function tanDegrees(angle: number): number {
  if (Number.isInteger(angle / 45)) return [0, 1, Infinity, -1][(((angle / 45) % 4) + 4) % 4]
  return Math.tan((angle * Math.PI) / 180)
}

const TRANSFORM = /\s*(matrix|translate|scale|rotate|skewX|skewY)\s*\(([^()]*)\)\s*(?:,\s*)?/y
const ARITY: Readonly<Record<string, readonly number[]>> = {
  matrix: [6], translate: [1, 2], scale: [1, 2], rotate: [1, 3], skewX: [1], skewY: [1],
}

function transformMatrix(name: string, values: readonly number[]): Matrix {
  switch (name) {
    case 'matrix':
      return values as unknown as Matrix
    case 'translate':
      return [1, 0, 0, 1, values[0], values[1] ?? 0]
    case 'scale':
      return [values[0], 0, 0, values[1] ?? values[0], 0, 0]
    case 'rotate': {
      const [cos, sin] = cosSinDegrees(values[0])
      const rotation: Matrix = [cos, sin, -sin, cos, 0, 0]
      if (values.length === 1) return rotation
      const [cx, cy] = [values[1], values[2]]
      // rotate(a, cx, cy) = translate(cx, cy) rotate(a) translate(−cx, −cy) (SVG 1.1 §7.6).
      return multiplyMatrices(multiplyMatrices([1, 0, 0, 1, cx, cy], rotation), [1, 0, 0, 1, -cx, -cy])
    }
    case 'skewX':
      return [1, 0, tanDegrees(values[0]), 1, 0, 0]
    default:
      return [1, tanDegrees(values[0]), 0, 1, 0, 0]
  }
}

/**
 * A transform attribute (SVG 1.1 §7.6) as one matrix, the list applied right to left
 * ("translate(10) scale(2)" scales first). Empty text is the identity; text that breaks the
 * grammar, has the wrong number of arguments or gives a non-finite matrix (skewX(90)) → null.
 */
export function parseTransformList(text: string): Matrix | null {
  let matrix = IDENTITY
  TRANSFORM.lastIndex = 0
  let at = 0
  while (at < text.length) {
    if (text.slice(at).trim() === '') break
    TRANSFORM.lastIndex = at
    const match = TRANSFORM.exec(text)
    if (!match) return null
    const values = parseNumberList(match[2])
    if (!values || !ARITY[match[1]].includes(values.length)) return null
    matrix = multiplyMatrices(matrix, transformMatrix(match[1], values))
    at = TRANSFORM.lastIndex
  }
  return matrix.every(Number.isFinite) ? matrix : null
}

/** A viewBox attribute; null when absent or malformed, 'empty' when its width or height is 0 or less. */
export function parseViewBox(text: string | undefined): ViewBox | 'empty' | null {
  if (text === undefined) return null
  const values = parseNumberList(text)
  if (!values || values.length !== 4 || !values.every(Number.isFinite)) return null
  return values[2] > 0 && values[3] > 0 ? [values[0], values[1], values[2], values[3]] : 'empty'
}

const ALIGN = /^(?:defer\s+)?(?:(none)|x(Min|Mid|Max)Y(Min|Mid|Max))(?:\s+(meet|slice))?$/

/** preserveAspectRatio text (SVG 1.1 §7.8); the default when absent, null when malformed. */
export function parseAspectRatio(text: string | undefined): AspectRatio | null {
  if (text === undefined) return DEFAULT_ASPECT_RATIO
  const match = ALIGN.exec(text.trim())
  if (!match) return null
  const slice = match[4] === 'slice'
  if (match[1]) return { x: 'none', y: 'none', slice }
  return { x: match[2].toLowerCase() as AspectRatio['x'], y: match[3].toLowerCase() as AspectRatio['y'], slice }
}

function alignOffset(align: AspectRatio['x'], free: number): number {
  return align === 'mid' ? free / 2 : align === 'max' ? free : 0
}

/**
 * The map from viewBox user units to a viewport at (x, y) of the given size, per the
 * algorithm of SVG 1.1 §7.8: scale by viewport/viewBox per axis ('none'), or uniformly by
 * the smaller (meet) or larger (slice) ratio, then align the scaled viewBox inside the viewport.
 * @example computeViewBoxMatrix([0, 0, 10, 20], 0, 0, { width: 100, height: 100 }, DEFAULT_ASPECT_RATIO)
 *   // scale 5, centred: [5, 0, 0, 5, 25, 0]
 */
export function computeViewBoxMatrix(viewBox: ViewBox, x: number, y: number, viewport: Size, aspect: AspectRatio): Matrix {
  const [minX, minY, width, height] = viewBox
  let scaleX = viewport.width / width
  let scaleY = viewport.height / height
  if (aspect.x !== 'none') {
    scaleX = scaleY = aspect.slice ? Math.max(scaleX, scaleY) : Math.min(scaleX, scaleY)
  }
  const translateX = x - minX * scaleX + alignOffset(aspect.x, viewport.width - width * scaleX)
  const translateY = y - minY * scaleY + alignOffset(aspect.y, viewport.height - height * scaleY)
  return [scaleX, 0, 0, scaleY, translateX, translateY]
}
