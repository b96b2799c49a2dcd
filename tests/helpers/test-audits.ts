import { randomBytes } from 'node:crypto'
import type { DataSource } from 'typeorm'
import { inject } from 'vitest'
import { Queue } from 'bullmq'
import { AUDIT_QUEUE_NAME, chunkJobId, createAuditQueue, redisConnection, type AuditQueue } from '../../server/jobs/audit-queue'
import { startAuditWorker, type AuditWorker } from '../../server/jobs/audit-worker'

/**
 * Audit jobs in tests: the throwaway Redis of the global set-up, with a key prefix of the
 * test file's own so that files running side by side never take each other's jobs.
 */
export interface TestAuditJobs {
  readonly redisUrl: string
  readonly prefix: string
  readonly queue: AuditQueue
  /** A worker in this process (threads load the sources through tsx). */
  startWorker(ds: DataSource, opts?: { threads?: number; lockMs?: number }): AuditWorker
  /** How many of the audit's chunk jobs are in Redis (waiting, delayed or running). */
  jobCount(auditId: number, chunkCount: number): Promise<number>
  /** Closes the queue and every worker started here that is still open. */
  close(): Promise<void>
}

/** A short lock, so that a chunk of a worker stopped forcibly is taken up again within seconds. */
export const TEST_LOCK_MS = 1000

export function createTestAuditJobs(opts: { chunkSize?: number } = {}): TestAuditJobs {
  const redisUrl = inject('redisUrl')
  const prefix = `rctest-${randomBytes(4).toString('hex')}`
  const queue = createAuditQueue({ redisUrl, prefix, chunkSize: opts.chunkSize })
  const open = new Set<AuditWorker>()
  const inspector = new Queue(AUDIT_QUEUE_NAME, { connection: redisConnection(redisUrl, false), prefix })
  return {
    redisUrl,
    prefix,
    queue,
    startWorker(ds, w = {}) {
      const worker = startAuditWorker({ redisUrl, dataSource: ds, prefix, threads: w.threads ?? 2, lockMs: w.lockMs ?? TEST_LOCK_MS })
      const close = worker.close
      const tracked: AuditWorker = {
        worker: worker.worker,
        close: async (force) => {
          open.delete(tracked)
          await close(force)
        },
      }
      open.add(tracked)
      return tracked
    },
    async jobCount(auditId, chunkCount) {
      const found = await Promise.all(Array.from({ length: chunkCount }, (_, chunk) => inspector.getJob(chunkJobId(auditId, chunk))))
      return found.filter((j) => j !== undefined).length
    },
    async close() {
      for (const w of [...open]) await w.close(true)
      await queue.close()
      await inspector.close()
    },
  }
}

export interface AuditProgressRow {
  status: string
  done: number
  total: number
}

/** Audit status and progress straight from MariaDB. */
export async function auditProgress(ds: DataSource, auditId: number): Promise<AuditProgressRow> {
  const [r] = (await ds.query('SELECT status, chunks_done AS done, chunk_count AS total FROM audits WHERE id = ?', [auditId])) as Array<{ status: string; done: number; total: number }>
  if (!r) throw new Error(`audit ${auditId} is not in the database`)
  return { status: r.status, done: Number(r.done), total: Number(r.total) }
}

const POLL_MS = 25

/** Polls the audit until `until` holds; fails with the last state seen after `timeoutMs`. */
export async function waitForAudit(
  ds: DataSource,
  auditId: number,
  until: (p: AuditProgressRow) => boolean = (p) => p.status === 'completed',
  timeoutMs = 30_000,
): Promise<AuditProgressRow> {
  const deadline = Date.now() + timeoutMs
  let last = await auditProgress(ds, auditId)
  while (!until(last)) {
    if (Date.now() > deadline) throw new Error(`audit ${auditId} did not reach the expected state in ${timeoutMs} ms; last seen ${JSON.stringify(last)}`)
    await new Promise((r) => setTimeout(r, POLL_MS))
    last = await auditProgress(ds, auditId)
  }
  return last
}
