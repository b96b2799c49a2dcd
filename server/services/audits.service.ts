import type { DataSource, EntityManager } from 'typeorm'
import type { z } from 'zod'
import type { Audit, AuditReport, AuditSelection, AuditSummary, newAuditSchema } from '../../shared/api/audits'
import { emptyAggregate, mergeAggregates, type AuditAggregate, type AuditOptions, type AuditPathInput } from '../../shared/audit'
import type { AuditStatus } from '../entities/audit.entity'
import { HttpError, notFound } from '../errors/http-error'
import type { DeepReadonly } from '../routes/api-route'

/**
 * Audits in MariaDB: created here from a request, advanced chunk by chunk by the workers
 * (server/jobs/audit-worker.ts), read back by the routes. Every state change happens in a
 * transaction holding the audit's row lock, so chunks finishing at once on several workers
 * count once each and exactly one of them completes the audit.
 */

export type NewAuditInput = z.output<typeof newAuditSchema>

/** Compile-time check that the core's aggregate has the shape the API documents as AuditReport. */
type Documented<T extends DeepReadonly<AuditReport>> = T
export type StoredReport = Documented<AuditAggregate>

/** Statuses in which chunks are still taken up. */
const ACTIVE: ReadonlySet<AuditStatus> = new Set(['queued', 'running'])
/** Statuses an audit never leaves. */
const FINISHED: ReadonlySet<AuditStatus> = new Set(['completed', 'cancelled', 'failed'])
/** Ids per IN (…) list when resolving a selection of many paths. */
const ID_BATCH = 1000
/** Stored chunk aggregates read per query while merging the report. */
const MERGE_BATCH = 16
/** Longest error text kept (the column's width). */
const ERROR_CHARS = 1000

interface Row {
  id: number
  projectId: number
  name: string
  status: AuditStatus
  options: string
  selection: string
  pathCount: number
  chunkCount: number
  chunksDone: number
  createdBy: string | null
  createdAt: Date
  startedAt: Date | null
  finishedAt: Date | null
  error: string | null
}

const SUMMARY_COLUMNS = `a.id AS id, a.project_id AS projectId, a.name AS name, a.status AS status, a.options AS options,
  a.selection AS selection, a.path_count AS pathCount, a.chunk_count AS chunkCount, a.chunks_done AS chunksDone,
  u.display_name AS createdBy, a.created_at AS createdAt, a.started_at AS startedAt, a.finished_at AS finishedAt, a.error AS error`
const FROM_AUDITS = 'FROM audits a LEFT JOIN users u ON u.id = a.created_by'

const iso = (d: Date | null) => (d === null ? null : new Date(d).toISOString())

function toSummary(r: Row): AuditSummary {
  const options = JSON.parse(r.options) as AuditOptions
  return {
    id: Number(r.id),
    projectId: Number(r.projectId),
    name: r.name,
    status: r.status,
    progress: { done: Number(r.chunksDone), total: Number(r.chunkCount) },
    pathCount: Number(r.pathCount),
    engines: [...options.engines],
    createdBy: r.createdBy,
    createdAt: new Date(r.createdAt).toISOString(),
    startedAt: iso(r.startedAt),
    finishedAt: iso(r.finishedAt),
    error: r.error,
  }
}

/** Resolves the team of an audit, for the route layer's role check. */
export async function auditTeamId(ds: DataSource, id: number): Promise<number | undefined> {
  const row = (await ds.query('SELECT pr.team_id AS teamId FROM audits a JOIN projects pr ON pr.id = a.project_id WHERE a.id = ?', [id])) as Array<{ teamId: number }>
  return row[0] ? Number(row[0].teamId) : undefined
}

/** The project's audits, newest first, without their reports. */
export async function listAudits(ds: DataSource, projectId: number): Promise<AuditSummary[]> {
  const rows = (await ds.query(`SELECT ${SUMMARY_COLUMNS} ${FROM_AUDITS} WHERE a.project_id = ? ORDER BY a.created_at DESC, a.id DESC`, [projectId])) as Row[]
  return rows.map(toSummary)
}

/** One audit with its progress, and its report once completed. */
export async function getAudit(m: EntityManager, id: number): Promise<Audit> {
  const [r] = (await m.query(`SELECT ${SUMMARY_COLUMNS}, a.report AS report ${FROM_AUDITS} WHERE a.id = ?`, [id])) as Array<Row & { report: string | null }>
  if (!r) throw notFound('That audit')
  return {
    ...toSummary(r),
    selection: JSON.parse(r.selection) as AuditSelection,
    options: JSON.parse(r.options) as Audit['options'],
    report: r.report === null ? null : (JSON.parse(r.report) as Audit['report']),
  }
}

/**
 * The current revisions of the live paths the selection names, ordered by path id. The list
 * is kept with the audit, so every chunk (on whichever worker, after whichever restart) sees
 * the same paths at the same revisions even when the library changes meanwhile.
 */
