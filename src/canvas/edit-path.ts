/**
 * Pure functions on the canvas's editable path (types.ts): parse and write SVG path data,
 * list, find, move, set and delete points, change a segment's kind, draw with the pen, and
 * map the segments the geometry core sees back to the ones the canvas edits.
 *
 * Every function returns new objects and shares what it did not change; when nothing
 * changes it returns its argument itself, so `result === path` means "no edit". Points are
 * compared exactly (===, so −0 equals 0), never within a tolerance: two points are one
 * vertex only when the data says so. A reference to a contour, segment or point the path
 * does not have is a malformed call and throws RangeError.
 */
import svgpath from 'svgpath'
import { parsePathData } from '../../shared/geometry'
import type { EditContour, EditPath, EditSegment, EditSegmentKind, Point, PointRef, PointRole, SegmentRef } from './types'

export type ParseEditPathResult = { ok: true; path: EditPath } | { ok: false; message: string }

/** One point of a path as listPoints gives it. */
export interface ListedPoint {
  readonly ref: PointRef
  readonly point: Point
  readonly onCurve: boolean
}

export interface SnapOptions {
  /** Grid spacing in path units, > 0; null: no grid. */
  readonly gridStep: number | null
  /** Points to snap to (other vertices, hits, …), preferred over the grid. */
  readonly targets: readonly Point[]
  /** How far a target may be, in path units. */
  readonly radius: number
}

export interface SnapResult {
  readonly point: Point
  readonly snappedTo: 'point' | 'grid' | null
}

const EMPTY_PATH: EditPath = { contours: [] }

/** The path with no contour, as a new sheet starts. */
export function createEmptyPath(): EditPath {
  return EMPTY_PATH
}

function samePoint(a: Point, b: Point): boolean {
  return a[0] === b[0] && a[1] === b[1]
}

/** −0 becomes 0, so a parsed path deep-equals the parse of its own serialisation. */
function toPoint(x: number, y: number): Point {
  return [x + 0, y + 0]
}

// ---------------------------------------------------------------------------------------
// Parse and serialise

/**
 * Parses SVG path data into an EditPath. The data is validated by the core's parser first
 * (parsePathData), so a refusal carries its sentence. Relative commands become absolute,
 * S and T are expanded (svgpath's unshort), H and V become lines, A stays an arc with its
 * own parameters; Z sets `closed`. A drawing command after Z without M starts a new
 * contour at the closed one's start (SVG rule). A contour without drawing segments (an M
 * followed by nothing, or only by Z) draws nothing and is dropped. Zero-length segments
 * are kept: they are the user's points (the core drops them, see mapNormalisedSegments).
 */
export function parseEditPath(data: string): ParseEditPathResult {
  const checked = parsePathData(data)
  if (!checked.ok) return { ok: false, message: checked.error.message }
  const contours: EditContour[] = []
  let start: Point = [0, 0]
  let segments: EditSegment[] | null = null
  let x = 0
  let y = 0
  const finish = (closed: boolean): void => {
    if (segments !== null && segments.length > 0) contours.push({ start, segments, closed })
    segments = null
  }
  const commands: (readonly [string, ...number[]])[] = []
  svgpath(data).abs().unshort().iterate((command) => { commands.push(command) })
  for (const [letter, ...v] of commands) {
    if (letter === 'M') {
      finish(false)
      start = toPoint(v[0], v[1])
      x = start[0]
      y = start[1]
      segments = []
      continue
    }
    if (letter === 'Z' || letter === 'z') {
      finish(true)
      x = start[0]
      y = start[1]
      continue
    }
    let segment: EditSegment
    switch (letter) {
      case 'L': segment = { kind: 'line', to: toPoint(v[0], v[1]) }; break
      case 'H': segment = { kind: 'line', to: toPoint(v[0], y) }; break
      case 'V': segment = { kind: 'line', to: toPoint(x, v[0]) }; break
      case 'Q': segment = { kind: 'quadratic', c1: toPoint(v[0], v[1]), to: toPoint(v[2], v[3]) }; break
      case 'C': segment = { kind: 'cubic', c1: toPoint(v[0], v[1]), c2: toPoint(v[2], v[3]), to: toPoint(v[4], v[5]) }; break
      case 'A':
        segment = { kind: 'arc', rx: v[0] + 0, ry: v[1] + 0, rotation: v[2] + 0, largeArc: v[3] !== 0, sweep: v[4] !== 0, to: toPoint(v[5], v[6]) }
        break
      default:
        return { ok: false, message: `Path data has an unknown command ${letter}.` }
    }
    // After Z without M, `start` is still the closed contour's start: the new contour begins there.
    if (segments === null) segments = []
    segments.push(segment)
    x = segment.to[0]
    y = segment.to[1]
  }
  finish(false)
  return { ok: true, path: { contours } }
}

