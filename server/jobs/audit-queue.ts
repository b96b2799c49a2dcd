import { Queue, type ConnectionOptions, type JobsOptions } from 'bullmq'

/**
 * The audit job queue on BullMQ over Redis. An audit is cut into chunks of paths; each chunk
 * is one job whose data names only the audit and the chunk (the worker reads the paths and
 * options from MariaDB), so a job is tiny and a chunk's result never travels through Redis.
 */
export const AUDIT_QUEUE_NAME = 'rootcast-audits'
/** The key prefix in Redis (ROOTCAST_QUEUE_PREFIX); tests give each file its own so they never share jobs. */
export const DEFAULT_QUEUE_PREFIX = 'rootcast'
/** Paths per chunk: 25 paths × 1,000 probes is a few seconds of work, short enough to lose little in a crash. */
export const DEFAULT_CHUNK_SIZE = 25

export interface AuditChunkJob {
  auditId: number
  chunk: number
}

/**
 * The job id of a chunk, so that adding a chunk that is already queued adds nothing.
 * BullMQ refuses `:` in custom ids (it separates its own key parts), hence the dash.
 */
export function chunkJobId(auditId: number, chunk: number): string {
  return `${auditId}-${chunk}`
}

/** Retries of a chunk whose processor threw, with backoff; the last failure fails the audit. */
export const CHUNK_ATTEMPTS = 3
const CHUNK_BACKOFF_MS = 1000
/** Enqueueing a large audit in bulk requests of this many jobs keeps each Redis call small. */
const ENQUEUE_BATCH = 500
/**
 * A reachable Redis answers in milliseconds; one that is down would hold the request for ever
 * (the client waits for its connection), so the server gives up after this and answers 503.
 */
export const QUEUE_CALL_TIMEOUT_MS = 5000

async function withinDeadline<T>(what: string, ms: number, work: Promise<T>): Promise<T> {
  let timer: NodeJS.Timeout | undefined
  const late = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`Redis did not answer ${what} within ${ms} ms`)), ms)
  })
  try {
    return await Promise.race([work, late])
  } finally {
    clearTimeout(timer)
  }
}

const chunkJobOptions: JobsOptions = {
  attempts: CHUNK_ATTEMPTS,
  backoff: { type: 'exponential', delay: CHUNK_BACKOFF_MS },
  // The results live in MariaDB; a finished job is only a key to remove. Removing it also
  // keeps its id free if the database is ever reset while Redis keeps its data.
  removeOnComplete: true,
  removeOnFail: true,
}

export interface AuditQueueOptions {
  redisUrl: string
  prefix?: string
  chunkSize?: number
  /** How long a call may wait for Redis (default QUEUE_CALL_TIMEOUT_MS). */
  callTimeoutMs?: number
}

export interface AuditQueue {
  /** Paths per chunk of audits created through this queue. */
  readonly chunkSize: number
  /** Adds one job per chunk (an already queued chunk is not added twice). */
  enqueue(auditId: number, chunkCount: number): Promise<void>
  /** Removes the audit's waiting and delayed jobs; running ones finish and find the audit cancelled. */
  remove(auditId: number, chunkCount: number): Promise<void>
  close(): Promise<void>
}

/** The connection settings shared by the queue and the workers. */
export function redisConnection(redisUrl: string, forWorker: boolean): ConnectionOptions {
  return forWorker
    ? // A worker waits for Redis to come back rather than give up (BullMQ requires null here).
      { url: redisUrl, maxRetriesPerRequest: null }
    : // The server answers 503 at once when Redis is away instead of holding the request.
      { url: redisUrl, enableOfflineQueue: false, maxRetriesPerRequest: 1 }
}

export function createAuditQueue(opts: AuditQueueOptions): AuditQueue {
  const queue = new Queue<AuditChunkJob>(AUDIT_QUEUE_NAME, {
    connection: redisConnection(opts.redisUrl, false),
    prefix: opts.prefix ?? DEFAULT_QUEUE_PREFIX,
  })
  // Connection errors surface as failed calls (503); the event only needs a listener.
  queue.on('error', () => {})
  const deadline = opts.callTimeoutMs ?? QUEUE_CALL_TIMEOUT_MS
  const chunks = (chunkCount: number) => Array.from({ length: chunkCount }, (_, chunk) => chunk)
  return {
    chunkSize: opts.chunkSize ?? DEFAULT_CHUNK_SIZE,
    async enqueue(auditId, chunkCount) {
      const all = chunks(chunkCount)
      for (let i = 0; i < all.length; i += ENQUEUE_BATCH) {
        const batch = all.slice(i, i + ENQUEUE_BATCH).map((chunk) => ({
          name: 'chunk',
          data: { auditId, chunk },
          opts: { ...chunkJobOptions, jobId: chunkJobId(auditId, chunk) },
        }))
        await withinDeadline('adding jobs', deadline, queue.addBulk(batch))
      }
    },
    async remove(auditId, chunkCount) {
      for (const chunk of chunks(chunkCount)) await withinDeadline('removing a job', deadline, queue.remove(chunkJobId(auditId, chunk)))
    },
    close: () => queue.close(),
  }
}
