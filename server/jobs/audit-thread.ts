import { auditPaths, type AuditOptions, type AuditPathInput } from '../../shared/audit'

/** One chunk's task for a worker thread: its paths, in order, and the audit's options. */
export interface AuditChunkTask {
  paths: AuditPathInput[]
  options: AuditOptions
}

/**
 * Runs in a piscina worker thread: the chunk's aggregate (the core's auditPaths equals the
 * merge of its paths' auditPath aggregates in any grouping, so chunking changes nothing).
 * Answers the JSON text, so the main thread stores it without serialising it again.
 */
export default function auditChunk({ paths, options }: AuditChunkTask): string {
  return JSON.stringify(auditPaths(paths, options))
}