function formatPoint(p: Point): string {
  // String() gives the shortest decimal that reads back to the same double, and '0' for −0.
  return `${String(p[0])} ${String(p[1])}`
}

function formatSegment(segment: EditSegment): string {
  switch (segment.kind) {
    case 'line': return `L ${formatPoint(segment.to)}`
    case 'quadratic': return `Q ${formatPoint(segment.c1)} ${formatPoint(segment.to)}`
    case 'cubic': return `C ${formatPoint(segment.c1)} ${formatPoint(segment.c2)} ${formatPoint(segment.to)}`
    case 'arc':
      return `A ${String(segment.rx)} ${String(segment.ry)} ${String(segment.rotation)} ${segment.largeArc ? 1 : 0} ${segment.sweep ? 1 : 0} ${formatPoint(segment.to)}`
  }
}

/**
 * Writes absolute path data `M x y L … Q … C … A rx ry rot large sweep x y Z`, each contour
 * with its own M, numbers in their shortest round-trip form. Contours without segments (a
 * pen contour just started) draw nothing and are left out, so parseEditPath(serializeEditPath(p))
 * deep-equals p whenever every contour has a segment; parsePathData of the result gives the
 * same normalised segments as the data p was parsed from.
 */
export function serializeEditPath(path: EditPath): string {
  const parts: string[] = []
  for (const contour of path.contours) {
    if (contour.segments.length === 0) continue
    parts.push(`M ${formatPoint(contour.start)}`)
    for (const segment of contour.segments) parts.push(formatSegment(segment))
    if (contour.closed) parts.push('Z')
  }
  return parts.join(' ')
}

// ---------------------------------------------------------------------------------------
// Points

function requireContour(path: EditPath, contour: number): EditContour {
  const found = Number.isInteger(contour) ? path.contours[contour] : undefined
  if (found === undefined) throw new RangeError(`the path has no contour ${contour} (it has ${path.contours.length})`)
  return found
}

function requireSegment(path: EditPath, contour: number, segment: number): EditSegment {
  const found = Number.isInteger(segment) ? requireContour(path, contour).segments[segment] : undefined
  if (found === undefined) throw new RangeError(`contour ${contour} has no segment ${segment}`)
  return found
}

function controlOf(segment: EditSegment, role: 'c1' | 'c2'): Point | undefined {
  if (role === 'c1') return segment.kind === 'quadratic' || segment.kind === 'cubic' ? segment.c1 : undefined
  return segment.kind === 'cubic' ? segment.c2 : undefined
}

/** Every point of the path in drawing order: each contour's start, then per segment c1, c2 (when it has them) and its end. */
export function listPoints(path: EditPath): ListedPoint[] {
  const points: ListedPoint[] = []
  path.contours.forEach((contour, c) => {
    points.push({ ref: { contour: c, segment: -1, role: 'start' }, point: contour.start, onCurve: true })
    contour.segments.forEach((segment, s) => {
      for (const role of ['c1', 'c2'] as const) {
        const control = controlOf(segment, role)
        if (control !== undefined) points.push({ ref: { contour: c, segment: s, role }, point: control, onCurve: false })
      }
      points.push({ ref: { contour: c, segment: s, role: 'to' }, point: segment.to, onCurve: true })
    })
  })
  return points
}

