import { createRequire } from 'node:module'
import { availableParallelism } from 'node:os'
import { pathToFileURL } from 'node:url'
import { Worker, type Job } from 'bullmq'
import Piscina from 'piscina'
import type { DataSource } from 'typeorm'
import { chunkWork, failAudit, recordChunk, type ChunkOutcome } from '../services/audits.service'
import { AUDIT_QUEUE_NAME, DEFAULT_QUEUE_PREFIX, redisConnection, type AuditChunkJob } from './audit-queue'
import type { AuditChunkTask } from './audit-thread'

/**
 * A BullMQ worker for audit chunks. The event loop only moves data: each chunk is computed in
 * a piscina pool of worker threads (one per core by default) and its aggregate stored in
 * MariaDB by an idempotent upsert, so a chunk run twice (after a crash, a stall, a retry)
 * leaves one row and the same report.
 */

/**
 * How long a chunk stays locked to its worker without a renewal. BullMQ renews it every half
 * period while the chunk runs (the thread pool leaves the event loop free to do so), so it only
 * bounds how long a crashed worker's chunk waits before another worker takes it up.
 */
export const DEFAULT_LOCK_MS = 10_000
/** A chunk found stalled this often (its workers died each time) fails the audit. */
const MAX_STALLED = 5
/** A graceful close waits this long for running chunks before it stops them. */
const GRACEFUL_CLOSE_MS = 15_000

/** The threads (and worker processes) load the TypeScript sources through tsx's loader, under tsx and under Vitest alike. */
export const TSX_LOADER_URL = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href
const threadFile = new URL('./audit-thread.ts', import.meta.url).href

export interface AuditWorkerOptions {
  redisUrl: string
  dataSource: DataSource
  /** BullMQ key prefix (the queue's). */
  prefix?: string
  /** Worker threads, and chunks taken up at once (default: the cores available). */
  threads?: number
  lockMs?: number
  log?: (line: string) => void
}

export interface AuditWorker {
  readonly worker: Worker<AuditChunkJob, ChunkOutcome | 'skipped'>
  /** Stops taking up chunks; graceful waits for running ones (bounded), force abandons them to be retried elsewhere. */
  close(force?: boolean): Promise<void>
}

function messageOf(err: unknown): string {
  return err instanceof Error ? err.message : String(err)
}

export function startAuditWorker(opts: AuditWorkerOptions): AuditWorker {
  const ds = opts.dataSource
  const threads = opts.threads ?? availableParallelism()
  const lockMs = opts.lockMs ?? DEFAULT_LOCK_MS
  const log = opts.log ?? (() => {})
  const pool = new Piscina<AuditChunkTask, string>({
    filename: threadFile,
    minThreads: threads,
    maxThreads: threads,
    execArgv: ['--import', TSX_LOADER_URL],
  })
  let closing = false

  async function processChunk(job: Job<AuditChunkJob>): Promise<ChunkOutcome | 'skipped'> {
    const { auditId, chunk } = job.data
    try {
      const work = await chunkWork(ds, auditId, chunk)
      if (!work) return 'skipped'
      const aggregateJson = await pool.run(work)
      return await recordChunk(ds, auditId, chunk, aggregateJson)
    } catch (err) {
      const lastAttempt = job.attemptsMade + 1 >= (job.opts.attempts ?? 1)
      if (lastAttempt && !closing) {
        log(`audit ${auditId} chunk ${chunk} failed on its last attempt: ${messageOf(err)}`)
        await failAudit(ds, auditId, `Chunk ${chunk + 1} failed: ${messageOf(err)}`)
      }
      throw err
    }
  }

  const worker = new Worker<AuditChunkJob, ChunkOutcome | 'skipped'>(AUDIT_QUEUE_NAME, processChunk, {
    connection: redisConnection(opts.redisUrl, true),
    prefix: opts.prefix ?? DEFAULT_QUEUE_PREFIX,
    concurrency: threads,
    lockDuration: lockMs,
    stalledInterval: lockMs,
    maxStalledCount: MAX_STALLED,
  })
  worker.on('error', (err) => log(`worker error: ${messageOf(err)}`))
  worker.on('failed', (job, err) => {
    if (job && !closing) log(`audit ${job.data.auditId} chunk ${job.data.chunk}: attempt ${job.attemptsMade} failed: ${messageOf(err)}`)
  })
  worker.on('completed', (job, outcome) => {
    if (outcome === 'completed') log(`audit ${job.data.auditId} completed`)
  })

  return {
    worker,
    async close(force = false) {
      closing = true
      if (force) await worker.close(true)
      else {
        let timer: NodeJS.Timeout | undefined
        const graceful = worker.close().then(() => 'closed' as const)
        const late = new Promise<'late'>((r) => (timer = setTimeout(() => r('late'), GRACEFUL_CLOSE_MS)))
        if ((await Promise.race([graceful, late])) === 'late') await worker.close(true)
        clearTimeout(timer)
      }
      await pool.destroy()
    },
  }
}
