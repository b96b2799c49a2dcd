import { type ChildProcess, spawn } from 'node:child_process'
import { join } from 'node:path'
import { ROOT_DIR } from '../app'
import { DATA_DIR, DEFAULT_DB_PORT } from '../index'
import { loadConfig } from '../config'
import { startMariadb } from './mariadb'
import { startRedis } from './redis'

/**
 * `npm run dev`: the same private MariaDB and Redis as `npm start`, the API server (with its audit worker) restarted on
 * change (tsx watch), and Vite's dev server with hot reload proxying /api to it.
 */
const port = Number(process.env.ROOTCAST_DB_PORT ?? DEFAULT_DB_PORT)
const db = process.env.DATABASE_URL ? undefined : await startMariadb({ dataDir: join(DATA_DIR, 'mariadb'), port, database: 'rootcast' })
const { audits } = loadConfig()
const redis = audits.redisUrl ? undefined : await startRedis({ dataDir: join(DATA_DIR, 'redis'), port: audits.redisPort })
const env = { ...process.env, DATABASE_URL: process.env.DATABASE_URL ?? db!.url, ROOTCAST_REDIS_URL: audits.redisUrl ?? redis!.url }
const bin = (name: string) => join(ROOT_DIR, 'node_modules', '.bin', name)
const children: ChildProcess[] = [
  spawn(bin('tsx'), ['watch', '--clear-screen=false', '--tsconfig', 'server/tsconfig.json', 'server/index.ts'], { cwd: ROOT_DIR, env, stdio: 'inherit' }),
  spawn(bin('vite'), [], { cwd: ROOT_DIR, env, stdio: 'inherit' }),
]
console.log('[rootcast] dev: open http://127.0.0.1:5173 (Vite, hot reload); API on http://127.0.0.1:' + (process.env.PORT ?? 5170))

let stopping = false
async function shutdown(code: number) {
  if (stopping) return
  stopping = true
  for (const c of children) c.kill('SIGTERM')
  await Promise.all(children.map((c) => (c.exitCode !== null ? null : new Promise((r) => c.once('exit', r)))))
  if (db?.startedHere) await db.stop()
  if (redis?.startedHere) await redis.stop()
  process.exit(code)
}
process.once('SIGINT', () => void shutdown(0))
process.once('SIGTERM', () => void shutdown(0))
for (const c of children) c.once('exit', (code) => void shutdown(code ?? 1))