/** The point a reference names; RangeError when the path has no such point. */
export function getPoint(path: EditPath, ref: PointRef): Point {
  if (ref.role === 'start') {
    if (ref.segment !== -1) throw new RangeError(`a start point has segment -1, got ${ref.segment}`)
    return requireContour(path, ref.contour).start
  }
  const segment = requireSegment(path, ref.contour, ref.segment)
  const point = ref.role === 'to' ? segment.to : controlOf(segment, ref.role)
  if (point === undefined) throw new RangeError(`segment ${ref.segment} of contour ${ref.contour} (${segment.kind}) has no ${ref.role}`)
  return point
}

/** Whether the path has the point a reference names. */
export function hasPoint(path: EditPath, ref: PointRef): boolean {
  try {
    getPoint(path, ref)
    return true
  } catch {
    return false
  }
}

/** Where a segment starts: the contour's start for segment 0, else the previous segment's end. */
export function segmentStart(path: EditPath, contour: number, segment: number): Point {
  requireSegment(path, contour, segment)
  const found = path.contours[contour]
  return segment === 0 ? found.start : found.segments[segment - 1].to
}

/** Whether the path has the segment a reference names. */
export function hasSegment(path: EditPath, ref: SegmentRef): boolean {
  const contour = Number.isInteger(ref.contour) ? path.contours[ref.contour] : undefined
  return contour !== undefined && Number.isInteger(ref.segment) && contour.segments[ref.segment] !== undefined
}

/** A closed contour whose last segment ends exactly at its start: that start and that end are one vertex. */
function isLinked(contour: EditContour): boolean {
  const n = contour.segments.length
  return contour.closed && n > 0 && samePoint(contour.segments[n - 1].to, contour.start)
}

/** Key of a point inside its contour; vertex −1 is the start, vertex i the end of segment i. */
const keyOf = (segment: number, role: PointRole): string => `${segment}:${role}`
const vertexKey = (vertex: number): string => (vertex === -1 ? keyOf(-1, 'start') : keyOf(vertex, 'to'))

/** The points each contour moves when `refs` move: the listed ones, linked vertices and the controls they carry. */
function collectMoved(path: EditPath, refs: readonly PointRef[]): Map<number, Set<string>> {
  const vertices = new Map<number, Set<number>>()
  const moved = new Map<number, Set<string>>()
  const setIn = <T>(map: Map<number, Set<T>>, contour: number): Set<T> => {
    let set = map.get(contour)
    if (set === undefined) map.set(contour, (set = new Set<T>()))
    return set
  }
  for (const ref of refs) {
    getPoint(path, ref)
    if (ref.role === 'c1' || ref.role === 'c2') setIn(moved, ref.contour).add(keyOf(ref.segment, ref.role))
    else setIn(vertices, ref.contour).add(ref.role === 'start' ? -1 : ref.segment)
  }
  for (const [c, set] of vertices) {
    const contour = path.contours[c]
    const n = contour.segments.length
    if (isLinked(contour) && (set.has(-1) || set.has(n - 1))) {
      set.add(-1)
      set.add(n - 1)
    }
    const keys = setIn(moved, c)
    for (const vertex of set) {
      keys.add(vertexKey(vertex))
      const ending = contour.segments[vertex]
      if (ending?.kind === 'cubic') keys.add(keyOf(vertex, 'c2'))
      const starting = contour.segments[vertex + 1]
      if (starting?.kind === 'cubic') keys.add(keyOf(vertex + 1, 'c1'))
      // A quadratic's one control belongs to both its ends: it travels when both do.
      if (starting?.kind === 'quadratic' && set.has(vertex + 1)) keys.add(keyOf(vertex + 1, 'c1'))
    }
  }
  return moved
}

