import {
  mdiAngleAcute,
  mdiArrowCollapseHorizontal,
  mdiCircleMultipleOutline,
  mdiCircleOffOutline,
  mdiDrawing,
  mdiFormatFont,
  mdiLinkVariantOff,
  mdiSvg,
  mdiSync,
  mdiVectorLine,
} from '@mdi/js'
import type { DiagnosticItem, PathListItem } from '../../shared/api'
import { TRASH_DAYS } from '../../shared/api'
import type { Box } from './usePathViewBox'

type Origin = PathListItem['origin']
type Counts = PathListItem['counts']
type DiagnosticKind = DiagnosticItem['kind']
type Bbox = readonly [number, number, number, number]

/** How the interface names where a path came from, with an icon beside the words. */
export const ORIGIN_INFO: Record<Origin, { label: string; icon: string }> = {
  drawn: { label: 'Drawn', icon: `svg:${mdiDrawing}` },
  svg: { label: 'SVG file', icon: `svg:${mdiSvg}` },
  font: { label: 'Font glyph', icon: `svg:${mdiFormatFont}` },
}

/** A short name and an icon for every diagnostic kind the core reports (issue 4, item 4). */
export const DIAGNOSTIC_INFO: Record<DiagnosticKind, { label: string; icon: string }> = {
  'zero-length-segment': { label: 'Zero-length segment', icon: `svg:${mdiArrowCollapseHorizontal}` },
  'degenerate-contour': { label: 'Contour of identical points', icon: `svg:${mdiCircleOffOutline}` },
  'straight-curve': { label: 'Straight curve', icon: `svg:${mdiVectorLine}` },
  cusp: { label: 'Cusp', icon: `svg:${mdiAngleAcute}` },
  loop: { label: 'Loop', icon: `svg:${mdiSync}` },
  'open-subpath': { label: 'Open subpath', icon: `svg:${mdiLinkVariantOff}` },
  'coincident-points': { label: 'Coincident points', icon: `svg:${mdiCircleMultipleOutline}` },
}

const SEGMENT_KINDS: readonly { key: keyof Counts; one: string; many: string }[] = [
  { key: 'line', one: 'line', many: 'lines' },
  { key: 'quadratic', one: 'quadratic', many: 'quadratics' },
  { key: 'cubic', one: 'cubic', many: 'cubics' },
  { key: 'arc', one: 'arc', many: 'arcs' },
]

/** Segment counts by kind, in the order line, quadratic, cubic, arc, with their names. */
export function listSegmentCounts(counts: Counts): { key: keyof Counts; label: string; count: number }[] {
  return SEGMENT_KINDS.map(({ key, one, many }) => ({ key, label: counts[key] === 1 ? one : many, count: counts[key] }))
}

/** "12 lines, 4 cubics" (kinds with none are left out); "no segments" when all are zero. */
export function describeSegmentCounts(counts: Counts): string {
  const parts = listSegmentCounts(counts)
    .filter((entry) => entry.count > 0)
    .map((entry) => `${entry.count} ${entry.label}`)
  return parts.length > 0 ? parts.join(', ') : 'no segments'
}

/** "1 warning", "3 warnings", "no warnings". */
export function describeWarnings(count: number): string {
  if (count === 0) return 'no warnings'
  return count === 1 ? '1 warning' : `${count} warnings`
}

/** Significant digits of a coordinate in a compact display; the full double stays in a tooltip. */
export const COORDINATE_DISPLAY_DIGITS = 6

/** A coordinate shortened for display: 6 significant digits, no trailing zeros. */
export function formatCoordinate(value: number): string {
  return String(Number(value.toPrecision(COORDINATE_DISPLAY_DIGITS)))
}

/** "x 0 … 24 · y −2 … 22" for a bounding box, or "empty" when there is none. */
export function describeBbox(bbox: Bbox | null): string {
  if (bbox === null) return 'empty'
  const [minX, minY, maxX, maxY] = bbox.map(formatCoordinate)
  return `x ${minX} … ${maxX} · y ${minY} … ${maxY}`
}

/** The API's [minX, minY, maxX, maxY] as a box for a viewBox. */
export function boxFromBbox(bbox: Bbox): Box {
  const [minX, minY, maxX, maxY] = bbox
  return { x: minX, y: minY, width: maxX - minX, height: maxY - minY }
}

/** The smallest box holding both (font previews: the glyph and its em frame). */
export function unionBbox(a: Bbox, b: Bbox): [number, number, number, number] {
  return [Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[2], b[2]), Math.max(a[3], b[3])]
}

const DAY_MS = 24 * 60 * 60 * 1000

/** Whole days (rounded up) until a path trashed at `deletedAt` is purged; 0 once the period is over. */
export function trashDaysLeft(deletedAt: string, now: number = Date.now()): number {
  const deleted = Date.parse(deletedAt)
  if (Number.isNaN(deleted)) return 0
  return Math.max(0, Math.ceil((deleted + TRASH_DAYS * DAY_MS - now) / DAY_MS))
}

const BYTES_PER_MB = 1024 * 1024

/** A file size for people: "2 MB", "340 kB", "12 bytes" (binary multiples, as the upload limits). */
export function formatBytes(bytes: number): string {
  if (bytes >= BYTES_PER_MB) return `${Number((bytes / BYTES_PER_MB).toFixed(1))} MB`
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} kB`
  return bytes === 1 ? '1 byte' : `${bytes} bytes`
}

/** A file the page refuses before uploading it, with the reason in words. */
export interface RefusedFile {
  fileName: string
  message: string
}

/**
 * Splits chosen files into those to send and those over the limits the server enforces
 * too, so that a too-large file is named at once instead of failing the whole upload.
 */
export function checkUploadFiles(
  files: readonly File[],
  limits: { maxFiles: number; maxBytes: number },
): { accepted: File[]; refused: RefusedFile[] } {
  const accepted: File[] = []
  const refused: RefusedFile[] = []
  for (const file of files) {
    if (file.size > limits.maxBytes) {
      refused.push({
        fileName: file.name,
        message: `This file has ${formatBytes(file.size)}; at most ${formatBytes(limits.maxBytes)} per file can be uploaded.`,
      })
    } else if (accepted.length >= limits.maxFiles) {
      refused.push({ fileName: file.name, message: `At most ${limits.maxFiles} files can be uploaded at once.` })
    } else {
      accepted.push(file)
    }
  }
  return { accepted, refused }
}

/** U+0052 for a code point (at least four hex digits, as the Unicode standard writes them). */
export function formatCodePoint(codePoint: number): string {
  return `U+${codePoint.toString(16).toUpperCase().padStart(4, '0')}`
}
