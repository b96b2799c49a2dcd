import { describe, expect, it } from 'vitest'
import { effectScope } from 'vue'
import { parsePathData, type Hit } from '../../shared/geometry'
import { computeLiveHits } from '../../src/canvas/live-hits'
import { geometryOf, type ScenePath } from '../../src/composables/useCanvasScene'
import { useServerCheck } from '../../src/composables/useServerCheck'
import { parseEditPath } from '../../src/canvas/edit-path'
import type { SheetPath } from '../../src/stores/canvas'
import { jsonResponse, stubFetch } from './fetch-stub'

// A 10 × 10 square; a horizontal ray from its centre leaves through x = 10 once (hand-worked).
const SQUARE = 'M0 0 L10 0 L10 10 L0 10 Z'

function scenePath(): ScenePath {
  const parsed = parseEditPath(SQUARE)
  if (!parsed.ok) throw new Error(parsed.message)
  const sheet = { key: 'path-1', pathId: 1, name: 'Square', revision: 1, fillRule: 'nonzero', units: 'px', origin: 'drawn', metadata: null, visible: true, saved: parsed.path, edit: parsed.path } satisfies SheetPath
  return { sheet, geometry: geometryOf(parsed.path) }
}

const probes = [{ id: 'probe-1', type: 'ray' as const, a: [5, 5] as const, b: [1, 0] as const }]

async function check(serverHits: (live: Hit[]) => Hit[]) {
  const path = scenePath()
  const live = computeLiveHits([{ key: 'path-1', path: path.geometry.path }], probes, [])
  const liveHits = live.lines[0].perPath[0].hits as Hit[]
  const fetch = stubFetch({ 'POST /api/v1/intersect': () => jsonResponse(200, { segments: 4, results: [{ hits: serverHits(liveHits) }] }) })
  const scope = effectScope()
  const checker = scope.run(() => useServerCheck())!
  checker.schedule([path], live, 0)
  await expect.poll(() => checker.state.value.status).not.toMatch(/idle|checking/)
  scope.stop()
  return { state: checker.state.value, calls: fetch.calls, liveHits }
}

describe('the server check of live hits', () => {
  it('sends the edited path data and every line, and reports agreement', async () => {
    const { state, calls, liveHits } = await check((live) => live)
    expect(liveHits).toHaveLength(1)
    expect(liveHits[0].point).toEqual([10, 5])
    expect(calls[0].body).toEqual({ path: 'M 0 0 L 10 0 L 10 10 L 0 10 Z', probes: [{ type: 'ray', origin: [5, 5], direction: [1, 0] }] })
    expect(state).toEqual({ status: 'agrees', hits: 1 })
  })

  it('shows a hit the server puts more than 1e-9 of the path size away as moved', async () => {
    // Path size: the diagonal, 10·√2; 1e-9 of it is ≈ 1.4e-8, so 1e-7 is beyond and 1e-10 within.
    const far = await check((live) => live.map((h) => ({ ...h, point: [h.point[0], h.point[1] + 1e-7] as [number, number] })))
    expect(far.state.status).toBe('differs')
    if (far.state.status !== 'differs') return
    expect(far.state.differences.map((d) => d.difference.kind)).toEqual(['moved'])
    expect(far.state.differences[0].lineId).toBe('probe-1')
    const near = await check((live) => live.map((h) => ({ ...h, point: [h.point[0], h.point[1] + 1e-10] as [number, number] })))
    expect(near.state).toEqual({ status: 'agrees', hits: 1 })
  })

  it('names a hit missing on the server and a kind the server sees otherwise', async () => {
    const missing = await check(() => [])
    expect(missing.state.status === 'differs' && missing.state.differences.map((d) => d.difference.kind)).toEqual(['missing-on-server'])
    const kind = await check((live) => live.map((h) => ({ ...h, kind: 'tangent' as const, winding: 0 as const })))
    expect(kind.state.status === 'differs' && kind.state.differences.map((d) => d.difference.kind)).toEqual(['kind'])
  })

  it('keeps the parser and the scene in step: the square has four segments', () => {
    const parsed = parsePathData(SQUARE)
    expect(parsed.ok && parsed.path.segments.length).toBe(4)
    expect(scenePath().geometry.size).toBeCloseTo(Math.SQRT2 * 10, 12)
  })
})