/** The contour with the keyed points replaced by place(point, key); unchanged segments are shared. */
function replacePoints(contour: EditContour, keys: ReadonlySet<string>, place: (point: Point, key: string) => Point): EditContour {
  const at = (point: Point, segment: number, role: PointRole): Point => {
    const key = keyOf(segment, role)
    return keys.has(key) ? place(point, key) : point
  }
  let segmentsChanged = false
  const start = at(contour.start, -1, 'start')
  const mapped = contour.segments.map((segment, s) => {
    const to = at(segment.to, s, 'to')
    let next: EditSegment
    if (segment.kind === 'quadratic') {
      const c1 = at(segment.c1, s, 'c1')
      next = c1 === segment.c1 && to === segment.to ? segment : { ...segment, c1, to }
    } else if (segment.kind === 'cubic') {
      const c1 = at(segment.c1, s, 'c1')
      const c2 = at(segment.c2, s, 'c2')
      next = c1 === segment.c1 && c2 === segment.c2 && to === segment.to ? segment : { ...segment, c1, c2, to }
    } else {
      next = to === segment.to ? segment : { ...segment, to }
    }
    if (next !== segment) segmentsChanged = true
    return next
  })
  if (!segmentsChanged && start === contour.start) return contour
  return { start, segments: segmentsChanged ? mapped : contour.segments, closed: contour.closed }
}

function replaceContours(path: EditPath, change: (contour: EditContour, index: number) => EditContour | null): EditPath {
  let changed = false
  const contours: EditContour[] = []
  path.contours.forEach((contour, c) => {
    const next = change(contour, c)
    if (next !== contour) changed = true
    if (next !== null) contours.push(next)
  })
  return changed ? { contours } : path
}

function shiftPoints(path: EditPath, refs: readonly PointRef[], dx: number, dy: number, exact: Map<number, Map<string, Point>>): EditPath {
  if (!Number.isFinite(dx) || !Number.isFinite(dy)) throw new RangeError(`a move needs finite dx and dy, got ${dx}, ${dy}`)
  const moved = collectMoved(path, refs)
  if (dx === 0 && dy === 0) return path
  return replaceContours(path, (contour, c) => {
    const keys = moved.get(c)
    if (keys === undefined || keys.size === 0) return contour
    const pinned = exact.get(c)
    return replacePoints(contour, keys, (point, key) => pinned?.get(key) ?? toPoint(point[0] + dx, point[1] + dy))
  })
}

/**
 * Moves points by (dx, dy). An on-curve point carries the controls attached to it (c2 of a
 * cubic ending there, c1 of a cubic starting there); a quadratic's single control is shared
 * by its two ends, so it moves when both ends move (or when it is listed itself). On a
 * closed contour whose last segment ends exactly at the start, start and that end are one
 * vertex and move together. A point listed (or carried) twice moves once.
 */
export function movePoints(path: EditPath, refs: readonly PointRef[], dx: number, dy: number): EditPath {
  return shiftPoints(path, refs, dx, dy, new Map())
}

/**
 * Puts one point at `point` exactly, carrying what movePoints would carry by the same
 * difference (a linked vertex's other half lands exactly on `point` too).
 */
export function setPoint(path: EditPath, ref: PointRef, point: Point): EditPath {
  const current = getPoint(path, ref)
  const contour = path.contours[ref.contour]
  const pinned = new Map<string, Point>([[keyOf(ref.segment, ref.role), point]])
  const last = contour.segments.length - 1
  if (isLinked(contour) && (ref.role === 'start' || (ref.role === 'to' && ref.segment === last))) {
    pinned.set(vertexKey(-1), point)
    pinned.set(vertexKey(last), point)
  }
  return shiftPoints(path, [ref], point[0] - current[0], point[1] - current[1], new Map([[ref.contour, pinned]]))
}

