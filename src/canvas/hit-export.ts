/**
 * Exports of the live hits: one flat row per hit, as CSV (RFC 4180) and as JSON with the
 * paths, probes and sweeps they answer. Numbers are written in their shortest round-trip
 * form, so every double reads back exactly.
 */
import type { FillRule, HitKind } from '../../shared/geometry'
import type { LiveResult } from './live-hits'
import { toCoreProbe } from './probe-geometry'
import type { CanvasProbe, CanvasSweep } from './types'

/** One hit of one probe or sweep line on one path. tEnd and sEnd are set for overlaps only. */
export interface HitRow {
  readonly line: string
  readonly probe: string | null
  readonly sweep: string | null
  readonly path: string
  readonly pathName: string
  readonly segment: number
  readonly kind: HitKind
  readonly winding: -1 | 0 | 1
  readonly t: number
  readonly s: number
  readonly x: number
  readonly y: number
  readonly tEnd: number | null
  readonly sEnd: number | null
}

/** The CSV columns, in order: HitRow's fields. */
export const HIT_ROW_COLUMNS: readonly (keyof HitRow)[] = [
  'line', 'probe', 'sweep', 'path', 'pathName', 'segment', 'kind', 'winding', 't', 's', 'x', 'y', 'tEnd', 'sEnd',
]

/**
 * The hits of a live result as rows, line by line, path by path, in s order as the result
 * holds them. `names` maps path keys to names; a key missing there stands for its own name.
 */
export function hitRows(result: LiveResult, names: Record<string, string>): HitRow[] {
  const rows: HitRow[] = []
  for (const line of result.lines) {
    for (const { pathKey, hits } of line.perPath) {
      const pathName = Object.hasOwn(names, pathKey) ? names[pathKey] : pathKey
      for (const hit of hits) {
        rows.push({
          line: line.lineId,
          probe: line.probeId,
          sweep: line.sweepId,
          path: pathKey,
          pathName,
          segment: hit.segment,
          kind: hit.kind,
          winding: hit.winding,
          t: hit.t,
          s: hit.s,
          x: hit.point[0],
          y: hit.point[1],
          tEnd: hit.tEnd ?? null,
          sEnd: hit.sEnd ?? null,
        })
      }
    }
  }
  return rows
}

/** Shortest round-trip text of a double; −0 keeps its sign (String(-0) would drop it). */
function formatDouble(value: number): string {
  return Object.is(value, -0) ? '-0' : String(value)
}

/** A CSV field: quoted (quotes doubled) when it holds a comma, a quote, CR or LF. */
function quoteField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text
}

/**
 * Rows as CSV per RFC 4180: a header row of HIT_ROW_COLUMNS, CRLF after every record, null
 * as an empty field, numbers so that Number(field) gives the same double back (−0 as "-0").
 */
export function hitsToCsv(rows: readonly HitRow[]): string {
  const records = [HIT_ROW_COLUMNS.join(',')]
  for (const row of rows) {
    records.push(HIT_ROW_COLUMNS.map((column) => {
      const value = row[column]
      if (value === null) return ''
      return typeof value === 'number' ? formatDouble(value) : quoteField(value)
    }).join(','))
  }
  return records.join('\r\n') + '\r\n'
}

/** A path as the JSON export describes it. */
export interface ExportedPath {
  readonly key: string
  readonly name: string
  readonly pathId: number | null
  readonly revision: number | null
  /** The SVG path data the hits were computed on. */
  readonly data: string
  readonly fillRule: FillRule
}

export interface HitExportInput {
  readonly paths: readonly ExportedPath[]
  readonly probes: readonly CanvasProbe[]
  readonly sweeps: readonly CanvasSweep[]
  readonly rows: readonly HitRow[]
  /** ISO 8601 time of the export. */
  readonly exportedAt: string
}

/** Format name and version of the JSON export. */
export const HIT_EXPORT_FORMAT = 'rootcast-hits'
export const HIT_EXPORT_VERSION = 1

/**
 * The JSON export: `{ format: 'rootcast-hits', version: 1, exportedAt, paths, probes,
 * sweeps, rows }`, with each probe in the computation contract's shape (ray/line origin and
 * direction, segment from and to) plus its id. JSON numbers read back as the same doubles
 * (except −0, which JSON writes as 0). Indented by two spaces.
 */
export function hitsToJson(input: HitExportInput): string {
  return JSON.stringify({
    format: HIT_EXPORT_FORMAT,
    version: HIT_EXPORT_VERSION,
    exportedAt: input.exportedAt,
    paths: input.paths,
    probes: input.probes.map((p) => ({ id: p.id, ...toCoreProbe(p) })),
    sweeps: input.sweeps,
    rows: input.rows,
  }, null, 2)
}
