import type { DiagnosticItem } from '../../shared/api/library'
import { computeSegmentBounds, diagnosePath, getSegmentKind, parsePathData } from '../../shared/geometry/index'
import type { NormalisedPath } from '../../shared/geometry/index'
import { COMPUTE_LIMITS } from '../../shared/api/compute'

export interface PathAnalysis {
  path: NormalisedPath
  segments: number
  counts: { line: number; quadratic: number; cubic: number; arc: number }
  bbox: [number, number, number, number] | null
  diagnostics: DiagnosticItem[]
}

export type AnalysisResult = { ok: true; analysis: PathAnalysis } | { ok: false; code: 'invalid_path' | 'limit'; message: string }

/** What Rootcast stores with every revision: the core's normalisation, bounds, counts and diagnostics. */
export function analysePathData(data: string): AnalysisResult {
  const parsed = parsePathData(data)
  if (!parsed.ok) return { ok: false, code: 'invalid_path', message: parsed.error.message }
  const path = parsed.path
  if (path.segments.length > COMPUTE_LIMITS.segments) {
    return { ok: false, code: 'limit', message: `The path has ${path.segments.length} segments after normalisation; the limit is ${COMPUTE_LIMITS.segments}.` }
  }
  const counts = { line: 0, quadratic: 0, cubic: 0, arc: 0 }
  let bbox: [number, number, number, number] | null = null
  for (const s of path.segments) {
    counts[getSegmentKind(s)]++
    const b = computeSegmentBounds(s)
    bbox = bbox ? [Math.min(bbox[0], b[0]), Math.min(bbox[1], b[1]), Math.max(bbox[2], b[2]), Math.max(bbox[3], b[3])] : [b[0], b[1], b[2], b[3]]
  }
  const diagnostics = diagnosePath(path).map((d) => ({ ...d, point: d.point ? ([d.point[0], d.point[1]] as [number, number]) : null }))
  return { ok: true, analysis: { path, segments: path.segments.length, counts, bbox, diagnostics } }
}
