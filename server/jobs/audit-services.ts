import { type ChildProcess, spawn } from 'node:child_process'
import { join } from 'node:path'
import { ROOT_DIR } from '../app'
import type { Config } from '../config'
import { describeInstance } from '../scripts/private-service'
import { startRedis, type RedisInstance } from '../scripts/redis'
import { createAuditQueue, type AuditQueue } from './audit-queue'
import { TSX_LOADER_URL } from './audit-worker'

/**
 * What `npm start` runs for audits beside the server: Redis (the configured one, or the
 * private instance in the data folder) and one worker process, both stopped with the server.
 * Further workers are `npm run worker` on any machine that reaches the same Redis and MariaDB.
 */
export interface AuditServices {
  readonly queue: AuditQueue
  readonly redisUrl: string
  stop(): Promise<void>
}

/** A worker finishes its running chunks on SIGTERM (bounded in worker.ts); then it is killed. */
const WORKER_STOP_MS = 20_000

/**
 * Starts `server/worker.ts` as a child process, as `npm run worker` does; its output goes to
 * ours unless piped. Node runs it directly with tsx's loader (the tsx command would put a
 * process of its own in between, which a kill would not reach past).
 */
export function spawnWorkerProcess(env: NodeJS.ProcessEnv, output: 'inherit' | 'pipe' = 'inherit'): ChildProcess {
  return spawn(process.execPath, ['--import', TSX_LOADER_URL, 'server/worker.ts'], {
    cwd: ROOT_DIR,
    // The server tsconfig gives the entities their decorators.
    env: { ...env, TSX_TSCONFIG_PATH: join(ROOT_DIR, 'server', 'tsconfig.json') },
    // The IPC channel closes when this process dies, however it dies; the worker then stops too.
    stdio: ['ignore', output, output, 'ipc'],
  })
}

/** SIGTERM, then SIGKILL if the process has not exited in time; resolves once it has exited. */
export async function stopChildProcess(child: ChildProcess, graceMs = WORKER_STOP_MS): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return
  const exited = new Promise<void>((r) => child.once('exit', () => r()))
  child.kill('SIGTERM')
  const timer = setTimeout(() => child.kill('SIGKILL'), graceMs)
  await exited
  clearTimeout(timer)
}

export async function startAuditServices(opts: {
  config: Config
  /** The data folder of the private instances (.data). */
  dataDir: string
  databaseUrl: string
  /** Start one worker process beside the server (default true). */
  worker?: boolean
  log: (line: string) => void
}): Promise<AuditServices> {
  const { config, log } = opts
  let redis: RedisInstance | undefined
  let redisUrl = config.audits.redisUrl
  if (!redisUrl) {
    redis = await startRedis({ dataDir: join(opts.dataDir, 'redis'), port: config.audits.redisPort })
    log(describeInstance('Redis', redis, config.audits.redisPort, '.data/redis'))
    redisUrl = redis.url
  }
  const queue = createAuditQueue({ redisUrl, prefix: config.audits.queuePrefix })
  let stopping = false
  let worker: ChildProcess | undefined
  if (opts.worker !== false) {
    worker = spawnWorkerProcess({ ...process.env, DATABASE_URL: opts.databaseUrl, ROOTCAST_REDIS_URL: redisUrl })
    worker.once('exit', (code, signal) => {
      if (!stopping) log(`the audit worker stopped (${signal ?? `exit code ${code}`}); audits wait until a worker runs (npm run worker)`)
    })
  }
  return {
    queue,
    redisUrl,
    async stop() {
      stopping = true
      if (worker) await stopChildProcess(worker)
      await queue.close()
      if (redis?.startedHere) {
        log('stopping Redis')
        await redis.stop()
      }
    },
  }
}
