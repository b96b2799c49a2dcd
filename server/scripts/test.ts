import { spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import { ROOT_DIR } from '../app'
import { CHROMIUM, MARIADB_SERVER, REDIS_SERVER, ensureProgram } from './system-packages'

/**
 * `npm test`: installs what the tests need from Debian when missing (as root), type-checks,
 * builds the client for the browser tests, and runs every Vitest project: the geometry
 * core, the client components, the API against a throwaway MariaDB and the browser tests
 * in Chromium. The MariaDB and Redis instances are started and removed by Vitest's global set-up.
 */
const started = Date.now()
const outDir = join(ROOT_DIR, 'test-output')
mkdirSync(outDir, { recursive: true })
const bin = (name: string) => join(ROOT_DIR, 'node_modules', '.bin', name)

function step(title: string, cmd: string, args: string[], env: NodeJS.ProcessEnv = process.env): number {
  console.log(`\n[rootcast test] ${title}`)
  const r = spawnSync(cmd, args, { cwd: ROOT_DIR, stdio: 'inherit', env })
  return r.status ?? 1
}

try {
  ensureProgram(MARIADB_SERVER)
  ensureProgram(REDIS_SERVER)
  process.env.ROOTCAST_CHROMIUM = ensureProgram(CHROMIUM)
} catch (err) {
  console.error(`[rootcast test] ${err instanceof Error ? err.message : String(err)}`)
  process.exit(1)
}

if (step('type-check (vue-tsc -b)', bin('vue-tsc'), ['-b', '--noEmit']) !== 0) {
  console.error('[rootcast test] type errors: fix them first')
  process.exit(1)
}

const clientDir = join(ROOT_DIR, 'node_modules', '.tmp', 'test-client')
if (step('build the client for the browser tests', bin('vite'), ['build', '--outDir', clientDir, '--emptyOutDir', '--logLevel', 'warn']) !== 0) {
  process.exit(1)
}

const report = join(outDir, 'vitest-report.json')
rmSync(report, { force: true })
const status = step('vitest run (core, client, server, e2e)', bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`], {
  ...process.env,
  ROOTCAST_TEST_CLIENT_DIR: clientDir,
})

let summary = 'no test report was written'
if (existsSync(report)) {
  const r = JSON.parse(readFileSync(report, 'utf8')) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTodoTests: number }
  summary = `${r.numPassedTests} passed, ${r.numFailedTests} failed, ${r.numPendingTests + r.numTodoTests} skipped`
  if (r.numPassedTests === 0 && status === 0) {
    console.error('[rootcast test] no test ran')
    process.exit(1)
  }
}
console.log(`\n[rootcast test] finished in ${((Date.now() - started) / 1000).toFixed(0)} s`)
console.log(`Tests: ${summary}`)
process.exit(status)
