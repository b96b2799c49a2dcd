import { execFileSync, spawnSync } from 'node:child_process'
import { existsSync } from 'node:fs'

/** A program that Rootcast needs from Debian's packages. */
export interface SystemProgram {
  /** What the program is, for messages. */
  readonly label: string
  /** Candidate executables; the first that exists is used. */
  readonly paths: readonly string[]
  /** The Debian package that brings it. */
  readonly debianPackage: string
}

export const MARIADB_SERVER: SystemProgram = {
  label: 'MariaDB server',
  paths: ['/usr/sbin/mariadbd', '/usr/bin/mariadbd'],
  debianPackage: 'mariadb-server',
}

export const REDIS_SERVER: SystemProgram = {
  label: 'Redis server',
  paths: ['/usr/bin/redis-server'],
  debianPackage: 'redis-server',
}

export const CHROMIUM: SystemProgram = {
  label: 'Chromium',
  paths: ['/usr/bin/chromium'],
  debianPackage: 'chromium',
}

export function findProgram(p: SystemProgram): string | undefined {
  return p.paths.find((candidate) => existsSync(candidate))
}

let aptUpdated = false

/**
 * Returns the program's path, installing its Debian package first when it is missing and
 * this process runs as root. Otherwise stops with one sentence that names the package.
 */
export function ensureProgram(p: SystemProgram): string {
  const found = findProgram(p)
  if (found) return found
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0
  if (!isRoot || !existsSync('/usr/bin/apt-get')) {
    throw new Error(
      `${p.label} is not installed: install the Debian package "${p.debianPackage}" (sudo apt-get install ${p.debianPackage}) and run the command again.`,
    )
  }
  console.log(`[rootcast] ${p.label} is missing; installing the Debian package ${p.debianPackage} with apt-get…`)
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  if (!aptUpdated) {
    execFileSync('apt-get', ['update'], { stdio: ['ignore', 'ignore', 'inherit'], env })
    aptUpdated = true
  }
  const r = spawnSync('apt-get', ['install', '-y', p.debianPackage], {
    stdio: ['ignore', 'ignore', 'inherit'],
    env,
  })
  const installed = findProgram(p)
  if (r.status !== 0 || !installed) {
    throw new Error(`Installing ${p.debianPackage} with apt-get failed; install it by hand and run the command again.`)
  }
  return installed
}
