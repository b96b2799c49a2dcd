import { fork } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import type { FontImportResult, GlyphSelection } from './font-import'

/** An upload that takes longer than this to read is refused (healthy fonts take well under a second). */
export const FONT_READ_TIMEOUT_MS = 20_000
/** Heap of the reading process: enough for any real font, small enough that a runaway allocation ends there. */
const FONT_READ_HEAP_MB = 512

const childFile = fileURLToPath(new URL('./font-child.ts', import.meta.url))

/**
 * Reads glyphs of an untrusted font in a separate process with a timeout and a heap limit,
 * so that a damaged font can neither crash nor hang the server. Answers a refusal when the
 * reader dies or times out.
 */
export function importGlyphsIsolated(buffer: Uint8Array, selection: GlyphSelection, limit: number): Promise<FontImportResult> {
  return new Promise((resolve) => {
    const child = fork(childFile, [], {
      execArgv: ['--import', 'tsx', `--max-old-space-size=${FONT_READ_HEAP_MB}`],
      serialization: 'advanced',
      stdio: ['ignore', 'ignore', 'ignore', 'ipc'],
    })
    let settled = false
    const finish = (r: FontImportResult) => {
      if (settled) return
      settled = true
      clearTimeout(timer)
      if (child.exitCode === null) child.kill('SIGKILL')
      resolve(r)
    }
    const broken = (why: string): FontImportResult => ({ ok: false, code: 'invalid_font', message: `The font could not be read safely (${why}); it may be damaged.` })
    const timer = setTimeout(() => finish(broken('reading took too long')), FONT_READ_TIMEOUT_MS)
    child.once('message', (r) => finish(r as FontImportResult))
    child.once('error', () => finish(broken('the reader failed to start')))
    child.once('exit', (code, signal) => finish(broken(signal ? `the reader stopped on ${signal}` : `the reader exited with ${code}`)))
    child.send({ buffer, selection, limit })
  })
}
