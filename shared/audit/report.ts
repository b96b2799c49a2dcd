/**
 * The audit report as table rows: per engine and probe category the counts, then a row per
 * engine over all categories; ready for CSV.
 */
import type { AuditAggregate, AuditCounts } from './types'
import { AUDIT_COUNT_FIELDS, PROBE_CATEGORIES } from './types'

/** The report's columns, in order. */
export const AUDIT_REPORT_COLUMNS: readonly string[] = ['engine', 'category', 'probes', ...AUDIT_COUNT_FIELDS]

/** One row of the report: engine, category ('all' for the engine's total), probes, then the counts in AUDIT_COUNT_FIELDS order. */
export type AuditReportRow = readonly [engine: string, category: string, probes: number, ...counts: number[]]

/** Rows per engine (aggregate order) and category (PROBE_CATEGORIES order, then 'all'). */
export function auditReportRows(aggregate: AuditAggregate): AuditReportRow[] {
  const rows: AuditReportRow[] = []
  for (const engine of aggregate.byEngine) {
    const total: AuditCounts = { referenceHits: 0, matched: 0, missed: 0, spurious: 0, wrongWinding: 0, wrongKind: 0 }
    for (const category of PROBE_CATEGORIES) {
      const counts = engine.categories[category]
      for (const field of AUDIT_COUNT_FIELDS) total[field] += counts[field]
      rows.push([engine.engine, category, aggregate.probesByCategory[category], ...AUDIT_COUNT_FIELDS.map((field) => counts[field])])
    }
    rows.push([engine.engine, 'all', aggregate.probes, ...AUDIT_COUNT_FIELDS.map((field) => total[field])])
  }
  return rows
}

/** A CSV field: quoted (quotes doubled) when it holds a comma, quote or line break (RFC 4180). */
function formatCsvField(value: string | number): string {
  const text = String(value)
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

/** The report as CSV (RFC 4180: header line, CRLF line ends). */
export function formatAuditReportCsv(aggregate: AuditAggregate): string {
  return [AUDIT_REPORT_COLUMNS, ...auditReportRows(aggregate)].map((row) => row.map(formatCsvField).join(',')).join('\r\n') + '\r\n'
}
