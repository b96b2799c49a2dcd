import { computed, shallowRef, watchEffect } from 'vue'
import type { Bounds, Diagnostic, Hit, NormalisedPath, Probe } from '../../shared/geometry'
import { diagnosePath, parsePathData } from '../../shared/geometry'
import { serializeEditPath } from '../canvas/edit-path'
import { computeLiveHits, type LiveResult } from '../canvas/live-hits'
import { pathBounds, pathSize } from '../canvas/probe-geometry'
import type { CanvasProbe, EditPath } from '../canvas/types'
import type { SheetPath, useCanvasStore } from '../stores/canvas'

/** What the canvas draws and measures for one state of a path's edit. */
export interface SceneGeometry {
  readonly data: string
  readonly path: NormalisedPath
  readonly bounds: Bounds | null
  readonly size: number
  readonly diagnostics: readonly Diagnostic[]
}

/** One hit of one line on one path, flattened for the table, the markers and the hover card. */
export interface FlatHit {
  /** `${lineId}|${pathKey}|${index}`: stable while the hits stay the same. */
  readonly key: string
  readonly lineId: string
  readonly pathKey: string
  readonly index: number
  readonly hit: Hit
  readonly probe: Probe
  readonly sweep: boolean
}

/** A person-readable name of a probe or sweep line: "Ray 1", "Sweep 2 #5" (rows count from 0). */
export function lineLabel(lineId: string, probes: readonly CanvasProbe[]): string {
  const [id, row] = lineId.split('#')
  const number = id.replace(/^\D+-/, '')
  if (row !== undefined) return `Sweep ${number} #${row}`
  const probe = probes.find((p) => p.id === id)
  const type = probe ? probe.type[0].toUpperCase() + probe.type.slice(1) : 'Probe'
  return `${type} ${number}`
}

export interface ScenePath {
  readonly sheet: SheetPath
  readonly geometry: SceneGeometry
}

const EMPTY_PATH: NormalisedPath = { segments: [], subpaths: [] }

// Edits are immutable, so one analysis per EditPath object serves every frame that shows it.
const geometryCache = new WeakMap<EditPath, SceneGeometry>()

/** Path data, normalised segments, bounds and diagnostics of an edit, computed once per edit object. */
export function geometryOf(edit: EditPath): SceneGeometry {
  const cached = geometryCache.get(edit)
  if (cached) return cached
  const data = serializeEditPath(edit)
  const parsed = data.trim() === '' ? null : parsePathData(data)
  const path = parsed?.ok ? parsed.path : EMPTY_PATH
  const geometry: SceneGeometry = {
    data,
    path,
    bounds: pathBounds(path),
    size: pathSize(path),
    diagnostics: path.segments.length > 0 ? diagnosePath(path) : [],
  }
  geometryCache.set(edit, geometry)
  return geometry
}

function unionBounds(list: readonly (Bounds | null)[]): Bounds | null {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity
  for (const b of list) {
    if (!b) continue
    minX = Math.min(minX, b[0]); minY = Math.min(minY, b[1])
    maxX = Math.max(maxX, b[2]); maxY = Math.max(maxY, b[3])
  }
  return minX <= maxX ? [minX, minY, maxX, maxY] : null
}

/**
 * The scene of the canvas, derived from the store: the visible paths with their geometry,
 * and the hits of every probe and sweep line on them, solved in the browser by the shared
 * closed-form core on every change (no request per frame). `lastComputeMs` is the time the
 * latest hit computation took (shown on screen and read by the browser benchmark).
 */
export function useCanvasScene(store: ReturnType<typeof useCanvasStore>) {
  const paths = computed<ScenePath[]>(() =>
    store.sheets.filter((s) => s.visible).map((sheet) => ({ sheet, geometry: geometryOf(sheet.edit) })),
  )
  const active = computed<ScenePath | null>(() => {
    const sheet = store.active
    return sheet ? { sheet, geometry: geometryOf(sheet.edit) } : null
  })
  const bounds = computed(() => unionBounds(paths.value.map((p) => p.geometry.bounds)))

  const live = shallowRef<LiveResult>({ lines: [] })
  const lastComputeMs = shallowRef(0)
  watchEffect(() => {
    const input = paths.value.map((p) => ({ key: p.sheet.key, path: p.geometry.path }))
    const started = performance.now()
    live.value = computeLiveHits(input, store.probes, store.sweeps)
    lastComputeMs.value = performance.now() - started
    // The browser benchmark (tests/bench/canvas-browser.ts) collects every figure when it sets this array.
    ;(globalThis as { __rootcastHitTimings?: number[] }).__rootcastHitTimings?.push(lastComputeMs.value)
  })

  const hitCount = computed(() => live.value.lines.reduce((n, line) => n + line.perPath.reduce((m, p) => m + p.hits.length, 0), 0))

  const flatHits = computed<FlatHit[]>(() => {
    const out: FlatHit[] = []
    for (const line of live.value.lines) {
      for (const per of line.perPath) {
        per.hits.forEach((hit, index) => {
          out.push({ key: `${line.lineId}|${per.pathKey}|${index}`, lineId: line.lineId, pathKey: per.pathKey, index, hit, probe: line.probe, sweep: line.sweepId !== null })
        })
      }
    }
    return out
  })

  return { paths, active, bounds, live, lastComputeMs, hitCount, flatHits }
}

export type CanvasScene = ReturnType<typeof useCanvasScene>
