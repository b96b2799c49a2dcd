import { join } from 'node:path'
import { ROOT_DIR } from '../app'
import { runUntilSignal } from '../index'
import { buildClientIfStale } from './client-build'

/** `npm start`: MariaDB, migrations, demo data, the client built when stale, one server. */
const clientDir = join(ROOT_DIR, 'dist')
try {
  buildClientIfStale(ROOT_DIR, clientDir, (l) => console.log(`[rootcast] ${l}`))
  await runUntilSignal({ clientDir })
} catch (err) {
  console.error(`[rootcast] could not start: ${err instanceof Error ? err.message : String(err)}`)
  process.exit(1)
}