async function resolveSelection(m: EntityManager, projectId: number, selection: AuditSelection): Promise<number[]> {
  const live = 'p.project_id = ? AND p.deleted_at IS NULL AND p.current_revision_id IS NOT NULL'
  type IdRow = { pathId: number; revisionId: number }
  const select = 'SELECT p.id AS pathId, p.current_revision_id AS revisionId FROM paths p'
  let rows: IdRow[]
  if ('tag' in selection) {
    rows = (await m.query(`${select} JOIN path_tags t ON t.path_id = p.id AND t.tag = ? WHERE ${live} ORDER BY p.id`, [selection.tag, projectId])) as IdRow[]
  } else if ('pathIds' in selection) {
    const wanted = [...new Set(selection.pathIds)].sort((a, b) => a - b)
    rows = []
    for (let i = 0; i < wanted.length; i += ID_BATCH) {
      const ids = wanted.slice(i, i + ID_BATCH)
      rows.push(...((await m.query(`${select} WHERE ${live} AND p.id IN (?) ORDER BY p.id`, [projectId, ids])) as IdRow[]))
    }
    if (rows.length < wanted.length) {
      const found = new Set(rows.map((r) => Number(r.pathId)))
      const missing = wanted.filter((id) => !found.has(id))
      throw new HttpError(400, 'unknown_paths', `${missing.length} of the selected paths are not live paths of this project (ids ${missing.slice(0, 10).join(', ')}${missing.length > 10 ? ', …' : ''}).`)
    }
  } else {
    rows = (await m.query(`${select} WHERE ${live} ORDER BY p.id`, [projectId])) as IdRow[]
  }
  if (rows.length === 0) throw new HttpError(400, 'empty_selection', 'The selection holds no live path of this project.')
  return rows.map((r) => Number(r.revisionId))
}

function optionsOf(input: NewAuditInput): AuditOptions {
  return {
    engines: input.engines,
    generators: input.generators,
    seed: input.seed,
    ...(input.subdivisionTolerance !== undefined && { subdivisionTolerance: input.subdivisionTolerance }),
  }
}

/** Stores a queued audit over the selection, cut into chunks of `chunkSize` paths. */
export async function createAudit(ds: DataSource, projectId: number, userId: number, input: NewAuditInput, chunkSize: number): Promise<{ id: number; chunkCount: number }> {
  return ds.transaction(async (m) => {
    const targets = await resolveSelection(m, projectId, input.selection)
    const chunkCount = Math.ceil(targets.length / chunkSize)
    const r = (await m.query(
      `INSERT INTO audits (project_id, name, status, options, selection, targets, path_count, chunk_size, chunk_count, created_by)
       VALUES (?, ?, 'queued', ?, ?, ?, ?, ?, ?, ?)`,
      [projectId, input.name, JSON.stringify(optionsOf(input)), JSON.stringify(input.selection), JSON.stringify(targets), targets.length, chunkSize, chunkCount, userId],
    )) as { insertId: number }
    return { id: Number(r.insertId), chunkCount }
  })
}

/** Removes an audit whose jobs could not be queued (it never ran). */
export async function discardAudit(ds: DataSource, id: number): Promise<void> {
  await ds.transaction((m) => m.query('DELETE FROM audits WHERE id = ?', [id]))
}

/**
 * Cancels a queued or running audit: 'cancelling' first, so no chunk is stored from then on,
 * then the waiting jobs are removed, then 'cancelled'. A finished audit answers 409.
 */
export async function cancelAudit(ds: DataSource, id: number, removeJobs: (chunkCount: number) => Promise<void>): Promise<Audit> {
  const chunkCount = await ds.transaction(async (m) => {
    const [a] = (await m.query('SELECT status, chunk_count AS chunkCount FROM audits WHERE id = ? FOR UPDATE', [id])) as Array<{ status: AuditStatus; chunkCount: number }>
    if (!a) throw notFound('That audit')
    if (FINISHED.has(a.status)) throw new HttpError(409, 'audit_finished', `That audit has ${a.status === 'completed' ? 'completed' : `been ${a.status}`} already.`)
    await m.query("UPDATE audits SET status = 'cancelling' WHERE id = ?", [id])
    return Number(a.chunkCount)
  })
  await removeJobs(chunkCount).catch(() => {
    // Jobs left behind (Redis unreachable now) find the audit cancelled and skip, as running ones do.
  })
  await ds.transaction((m) => m.query("UPDATE audits SET status = 'cancelled', finished_at = ? WHERE id = ? AND status = 'cancelling'", [new Date(), id]))
  return getAudit(ds.manager, id)
}

/** The completed audit's report; 409 while it is not complete. */
export async function auditReport(ds: DataSource, id: number): Promise<{ name: string; report: AuditAggregate }> {
  const [r] = (await ds.query('SELECT name, status, report FROM audits WHERE id = ?', [id])) as Array<{ name: string; status: AuditStatus; report: string | null }>
  if (!r) throw notFound('That audit')
  if (r.status !== 'completed' || r.report === null) throw new HttpError(409, 'audit_not_completed', `That audit is ${r.status}; its report exists once it has completed.`)
  return { name: r.name, report: JSON.parse(r.report) as AuditAggregate }
}

// ——— The worker's side ———

/** What one chunk job computes: the audit's options and the chunk's paths. */
export interface ChunkWork {
  options: AuditOptions
  paths: AuditPathInput[]
}

