/**
 * A normalised path packed for probing: one Float64Array of segment values, subpaths as
 * lists of segment indices, and the magnitude that scales the tolerances.
 */
import type { NormalisedPath } from '../path-data'
import { ARC_CODE, endIndexOf, getSegmentKind } from '../segments'

export interface PreparedPath {
  readonly data: Float64Array
  /** Segment i occupies data[offsets[i] .. offsets[i + 1]); its kind code is that length. */
  readonly offsets: Int32Array
  /** Segments of the path itself; closing lines added for filling have indices ≥ this. */
  readonly segmentCount: number
  /** Subpath j is the segment indices order[subpathStart[j] .. subpathStart[j] + subpathCount[j]). */
  readonly order: Int32Array
  readonly subpathStart: Int32Array
  readonly subpathCount: Int32Array
  readonly subpathClosed: Uint8Array
  /** Largest |coordinate| reached by the path (arcs: |centre| + radius). */
  readonly scale: number
}

/**
 * Packs a path. With `closeForFill`, every open subpath is closed as SVG fills it: by a
 * line from its end back to its start when they differ (appended after the path's own
 * segments), and its last and first segments then join.
 */
export function preparePath(path: NormalisedPath, closeForFill: boolean): PreparedPath {
  const { segments, subpaths } = path
  const closing: number[][] = []
  const closingOf = subpaths.map((subpath) => {
    if (!closeForFill || subpath.closed) return -1
    const first = segments[subpath.start]
    const last = segments[subpath.start + subpath.count - 1]
    const end = endIndexOf(last.length)
    if (last[end] === first[0] && last[end + 1] === first[1]) return -1
    closing.push([last[end], last[end + 1], first[0], first[1]])
    return segments.length + closing.length - 1
  })
  const total = segments.length + closing.length
  const offsets = new Int32Array(total + 1)
  let length = 0
  for (let i = 0; i < total; i++) {
    const values = i < segments.length ? segments[i] : closing[i - segments.length]
    getSegmentKind(values)
    offsets[i] = length
    length += values.length
  }
  offsets[total] = length
  const data = new Float64Array(length)
  let scale = 0
  for (let i = 0; i < total; i++) {
    const values = i < segments.length ? segments[i] : closing[i - segments.length]
    data.set(values, offsets[i])
    const points = values.length === ARC_CODE ? 4 : values.length
    for (let k = 0; k < points; k++) scale = Math.max(scale, Math.abs(values[k]))
    if (values.length === ARC_CODE) {
      const radius = Math.max(values[6], values[7])
      scale = Math.max(scale, Math.abs(values[4]) + radius, Math.abs(values[5]) + radius)
    }
  }
  const order = new Int32Array(total)
  const subpathStart = new Int32Array(subpaths.length)
  const subpathCount = new Int32Array(subpaths.length)
  const subpathClosed = new Uint8Array(subpaths.length)
  let written = 0
  subpaths.forEach((subpath, j) => {
    subpathStart[j] = written
    for (let k = 0; k < subpath.count; k++) order[written++] = subpath.start + k
    if (closingOf[j] >= 0) order[written++] = closingOf[j]
    subpathCount[j] = written - subpathStart[j]
    subpathClosed[j] = closeForFill || subpath.closed ? 1 : 0
  })
  return { data, offsets, segmentCount: segments.length, order, subpathStart, subpathCount, subpathClosed, scale }
}