/** A segment without one or both of its controls: cubic → quadratic with the other one, quadratic → line. */
function dropControls(segment: EditSegment, roles: ReadonlySet<'c1' | 'c2'>): EditSegment {
  if (segment.kind === 'quadratic') return roles.has('c1') ? { kind: 'line', to: segment.to } : segment
  if (segment.kind !== 'cubic') return segment
  if (roles.has('c1') && roles.has('c2')) return { kind: 'line', to: segment.to }
  if (roles.has('c1')) return { kind: 'quadratic', c1: segment.c2, to: segment.to }
  if (roles.has('c2')) return { kind: 'quadratic', c1: segment.c1, to: segment.to }
  return segment
}

function deleteFromContour(contour: EditContour, vertices: Set<number>, controls: Map<number, Set<'c1' | 'c2'>>): EditContour | null {
  const n = contour.segments.length
  if (isLinked(contour) && (vertices.has(-1) || vertices.has(n - 1))) {
    vertices.add(-1)
    vertices.add(n - 1)
  }
  let segments = contour.segments.map((segment, s) => {
    const roles = controls.get(s)
    return roles === undefined ? segment : dropControls(segment, roles)
  })
  let start = contour.start
  let first = 0
  if (vertices.has(-1)) {
    // The first kept end becomes the start; the segments up to it go.
    let k = 0
    while (k < n && vertices.has(k)) k++
    if (k === n) return null
    start = segments[k].to
    first = k + 1
  }
  segments = segments.filter((_, s) => s >= first && !vertices.has(s))
  if (segments.length === 0) return null
  const unchanged = start === contour.start && segments.length === n && segments.every((segment, s) => segment === contour.segments[s])
  return unchanged ? contour : { start, segments, closed: contour.closed }
}

/**
 * Deletes points. An on-curve point: the segment ending there is removed and the next one
 * starts from the previous point; for a start point the first segment's end becomes the
 * start (a linked vertex of a closed contour is both: its last and first segments go, and
 * the implicit closing line joins the neighbours). A contour left without segments is
 * removed. A control point: a cubic becomes a quadratic with its other control, a
 * quadratic (or a cubic losing both) becomes a line.
 */
export function deletePoints(path: EditPath, refs: readonly PointRef[]): EditPath {
  const vertices = new Map<number, Set<number>>()
  const controls = new Map<number, Map<number, Set<'c1' | 'c2'>>>()
  for (const ref of refs) {
    getPoint(path, ref)
    if (ref.role === 'c1' || ref.role === 'c2') {
      let bySegment = controls.get(ref.contour)
      if (bySegment === undefined) controls.set(ref.contour, (bySegment = new Map()))
      let roles = bySegment.get(ref.segment)
      if (roles === undefined) bySegment.set(ref.segment, (roles = new Set()))
      roles.add(ref.role)
    } else {
      let set = vertices.get(ref.contour)
      if (set === undefined) vertices.set(ref.contour, (set = new Set()))
      set.add(ref.role === 'start' ? -1 : ref.segment)
    }
  }
  return replaceContours(path, (contour, c) => {
    if (!vertices.has(c) && !controls.has(c)) return contour
    return deleteFromContour(contour, vertices.get(c) ?? new Set(), controls.get(c) ?? new Map())
  })
}

function lerp(a: Point, b: Point, numerator: number, denominator: number): Point {
  return toPoint(a[0] + (numerator * (b[0] - a[0])) / denominator, a[1] + (numerator * (b[1] - a[1])) / denominator)
}

/**
 * Changes one segment's kind, keeping its ends:
 * - line → quadratic: control at the midpoint; line → cubic: controls at 1/3 and 2/3;
 * - quadratic → cubic: exact degree elevation, c1 = P0 + 2/3(Q − P0), c2 = P2 + 2/3(Q − P2);
 * - cubic → quadratic: control (3(c1 + c2) − (P0 + P3))/4 (exact when the cubic is an
 *   elevated quadratic, else the usual midpoint approximation);
 * - any → line: the controls go;
 * - line, quadratic or cubic → arc: a circular arc on the chord, rx = ry = half the chord,
 *   rotation 0, sweep true, largeArc false (a half circle);
 * - arc → quadratic or cubic: the curve is made on the chord (control at its midpoint, or
 *   controls at 1/3 and 2/3), a straight curve: NOT an exact conversion of the arc.
 * The same kind returns the path unchanged.
 */