/**
 * The work of one chunk, read from MariaDB: undefined when there is nothing to do (the audit
 * is gone, cancelled, failed or complete, or this chunk is stored already). Marks a queued
 * audit running.
 */
export async function chunkWork(ds: DataSource, auditId: number, chunk: number): Promise<ChunkWork | undefined> {
  const [a] = (await ds.query('SELECT status, options, targets, chunk_size AS chunkSize FROM audits WHERE id = ?', [auditId])) as Array<{ status: AuditStatus; options: string; targets: string; chunkSize: number }>
  if (!a || !ACTIVE.has(a.status)) return undefined
  const [stored] = (await ds.query('SELECT 1 AS x FROM audit_chunks WHERE audit_id = ? AND chunk = ?', [auditId, chunk])) as unknown[]
  if (stored) return undefined
  if (a.status === 'queued') {
    await ds.transaction((m) => m.query("UPDATE audits SET status = 'running', started_at = COALESCE(started_at, ?) WHERE id = ? AND status = 'queued'", [new Date(), auditId]))
  }
  const size = Number(a.chunkSize)
  const revisionIds = (JSON.parse(a.targets) as number[]).slice(chunk * size, (chunk + 1) * size)
  if (revisionIds.length === 0) return { options: JSON.parse(a.options) as AuditOptions, paths: [] }
  const rows = (await ds.query('SELECT r.id AS revisionId, p.id AS pathId, p.name AS name, r.data AS data FROM revisions r JOIN paths p ON p.id = r.path_id WHERE r.id IN (?)', [revisionIds])) as Array<{ revisionId: number; pathId: number; name: string; data: string }>
  // In the audit's order; a path purged since the audit began is simply absent.
  const byRevision = new Map(rows.map((r) => [Number(r.revisionId), r]))
  const paths = revisionIds.flatMap((rid) => {
    const r = byRevision.get(rid)
    return r ? [{ pathId: Number(r.pathId), name: r.name, data: r.data }] : []
  })
  return { options: JSON.parse(a.options) as AuditOptions, paths }
}

/** Folds the stored chunk aggregates in chunk order, a few rows at a time (never all at once). */
async function mergeStoredChunks(m: EntityManager, auditId: number, options: AuditOptions): Promise<AuditAggregate> {
  let merged = emptyAggregate(options.engines)
  for (let from = 0; ; from += MERGE_BATCH) {
    const rows = (await m.query('SELECT aggregate FROM audit_chunks WHERE audit_id = ? ORDER BY chunk LIMIT ? OFFSET ?', [auditId, MERGE_BATCH, from])) as Array<{ aggregate: string }>
    for (const r of rows) merged = mergeAggregates(merged, JSON.parse(r.aggregate) as AuditAggregate)
    if (rows.length < MERGE_BATCH) return merged
  }
}

export type ChunkOutcome = 'stored' | 'completed' | 'skipped'

/**
 * Stores one chunk's aggregate (a chunk stored twice stays one row) and the progress in one
 * transaction; the chunk that completes the set also stores the merged report.
 * Skipped when the audit has been cancelled, has failed or is gone meanwhile.
 */
export async function recordChunk(ds: DataSource, auditId: number, chunk: number, aggregateJson: string): Promise<ChunkOutcome> {
  return ds.transaction(async (m) => {
    const [a] = (await m.query('SELECT status, options, chunk_count AS chunkCount FROM audits WHERE id = ? FOR UPDATE', [auditId])) as Array<{ status: AuditStatus; options: string; chunkCount: number }>
    if (!a || !ACTIVE.has(a.status)) return 'skipped'
    await m.query('INSERT INTO audit_chunks (audit_id, chunk, aggregate) VALUES (?, ?, ?) ON DUPLICATE KEY UPDATE chunk = chunk', [auditId, chunk, aggregateJson])
    const [{ n }] = (await m.query('SELECT COUNT(*) AS n FROM audit_chunks WHERE audit_id = ?', [auditId])) as Array<{ n: number }>
    const done = Number(n)
    const now = new Date()
    if (done < Number(a.chunkCount)) {
      await m.query("UPDATE audits SET chunks_done = ?, status = 'running', started_at = COALESCE(started_at, ?) WHERE id = ?", [done, now, auditId])
      return 'stored'
    }
    const report = await mergeStoredChunks(m, auditId, JSON.parse(a.options) as AuditOptions)
    await m.query(
      "UPDATE audits SET chunks_done = ?, status = 'completed', report = ?, started_at = COALESCE(started_at, ?), finished_at = ? WHERE id = ?",
      [done, JSON.stringify(report), now, now, auditId],
    )
    return 'completed'
  })
}

/** Marks an active audit failed (a chunk failed on every attempt); its other chunks then skip. */
export async function failAudit(ds: DataSource, auditId: number, message: string): Promise<void> {
  await ds.transaction((m) =>
    m.query("UPDATE audits SET status = 'failed', error = ?, finished_at = ? WHERE id = ? AND status IN ('queued', 'running')", [message.slice(0, ERROR_CHARS), new Date(), auditId]),
  )
}
