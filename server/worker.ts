import 'reflect-metadata'
import { join } from 'node:path'
import { availableParallelism } from 'node:os'
import { ConfigError, loadConfig } from './config'
import { createDataSource } from './data-source'
import { DATA_DIR, DEFAULT_DB_PORT } from './index'
import { startAuditWorker } from './jobs/audit-worker'
import { findMariadb } from './scripts/mariadb'
import { findRedis } from './scripts/redis'

/**
 * `npm run worker`: one audit worker process, with a pool of worker threads, against
 * DATABASE_URL and ROOTCAST_REDIS_URL, or, when they are not set, the private MariaDB and
 * Redis that `npm start` runs on this machine (found through their sockets in .data/).
 * Start it on as many machines as reach the same MariaDB and Redis: each takes up chunks.
 * `npm start` runs one itself, as a child process.
 */
const log = (line: string) => console.log(`[rootcast worker ${process.pid}] ${line}`)

async function main(): Promise<void> {
  const config = loadConfig(process.env, 'worker')
  const databaseUrl =
    config.databaseUrl ??
    findMariadb({ dataDir: join(DATA_DIR, 'mariadb'), port: Number(process.env.ROOTCAST_DB_PORT ?? DEFAULT_DB_PORT), database: 'rootcast' })
  const redisUrl = config.audits.redisUrl ?? (await findRedis({ dataDir: join(DATA_DIR, 'redis'), port: config.audits.redisPort }))
  if (!databaseUrl || !redisUrl) {
    throw new ConfigError(
      `no ${!databaseUrl ? 'DATABASE_URL' : 'ROOTCAST_REDIS_URL'} is set and no private ${!databaseUrl ? 'MariaDB' : 'Redis'} runs in .data/: ` +
        'run `npm start` on this machine first, or set DATABASE_URL and ROOTCAST_REDIS_URL to the servers that `npm start` uses.',
    )
  }
  const ds = createDataSource(databaseUrl)
  await ds.initialize()
  const threads = config.audits.threads ?? availableParallelism()
  const worker = startAuditWorker({ redisUrl, dataSource: ds, prefix: config.audits.queuePrefix, threads, lockMs: config.audits.lockMs, log })
  log(`taking up audit chunks from ${new URL(redisUrl).host} with ${threads} thread${threads === 1 ? '' : 's'}`)

  let stopping = false
  const stop = async (sig: string) => {
    if (stopping) return
    stopping = true
    log(`${sig}: finishing the running chunks`)
    await worker.close()
    await ds.destroy()
    process.exit(0)
  }
  // `on`, not `once`: a repeated signal must not cut the shutdown short (see server/index.ts).
  process.on('SIGINT', () => void stop('SIGINT'))
  process.on('SIGTERM', () => void stop('SIGTERM'))
  // Started by a server (npm start): stop with it, even when it was killed outright.
  if (process.send) process.once('disconnect', () => void stop('the server that started this worker is gone'))
}

main().catch((err) => {
  console.error(`[rootcast worker] could not start: ${err instanceof Error ? err.message : String(err)}`)
  process.exit(1)
})