export function changeSegmentKind(path: EditPath, ref: SegmentRef, kind: EditSegmentKind): EditPath {
  const segment = requireSegment(path, ref.contour, ref.segment)
  if (segment.kind === kind) return path
  const p0 = segmentStart(path, ref.contour, ref.segment)
  const to = segment.to
  let next: EditSegment
  switch (kind) {
    case 'line':
      next = { kind: 'line', to }
      break
    case 'arc': {
      const radius = Math.hypot(to[0] - p0[0], to[1] - p0[1]) / 2
      next = { kind: 'arc', rx: radius, ry: radius, rotation: 0, largeArc: false, sweep: true, to }
      break
    }
    case 'quadratic':
      if (segment.kind === 'cubic') {
        const [c1, c2] = [segment.c1, segment.c2]
        next = {
          kind: 'quadratic',
          c1: toPoint((3 * (c1[0] + c2[0]) - (p0[0] + to[0])) / 4, (3 * (c1[1] + c2[1]) - (p0[1] + to[1])) / 4),
          to,
        }
      } else {
        next = { kind: 'quadratic', c1: lerp(p0, to, 1, 2), to }
      }
      break
    case 'cubic':
      next = segment.kind === 'quadratic'
        ? { kind: 'cubic', c1: lerp(p0, segment.c1, 2, 3), c2: lerp(to, segment.c1, 2, 3), to }
        : { kind: 'cubic', c1: lerp(p0, to, 1, 3), c2: lerp(p0, to, 2, 3), to }
      break
  }
  const contour = path.contours[ref.contour]
  const segments = contour.segments.map((s, i) => (i === ref.segment ? next : s))
  return replaceContours(path, (c, i) => (i === ref.contour ? { ...c, segments } : c))
}

// ---------------------------------------------------------------------------------------
// Pen

/** Adds an open contour with no segment yet, starting at `point`; `contour` is its index. */
export function startContour(path: EditPath, point: Point): { path: EditPath; contour: number } {
  return { path: { contours: [...path.contours, { start: point, segments: [], closed: false }] }, contour: path.contours.length }
}

function appendSegment(path: EditPath, contour: number, segment: EditSegment): EditPath {
  const found = requireContour(path, contour)
  if (found.closed) throw new RangeError(`contour ${contour} is closed; start a new contour to draw on`)
  return replaceContours(path, (c, i) => (i === contour ? { ...c, segments: [...c.segments, segment] } : c))
}

/** Draws a line from the contour's current end to `to`; RangeError on a closed contour. */
export function appendLine(path: EditPath, contour: number, to: Point): EditPath {
  return appendSegment(path, contour, { kind: 'line', to })
}

/** Draws a cubic from the contour's current end; RangeError on a closed contour. */
export function appendCubic(path: EditPath, contour: number, c1: Point, c2: Point, to: Point): EditPath {
  return appendSegment(path, contour, { kind: 'cubic', c1, c2, to })
}

/**
 * Closes a contour (Z). When its last end equals its start exactly no closing line is
 * implied (the core adds one only for an end away from the start). Already closed: unchanged.
 */
export function closeContour(path: EditPath, contour: number): EditPath {
  const found = requireContour(path, contour)
  if (found.closed) return path
  return replaceContours(path, (c, i) => (i === contour ? { ...c, closed: true } : c))
}

