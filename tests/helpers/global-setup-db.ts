import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { TestProject } from 'vitest/node'
import { startMariadb } from '../../server/scripts/mariadb'
import { startRedis } from '../../server/scripts/redis'
import { freePort } from './free-port'

declare module 'vitest' {
  export interface ProvidedContext {
    /** URL of the throwaway MariaDB's application user; test files create their own databases. */
    databaseUrl: string
    /** URL of the throwaway Redis; test files use queue prefixes of their own. */
    redisUrl: string
  }
}

/**
 * Starts a throwaway MariaDB and Redis for the server and browser tests: their own temporary
 * data folders and ports on 127.0.0.1, removed when the run ends.
 */
export default async function setup(project: TestProject) {
  const dir = await mkdtemp(join(tmpdir(), 'rootcast-test-'))
  const instance = await startMariadb({ dataDir: join(dir, 'mariadb'), port: await freePort(), database: 'rctest' })
  project.provide('databaseUrl', instance.url)
  const redis = await startRedis({ dataDir: join(dir, 'redis'), port: await freePort() })
  project.provide('redisUrl', redis.url)
  return async () => {
    await redis.stop()
    await instance.stop()
    await rm(dir, { recursive: true, force: true })
  }
}
