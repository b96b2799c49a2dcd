/**
 * SVG path data (the `d` attribute) → normalised segments.
 *
 * The grammar, absolute/relative commands and the shorthands S and T are handled by the
 * svgpath package (`abs()` then `unshort()`); this module turns its absolute commands into
 * line, quadratic, cubic and exact arc segments (H and V, which svgpath keeps after abs(),
 * become lines) and records the subpath structure.
 */
import svgpath from 'svgpath'
import { convertArcToCentre } from './arc'
import type { Point, Segment } from './segments'

/** One subpath: segments[start .. start + count) and whether Z closed it. */
export interface Subpath {
  readonly start: number
  readonly count: number
  readonly closed: boolean
}

/**
 * A piece of path data that normalisation left out because all its points coincide.
 *
 * - `segment`: one drawing command (L, H, V, Q, C or A as svgpath made it absolute) whose
 *   points all lie at `point`, inside a subpath that kept other segments: `subpath` is that
 *   subpath's index in `subpaths`. A Z never makes one: its closing line is only added
 *   when the current point is away from the start.
 * - `contour`: a whole subpath whose drawing commands (`commands` of them, Z included) all
 *   stayed at its start `point`, so it kept no segment and has no index in `subpaths`;
 *   `subpathsBefore` kept subpaths precede it. A moveto with no drawing command after it
 *   is no contour and is not recorded.
 * In both, `segmentsBefore` kept segments precede the piece in the path data: it sat
 * between segments[segmentsBefore − 1] and segments[segmentsBefore].
 */
export type DroppedPiece =
  | {
    readonly kind: 'segment'
    readonly command: 'L' | 'H' | 'V' | 'Q' | 'C' | 'A'
    readonly point: Point
    readonly subpath: number
    readonly segmentsBefore: number
  }
  | {
    readonly kind: 'contour'
    readonly point: Point
    readonly commands: number
    readonly subpathsBefore: number
    readonly segmentsBefore: number
  }

/**
 * A path after normalisation: segment tuples and the subpaths they form. `dropped` lists,
 * in path-data order, the zero-length pieces the parser left out; it is present only when
 * there was at least one, so segment and subpath indices are those of the kept pieces.
 */
export interface NormalisedPath {
  readonly segments: readonly Segment[]
  readonly subpaths: readonly Subpath[]
  readonly dropped?: readonly DroppedPiece[]
}

/** Why path data was refused; `code` is the API error code. */
export interface PathDataError {
  readonly code: 'invalid_path'
  readonly message: string
  /** Character offset where the parser stopped, when known. */
  readonly position?: number
}

export type PathDataResult =
  | { readonly ok: true; readonly path: NormalisedPath }
  | { readonly ok: false; readonly error: PathDataError }

type Command = readonly [string, ...number[]]

function refuse(message: string, position?: number): PathDataResult {
  return { ok: false, error: position === undefined ? { code: 'invalid_path', message } : { code: 'invalid_path', message, position } }
}

/**
 * Parses SVG path data into normalised segments and subpaths.
 *
 * - Zero-length pieces (a line, quadratic or cubic whose points all coincide, an arc whose
 *   end points coincide) are dropped, and so are subpaths left without segments; both are
 *   listed in `path.dropped` (see {@link DroppedPiece}), which is absent when none was.
 * - Z closes with a line when the current point is away from the subpath's start; the
 *   subpath is marked closed either way. A drawing command after Z without M starts a
 *   new subpath at the closed one's start, as SVG says.
 * - Arcs stay exact (see arc.ts); a zero radius makes a line.
 * Malformed or truncated data, or a coordinate that is not a finite double, gives
 * `{ ok: false, error: { code: 'invalid_path', ... } }`; a non-string argument throws RangeError.
 */