/** Removes the contour's last segment (the contour stays, even empty, for the pen to go on); no segment: unchanged. */
export function removeLastSegment(path: EditPath, contour: number): EditPath {
  const found = requireContour(path, contour)
  if (found.segments.length === 0) return path
  return replaceContours(path, (c, i) => (i === contour ? { ...c, segments: c.segments.slice(0, -1) } : c))
}

// ---------------------------------------------------------------------------------------
// Core segments, picking, snapping

/** Whether parsePathData drops this segment: all its points coincide with where it starts. */
function isDroppedByCore(segment: EditSegment, from: Point): boolean {
  if (!samePoint(segment.to, from)) return false
  if (segment.kind === 'quadratic') return samePoint(segment.c1, from)
  if (segment.kind === 'cubic') return samePoint(segment.c1, from) && samePoint(segment.c2, from)
  // A line or an arc with coincident ends is dropped (an arc is omitted, SVG 1.1 F.6.2).
  return true
}

/**
 * For every segment index of parsePathData(serializeEditPath(path)), the EditPath segment it
 * came from, or null for the implicit closing line Z adds when a closed contour ends away
 * from its start. Zero-length segments (every point at the segment's start) are left out,
 * as the core drops them; so are contours left with no segment.
 */
export function mapNormalisedSegments(path: EditPath): (SegmentRef | null)[] {
  const map: (SegmentRef | null)[] = []
  path.contours.forEach((contour, c) => {
    let current = contour.start
    contour.segments.forEach((segment, s) => {
      if (!isDroppedByCore(segment, current)) map.push({ contour: c, segment: s })
      current = segment.to
    })
    if (contour.closed && contour.segments.length > 0 && !samePoint(current, contour.start)) map.push(null)
  })
  return map
}

/**
 * The point nearest `world` within `radius` (distance ≤ radius), controls only when
 * `includeControls`; null when none. Ties: an on-curve point wins over a control, and
 * among equals the later-drawn point (later in listPoints) wins.
 */
export function nearestPoint(path: EditPath, world: Point, radius: number, includeControls: boolean): PointRef | null {
  let best: ListedPoint | null = null
  let bestDistance = Infinity
  for (const listed of listPoints(path)) {
    if (!listed.onCurve && !includeControls) continue
    const distance = Math.hypot(listed.point[0] - world[0], listed.point[1] - world[1])
    if (!(distance <= radius)) continue
    const better = distance < bestDistance || (distance === bestDistance && (listed.onCurve || !best!.onCurve))
    if (better) {
      best = listed
      bestDistance = distance
    }
  }
  return best === null ? null : best.ref
}

/** n rounded to a multiple of step; for steps like 0.1 (1/step an integer) divides, so 3 steps of 0.1 give 0.3, not 0.30000000000000004. */
function roundToStep(n: number, step: number): number {
  const steps = Math.round(n / step)
  const inverse = 1 / step
  return (Number.isInteger(inverse) ? steps / inverse : steps * step) + 0
}

/**
 * Snaps a point: the nearest target within `radius` wins ('point'; the first of equals),
 * else each coordinate is rounded to the grid when `gridStep` is set ('grid'), else the
 * point is returned unchanged (null). RangeError for a gridStep that is not a finite number > 0.
 */
export function snapPoint(point: Point, options: SnapOptions): SnapResult {
  const { gridStep, targets, radius } = options
  if (gridStep !== null && !(Number.isFinite(gridStep) && gridStep > 0)) throw new RangeError(`gridStep must be a finite number > 0 or null, got ${gridStep}`)
  let nearest: Point | null = null
  let nearestDistance = Infinity
  for (const target of targets) {
    const distance = Math.hypot(target[0] - point[0], target[1] - point[1])
    if (distance <= radius && distance < nearestDistance) {
      nearest = target
      nearestDistance = distance
    }
  }
  if (nearest !== null) return { point: nearest, snappedTo: 'point' }
  if (gridStep !== null) return { point: [roundToStep(point[0], gridStep), roundToStep(point[1], gridStep)], snappedTo: 'grid' }
  return { point, snappedTo: null }
}
