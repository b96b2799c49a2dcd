import { type ChildProcess, spawn } from 'node:child_process'
import { existsSync, openSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'

/**
 * What the private MariaDB and Redis instances share: a data folder of their own, a Unix
 * socket inside it (so a running server is found by its socket, never mistaken for another
 * program on the same port), an owner pid file, and the adopt-or-share rule.
 */

/** Linux's limit for a Unix socket path is 108 bytes (sun_path); keep a margin. */
const SOCKET_PATH_MAX_BYTES = 100
/** A fresh MariaDB data folder starts in about 0.7 s here; a minute covers slow disks. */
const READY_TIMEOUT_MS = 60_000
const READY_POLL_MS = 100

export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0

/** A private instance as a command sees it. */
export interface PrivateInstance {
  /** The URL clients connect with (for MariaDB: the application user on the application database). */
  readonly url: string
  /** True when this process owns the server (started it, or adopted an orphan) and stops it on exit. */
  readonly startedHere: boolean
  /** started: launched now; adopted: found running after its starter died; shared: another live command owns it. */
  readonly state: 'started' | 'adopted' | 'shared'
  readonly socket: string
  /** Shuts the server down (waits until it has exited). */
  stop(): Promise<void>
}

const stateWords: Record<PrivateInstance['state'], string> = {
  started: 'started',
  adopted: 'found running (left by a stopped server); adopted',
  shared: 'already running (shared)',
}

/** "MariaDB started on 127.0.0.1:3307 (data in .data/mariadb)", for the start log. */
export function describeInstance(label: string, instance: PrivateInstance, port: number, dataFolder: string): string {
  return `${label} ${stateWords[instance.state]} on 127.0.0.1:${port} (data in ${dataFolder})`
}

/** The socket path inside the data folder, refused when it is too long for the kernel. */
export function socketPathIn(dataDir: string, name: string): string {
  const p = join(dataDir, name)
  if (Buffer.byteLength(p) > SOCKET_PATH_MAX_BYTES) throw new Error(`The data folder path is too long for a Unix socket: ${p}`)
  return p
}

export function readPid(file: string): number | undefined {
  if (!existsSync(file)) return undefined
  const pid = Number(readFileSync(file, 'utf8').trim())
  return Number.isInteger(pid) && pid > 0 ? pid : undefined
}

export function isAlive(pid: number | undefined): boolean {
  if (pid === undefined) return false
  try {
    process.kill(pid, 0)
    return true
  } catch {
    return false
  }
}

/**
 * For an instance found running: when the command that started it is gone (killed), this
 * process adopts it and stops it on exit; otherwise it only shares it.
 */
export function adoptOrShare(ownerFile: string): 'adopted' | 'shared' {
  if (isAlive(readPid(ownerFile))) return 'shared'
  writeFileSync(ownerFile, String(process.pid))
  return 'adopted'
}

/** Marks this process as the owner of an instance it has just started. */
export function claimOwner(ownerFile: string): void {
  writeFileSync(ownerFile, String(process.pid))
}

/**
 * Starts a server detached from our process group: Ctrl-C reaches our process, which shuts
 * the server down in order; a server left by a killed process is found and reused next time.
 */
export function spawnDetached(program: string, args: string[], outFile: string): ChildProcess {
  const out = openSync(outFile, 'a')
  const child = spawn(program, args, { detached: true, stdio: ['ignore', out, out] })
  child.unref()
  return child
}

function lastLines(file: string, count: number): string {
  return existsSync(file) ? readFileSync(file, 'utf8').split('\n').slice(-count).join('\n') : '(no log)'
}

/** Polls `ready` until it answers true; stops early when the child has exited. */
export async function waitUntilReady(
  label: string,
  ready: () => boolean | Promise<boolean>,
  logFile: string,
  child: { exitCode: number | null },
): Promise<void> {
  const deadline = Date.now() + READY_TIMEOUT_MS
  while (Date.now() < deadline) {
    if (await ready()) return
    if (child.exitCode !== null) break
    await new Promise((r) => setTimeout(r, READY_POLL_MS))
  }
  throw new Error(`${label} did not start. Last lines of ${logFile}:\n${lastLines(logFile, 25)}`)
}