export function parsePathData(pathData: string): PathDataResult {
  if (typeof pathData !== 'string') throw new RangeError('path data must be a string')
  const parsed = svgpath(pathData)
  const parserError = (parsed as unknown as { err: string }).err
  if (parserError) {
    const match = /^SvgPath: (.*?)(?: \(at pos (\d+)\))?$/.exec(parserError)
    const reason = match ? match[1] : parserError
    const position = match?.[2] === undefined ? undefined : Number(match[2])
    return refuse(
      position === undefined ? `Path data is malformed: ${reason}.` : `Path data is malformed at character ${position}: ${reason}.`,
      position,
    )
  }
  const commands: Command[] = []
  parsed.abs().unshort().iterate((command) => { commands.push(command as unknown as Command) })

  const segments: Segment[] = []
  const subpaths: Subpath[] = []
  let startX = 0, startY = 0, x = 0, y = 0
  let subpathStart = 0
  let open = false
  const dropped: DroppedPiece[] = []
  // Zero-length pieces of the current subpath wait here until it is known whether it keeps a segment.
  const pending: { command: 'L' | 'H' | 'V' | 'Q' | 'C' | 'A'; point: Point; segmentsBefore: number }[] = []
  let drawingCommands = 0
  const finish = (closed: boolean): void => {
    if (segments.length > subpathStart) {
      for (const piece of pending) dropped.push({ kind: 'segment', ...piece, subpath: subpaths.length })
      subpaths.push({ start: subpathStart, count: segments.length - subpathStart, closed })
    } else if (drawingCommands > 0) {
      dropped.push({ kind: 'contour', point: [startX, startY], commands: drawingCommands, subpathsBefore: subpaths.length, segmentsBefore: segments.length })
    }
    subpathStart = segments.length
    open = false
    pending.length = 0
    drawingCommands = 0
  }
  const push = (segment: Segment): void => {
    if (!open) { subpathStart = segments.length; open = true }
    segments.push(segment)
  }
  const drop = (command: 'L' | 'H' | 'V' | 'Q' | 'C' | 'A'): void => {
    pending.push({ command, point: [x, y], segmentsBefore: segments.length })
  }
  for (const command of commands) {
    const [letter, ...values] = command
    if (!values.every(Number.isFinite)) {
      return refuse(`Path data has a number that is not a finite double in its ${letter} command.`)
    }
    if (letter !== 'M') drawingCommands++
    switch (letter) {
      case 'M':
        finish(false)
        startX = x = values[0]
        startY = y = values[1]
        break
      case 'L': case 'H': case 'V': {
        const nx = letter === 'V' ? x : values[0]
        const ny = letter === 'L' ? values[1] : letter === 'V' ? values[0] : y
        if (nx !== x || ny !== y) push([x, y, nx, ny])
        else drop(letter as 'L' | 'H' | 'V')
        x = nx
        y = ny
        break
      }
      case 'Q': {
        const [x1, y1, x2, y2] = values
        if (!(x1 === x && y1 === y && x2 === x && y2 === y)) push([x, y, x1, y1, x2, y2])
        else drop('Q')
        x = x2
        y = y2
        break
      }
      case 'C': {
        const [x1, y1, x2, y2, x3, y3] = values
        if (!(x1 === x && y1 === y && x2 === x && y2 === y && x3 === x && y3 === y)) push([x, y, x1, y1, x2, y2, x3, y3])
        else drop('C')
        x = x3
        y = y3
        break
      }
      case 'A': {
        const [rx, ry, rotation, largeArc, sweep, x2, y2] = values
        const converted = convertArcToCentre(x, y, rx, ry, rotation, largeArc !== 0, sweep !== 0, x2, y2)
        if (converted.kind !== 'omitted') push(converted.segment)
        else drop('A')
        x = x2
        y = y2
        break
      }
      case 'Z': case 'z':
        if (open && (x !== startX || y !== startY)) push([x, y, startX, startY])
        x = startX
        y = startY
        finish(open)
        break
      default:
        return refuse(`Path data has an unknown command ${letter}.`)
    }
  }
  finish(false)
  return { ok: true, path: dropped.length > 0 ? { segments, subpaths, dropped } : { segments, subpaths } }
}
