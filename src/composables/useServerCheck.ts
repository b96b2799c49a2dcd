import { onBeforeUnmount, shallowRef } from 'vue'
import type { IntersectRequest } from '../../shared/api'
import { intersect } from '../api/compute'
import { toApiRequestError } from '../api/http'
import { compareHits, type HitDifference, type LiveResult } from '../canvas/live-hits'
import type { ScenePath } from './useCanvasScene'

export interface LineDifference {
  readonly lineId: string
  readonly pathKey: string
  readonly difference: HitDifference
}

export type ServerCheckState =
  | { readonly status: 'idle' }
  | { readonly status: 'checking' }
  | { readonly status: 'agrees'; readonly hits: number }
  | { readonly status: 'differs'; readonly hits: number; readonly differences: readonly LineDifference[] }
  | { readonly status: 'error'; readonly message: string }

/**
 * The server's second opinion: after a change settles (a drag released, a number typed), the
 * same probes go to POST /intersect for every visible path, and the answer is compared with
 * the hits the browser computed for that same state. Any hit farther apart than
 * SERVER_AGREEMENT_REL of the path's size, or differing in kind, winding or segment, is listed.
 * A newer check supersedes an older one (its answer is dropped).
 */
export function useServerCheck() {
  const state = shallowRef<ServerCheckState>({ status: 'idle' })
  let sequence = 0
  let controller: AbortController | null = null
  let timer: ReturnType<typeof setTimeout> | null = null

  async function run(paths: readonly ScenePath[], live: LiveResult): Promise<void> {
    const mine = ++sequence
    controller?.abort()
    controller = new AbortController()
    // The core's probe type is readonly; the request schema's is not (the same shape).
    const probes = live.lines.map((line) => line.probe) as IntersectRequest['probes']
    const withData = paths.filter((p) => p.geometry.path.segments.length > 0)
    if (probes.length === 0 || withData.length === 0) {
      state.value = { status: 'idle' }
      return
    }
    state.value = { status: 'checking' }
    try {
      const differences: LineDifference[] = []
      let hits = 0
      for (const p of withData) {
        const answer = await intersect({ path: p.geometry.data, probes }, controller.signal)
        if (mine !== sequence) return
        live.lines.forEach((line, i) => {
          const mineHits = line.perPath.find((per) => per.pathKey === p.sheet.key)?.hits ?? []
          hits += mineHits.length
          for (const difference of compareHits(mineHits, answer.results[i]?.hits ?? [], p.geometry.size)) {
            differences.push({ lineId: line.lineId, pathKey: p.sheet.key, difference })
          }
        })
      }
      state.value = differences.length === 0 ? { status: 'agrees', hits } : { status: 'differs', hits, differences }
    } catch (cause) {
      if (mine !== sequence) return
      const error = toApiRequestError(cause)
      if (error.name === 'AbortError') return
      state.value = { status: 'error', message: error.message }
    }
  }

  /** Checks after `delayMs` unless another schedule comes first. */
  function schedule(paths: readonly ScenePath[], live: LiveResult, delayMs = 200): void {
    if (timer) clearTimeout(timer)
    timer = setTimeout(() => {
      timer = null
      void run(paths, live)
    }, delayMs)
  }

  function cancel(): void {
    if (timer) clearTimeout(timer)
    timer = null
    sequence++
    controller?.abort()
    state.value = { status: 'idle' }
  }

  onBeforeUnmount(cancel)
  return { state, schedule, cancel }
}
