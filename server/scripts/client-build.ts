import { spawnSync } from 'node:child_process'
import { existsSync, readdirSync, statSync } from 'node:fs'
import { join } from 'node:path'

const SOURCES = ['src', 'shared', 'assets', 'fonts', 'index.html', 'vite.config.ts', 'package-lock.json']

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0
  const st = statSync(path)
  if (!st.isDirectory()) return st.mtimeMs
  let newest = st.mtimeMs
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)))
  return newest
}

/** Builds the client into `outDir` when it is missing or older than any client source. */
export function buildClientIfStale(root: string, outDir: string, log: (l: string) => void): void {
  const built = join(outDir, 'index.html')
  const sourcesTime = Math.max(...SOURCES.map((s) => newestMtime(join(root, s))))
  if (existsSync(built) && statSync(built).mtimeMs >= sourcesTime) return
  log(existsSync(built) ? 'client sources changed; rebuilding the client' : 'building the client')
  const r = spawnSync(join(root, 'node_modules', '.bin', 'vite'), ['build', '--outDir', outDir, '--emptyOutDir', '--logLevel', 'warn'], {
    cwd: root,
    stdio: 'inherit',
  })
  if (r.status !== 0) throw new Error('The client build failed (see above).')
}
