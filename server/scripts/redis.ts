import { mkdirSync } from 'node:fs'
import { createConnection } from 'node:net'
import { join, resolve } from 'node:path'
import { adoptOrShare, claimOwner, isAlive, readPid, socketPathIn, spawnDetached, waitUntilReady, type PrivateInstance } from './private-service'
import { REDIS_SERVER, ensureProgram } from './system-packages'

/**
 * The life cycle of Rootcast's private Redis instance (the audit job queue), as for MariaDB
 * in mariadb.ts: Debian's redis-server with a project-local data folder, bound to 127.0.0.1
 * on its own port, plus a Unix socket in the data folder by which this code finds it.
 */
export interface RedisOptions {
  /** The instance's data folder (created on first use); the append-only file lives here. */
  readonly dataDir: string
  /** TCP port on 127.0.0.1. */
  readonly port: number
}

/** The instance; its url is the redis:// URL for BullMQ clients. */
export type RedisInstance = PrivateInstance

/** One command round trip is a few milliseconds on loopback; a second means no server. */
const COMMAND_TIMEOUT_MS = 1000
/** Redis writes the append-only file before it exits; a large queue may take a moment. */
const STOP_TIMEOUT_MS = 30_000
const STOP_POLL_MS = 50

/** Sends one inline command over the socket; resolves with the first reply line, or undefined when none came. */
function command(socket: string, line: string): Promise<string | undefined> {
  return new Promise((done) => {
    const c = createConnection({ path: socket })
    let reply = ''
    const finish = (value: string | undefined) => {
      clearTimeout(timer)
      c.destroy()
      done(value)
    }
    const timer = setTimeout(() => finish(undefined), COMMAND_TIMEOUT_MS)
    c.on('connect', () => c.write(`${line}\r\n`))
    c.on('data', (d) => {
      reply += d.toString('utf8')
      if (reply.includes('\r\n')) finish(reply.split('\r\n')[0])
    })
    c.on('error', () => finish(undefined))
    c.on('close', () => finish(reply ? reply.split('\r\n')[0] : undefined))
  })
}

const loopbackUrl = (port: number) => `redis://127.0.0.1:${port}`

async function ping(socket: string): Promise<boolean> {
  return (await command(socket, 'PING')) === '+PONG'
}

export async function startRedis(opts: RedisOptions): Promise<RedisInstance> {
  const server = ensureProgram(REDIS_SERVER)
  const dataDir = resolve(opts.dataDir)
  const socket = socketPathIn(dataDir, 'redis.sock')
  const logFile = join(dataDir, 'redis.log')
  const pidFile = join(dataDir, 'redis.pid')
  const ownerFile = join(dataDir, 'rootcast-owner.pid')
  let state: RedisInstance['state']

  if (await ping(socket)) {
    state = adoptOrShare(ownerFile)
  } else {
    mkdirSync(dataDir, { recursive: true })
    const child = spawnDetached(
      server,
      [
        // No configuration file: Debian's /etc/redis/redis.conf (system service settings) stays out.
        '--bind', '127.0.0.1',
        '--port', String(opts.port),
        // Bound to loopback only, so protected mode would add nothing but refusals of the socket's peers.
        '--protected-mode', 'no',
        '--unixsocket', socket,
        '--unixsocketperm', '700',
        '--dir', dataDir,
        // Jobs must survive a restart: every write goes to the append-only file (fsync once a second).
        '--appendonly', 'yes',
        '--appendfsync', 'everysec',
        // BullMQ needs its keys kept: evicting them under memory pressure would lose jobs.
        '--maxmemory-policy', 'noeviction',
        '--daemonize', 'no',
        '--pidfile', pidFile,
        '--logfile', logFile,
      ],
      join(dataDir, 'redis-server.out'),
    )
    await waitUntilReady('Redis', () => ping(socket), logFile, child)
    claimOwner(ownerFile)
    state = 'started'
  }

  return {
    url: loopbackUrl(opts.port),
    startedHere: state !== 'shared',
    state,
    socket,
    stop: () => stopRedis(socket, pidFile),
  }
}

/** SHUTDOWN flushes the append-only file and exits; waits until the process is gone. */
export async function stopRedis(socket: string, pidFile: string): Promise<void> {
  const pid = readPid(pidFile)
  if (!(await ping(socket))) return
  await command(socket, 'SHUTDOWN')
  const deadline = Date.now() + STOP_TIMEOUT_MS
  while (Date.now() < deadline && (isAlive(pid) || (await ping(socket)))) await new Promise((r) => setTimeout(r, STOP_POLL_MS))
}

/** The URL of a private instance that some other command has started; undefined when none runs there. */
export async function findRedis(opts: RedisOptions): Promise<string | undefined> {
  return (await ping(socketPathIn(resolve(opts.dataDir), 'redis.sock'))) ? loopbackUrl(opts.port) : undefined
}
