import { createPinia, setActivePinia } from 'pinia'
import { isProxy } from 'vue'
import { beforeEach, describe, expect, it } from 'vitest'
import { appendLine, movePoints, parseEditPath, serializeEditPath, startContour } from '../../src/canvas/edit-path'
import type { EditPath, PointRef } from '../../src/canvas/types'
import { UNDO_LIMIT, useCanvasStore } from '../../src/stores/canvas'
import { pathDetail, pathItem } from './library-fixtures'

/** Invented demo data (library-fixtures): two saved paths of the wayfinding project. */
const arrow = pathDetail(pathItem(5, 'Arrow east', { data: 'M4 11H14V6L22 12L14 18V13H4Z', revision: 3, origin: 'drawn' }))
const stair = pathDetail(pathItem(9, 'Stair', { data: 'M3 20V16H8V12H13V8H18V4H21V20Z', fillRule: 'evenodd' }))

const at = (contour: number, segment: number, role: PointRef['role']): PointRef => ({ contour, segment, role })
const moveStart = (dx: number) => (p: EditPath) => movePoints(p, [at(0, -1, 'start')], dx, 0)
const startX = (store: ReturnType<typeof useCanvasStore>): number => store.active!.edit.contours[0].start[0]

function freshStore() {
  setActivePinia(createPinia())
  return useCanvasStore()
}

let store: ReturnType<typeof useCanvasStore>
beforeEach(() => {
  store = freshStore()
})

describe('sheets', () => {
  it('opens a saved path as the active sheet with its fields and parsed data', () => {
    expect(store.openPath(arrow)).toBe('path-5')
    expect(store.activeKey).toBe('path-5')
    const sheet = store.active!
    expect(sheet).toMatchObject({ key: 'path-5', pathId: 5, name: 'Arrow east', revision: 3, fillRule: 'nonzero', units: 'px', origin: 'drawn', metadata: null, visible: true })
    expect(sheet.edit.contours[0].segments).toHaveLength(6)
    expect(sheet.saved).toBe(sheet.edit)
    expect(serializeEditPath(sheet.edit)).toBe('M 4 11 L 14 11 L 14 6 L 22 12 L 14 18 L 14 13 L 4 13 Z')
  })

  it('keeps the edits of a path opened again and makes it active', () => {
    store.openPath(arrow)
    store.editActive('Move point', moveStart(1))
    store.openPath(stair)
    expect(store.activeKey).toBe('path-9')
    expect(store.openPath(arrow)).toBe('path-5')
    expect(store.activeKey).toBe('path-5')
    expect(startX(store)).toBe(5)
    expect(store.sheets.map((s) => s.key)).toEqual(['path-5', 'path-9'])
  })

  it('refuses unparseable data with the parser’s sentence', () => {
    const broken = pathDetail(pathItem(11, 'Broken', { data: 'M0 0 L1' }))
    const expected = parseEditPath('M0 0 L1')
    expect(expected.ok).toBe(false)
    expect(() => store.openPath(broken)).toThrow(expected.ok ? '' : expected.message)
    expect(store.sheets).toHaveLength(0)
  })

  it('makes new paths with increasing keys, and closing the active one activates its neighbour', () => {
    store.openPath(arrow)
    expect(store.newPath()).toBe('new-1')
    expect(store.newPath('Ferry ramp')).toBe('new-2')
    expect(store.sheets.map((s) => [s.key, s.name, s.pathId, s.revision])).toEqual([
      ['path-5', 'Arrow east', 5, 3],
      ['new-1', 'Untitled path', null, null],
      ['new-2', 'Ferry ramp', null, null],
    ])
    store.setActive('new-1')
    store.closePath('new-1')
    expect(store.activeKey).toBe('new-2')
    store.closePath('new-2')
    expect(store.activeKey).toBe('path-5')
    store.closePath('path-5')
    expect(store.activeKey).toBeNull()
    expect(store.active).toBeNull()
    expect(() => store.setActive('path-5')).toThrow(RangeError)
  })

  it('hides and shows a sheet', () => {
    store.openPath(arrow)
    store.setVisible('path-5', false)
    expect(store.sheets[0].visible).toBe(false)
    store.setVisible('path-5', true)
    expect(store.sheets[0].visible).toBe(true)
  })

  it('holds edits as plain immutable data, without deep proxies, keeping their identity', () => {
    store.openPath(arrow)
    const next = moveStart(2)(store.active!.edit)
    store.beginGesture()
    store.previewActive(next)
    expect(store.active!.edit).toBe(next)
    expect(isProxy(store.sheets[0])).toBe(false)
    expect(isProxy(store.sheets[0].edit)).toBe(false)
    expect(isProxy(store.sheets[0].edit.contours[0])).toBe(false)
    store.endGesture('Move point')
  })
})

describe('undo', () => {
  it('makes one undo step per editActive, none when the change gives the same path', () => {
    store.openPath(arrow)
    store.editActive('Move point', moveStart(1))
    store.editActive('Move point', (p) => p)
    store.editActive('Move point', moveStart(0))
    expect(store.canUndo).toBe(true)
    expect(store.undoLabel).toBe('Move point')
    store.undo()
    expect(startX(store)).toBe(4)
    expect(store.canUndo).toBe(false)
    expect(store.redoLabel).toBe('Move point')
    store.redo()
    expect(startX(store)).toBe(5)
    expect(store.canRedo).toBe(false)
  })

  it('makes one step of a whole drag, from the state at beginGesture', () => {
    store.openPath(arrow)
    const base = store.active!.edit
    store.beginGesture()
    for (let dx = 1; dx <= 5; dx++) store.previewActive(moveStart(dx)(base))
    store.endGesture('Move point')
    expect(startX(store)).toBe(9)
    store.undo()
    expect(startX(store)).toBe(4)
    expect(store.canUndo).toBe(false)
  })

  it('makes no step for a drag that ends where it began, and refuses a preview outside a drag', () => {
    store.openPath(arrow)
    const base = store.active!.edit
    store.beginGesture()
    store.previewActive(moveStart(3)(base))
    store.previewActive(moveStart(-3)(moveStart(3)(base)))
    store.endGesture('Move point')
    expect(store.canUndo).toBe(false)
    expect(() => store.previewActive(base)).toThrow(/beginGesture/)
  })

  it('makes one step of a probe drag with updateProbe, and ignores undo during a drag', () => {
    const id = store.addProbe({ type: 'ray', a: [0, 12], b: [1, 0] })
    store.beginGesture()
    store.updateProbe(id, { a: [1, 12] })
    store.updateProbe(id, { a: [2, 13] })
    store.undo()
    expect(store.probes[0].a).toEqual([2, 13])
    store.endGesture('Move ray')
    expect(store.undoLabel).toBe('Move ray')
    store.undo()
    expect(store.probes[0].a).toEqual([0, 12])
    expect(store.undoLabel).toBe('Add ray')
  })

  it('undoes and redoes probe and sweep changes with their labels', () => {
    const ray = store.addProbe({ type: 'ray', a: [0, 12], b: [1, 0] })
    const segment = store.addProbe({ type: 'segment', a: [2, 2], b: [20, 20] })
    const sweep = store.addSweep({ angle: 0, spacing: 2, count: 8, origin: [0, 4] })
    expect([ray, segment, sweep]).toEqual(['probe-1', 'probe-2', 'sweep-1'])
    store.updateSweep(sweep, { spacing: 3 })
    store.removeProbe(ray)
    expect(store.undoLabel).toBe('Delete ray')
    store.undo()
    expect(store.probes.map((p) => p.id)).toEqual(['probe-1', 'probe-2'])
    expect(store.undoLabel).toBe('Edit sweep')
    store.undo()
    expect(store.sweeps[0].spacing).toBe(2)
    store.undo()
    expect(store.sweeps).toHaveLength(0)
    expect(store.undoLabel).toBe('Add segment')
    store.redo()
    store.redo()
    expect(store.sweeps[0]).toEqual({ id: 'sweep-1', angle: 0, spacing: 3, count: 8, origin: [0, 4] })
    expect(store.redoLabel).toBe('Delete ray')
  })

  it('replaces probes and sweeps with fresh ids in one step', () => {
    store.addProbe({ type: 'line', a: [0, 0], b: [1, 1] })
    store.replaceProbes([{ type: 'ray', a: [3, 3], b: [0, 1] }, { type: 'segment', a: [1, 1], b: [4, 4] }], [{ angle: 90, spacing: 5, count: 3, origin: [0, 0] }])
    expect(store.probes.map((p) => p.id)).toEqual(['probe-2', 'probe-3'])
    expect(store.sweeps.map((s) => s.id)).toEqual(['sweep-1'])
    expect(store.undoLabel).toBe('Replace probes')
    store.undo()
    expect(store.probes.map((p) => p.id)).toEqual(['probe-1'])
    expect(store.sweeps).toHaveLength(0)
  })

  it('clears redo when a new step is made', () => {
    store.openPath(arrow)
    store.editActive('Move point', moveStart(1))
    store.undo()
    expect(store.canRedo).toBe(true)
    store.addProbe({ type: 'ray', a: [0, 0], b: [1, 0] })
    expect(store.canRedo).toBe(false)
    store.redo()
    expect(startX(store)).toBe(4)
  })

  it(`keeps at most ${UNDO_LIMIT} steps, dropping the oldest`, () => {
    store.openPath(arrow)
    const extra = 7
    for (let i = 1; i <= UNDO_LIMIT + extra; i++) store.editActive(`Move ${i}`, moveStart(1))
    expect(startX(store)).toBe(4 + UNDO_LIMIT + extra)
    let undone = 0
    while (store.canUndo && undone < UNDO_LIMIT + extra + 1) {
      store.undo()
      undone++
    }
    expect(undone).toBe(UNDO_LIMIT)
    expect(startX(store)).toBe(4 + extra)
    expect(store.redoLabel).toBe(`Move ${extra + 1}`)
  })

  it('drops selected points, segment, probe and hit that the undone state lacks', () => {
    store.newPath()
    const { path, contour } = startContour(store.active!.edit, [0, 0])
    store.editActive('Pen: start contour', () => appendLine(path, contour, [10, 0]))
    store.editActive('Pen: line', (p) => appendLine(p, 0, [10, 10]))
    const ray = store.addProbe({ type: 'ray', a: [5, -5], b: [0, 1] })
    store.select([at(0, 0, 'to'), at(0, 1, 'to')])
    store.selectSegment({ contour: 0, segment: 1 })
    store.selectProbe(ray)
    store.selectHit({ lineId: ray, pathKey: 'new-1', index: 0 })
    store.undo()
    expect(store.selectedProbeId).toBeNull()
    expect(store.selectedHit).toBeNull()
    expect(store.selection).toEqual([at(0, 0, 'to'), at(0, 1, 'to')])
    store.undo()
    expect(store.selection).toEqual([at(0, 0, 'to')])
    expect(store.selectedSegment).toBeNull()
  })

  it('forgets a closed sheet’s history, so a path opened again does not get old edits back', () => {
    store.openPath(arrow)
    store.editActive('Move point', moveStart(1))
    store.editActive('Move point', moveStart(1))
    store.closePath('path-5')
    expect(store.canUndo).toBe(false)
    store.openPath(arrow)
    store.undo()
    expect(startX(store)).toBe(4)
  })

  it('drops the steps that only touched a closed sheet and keeps the others', () => {
    store.openPath(arrow)
    store.openPath(stair)
    store.setActive('path-5')
    store.editActive('Move arrow', moveStart(1))
    store.addProbe({ type: 'ray', a: [0, 12], b: [1, 0] })
    store.setActive('path-9')
    store.editActive('Move stair', moveStart(2))
    store.setActive('path-5')
    store.editActive('Move arrow', moveStart(1))
    store.undo()
    expect(store.redoLabel).toBe('Move arrow')
    store.closePath('path-5')
    expect(store.canRedo).toBe(false)
    expect(store.undoLabel).toBe('Move stair')
    store.undo()
    expect(startX(store)).toBe(3)
    expect(store.undoLabel).toBe('Add ray')
    store.undo()
    expect(store.probes).toHaveLength(0)
    expect(store.canUndo).toBe(false)
    expect(store.redoLabel).toBe('Add ray')
  })
})

describe('dirty state and saving', () => {
  it('is dirty when the edit’s path data differs from the saved one', () => {
    store.openPath(arrow)
    store.openPath(stair)
    expect(store.isDirty('path-5')).toBe(false)
    expect(store.anyDirty).toBe(false)
    store.setActive('path-5')
    store.editActive('Move point', moveStart(1))
    expect(store.isDirty('path-5')).toBe(true)
    expect(store.isDirty('path-9')).toBe(false)
    expect(store.anyDirty).toBe(true)
    store.editActive('Move point', moveStart(-1))
    expect(store.isDirty('path-5')).toBe(false)
    expect(store.anyDirty).toBe(false)
    expect(store.isDirty('path-404')).toBe(false)
  })

  it('renames a new sheet to its saved path, keeps it active, clean, and its history following it', () => {
    store.openPath(arrow)
    const key = store.newPath('Ramp')
    store.editActive('Pen: start contour', (p) => appendLine(startContour(p, [0, 0]).path, 0, [8, 0]))
    store.editActive('Pen: line', (p) => appendLine(p, 0, [8, 8]))
    expect(store.isDirty(key)).toBe(true)
    store.select([at(0, 1, 'to')])
    const saved = pathDetail(pathItem(31, 'Ferry ramp', { data: 'M 0 0 L 8 0 L 8 8', revision: 1, origin: 'drawn' }))
    expect(store.markSaved(key, saved)).toBe('path-31')
    expect(store.activeKey).toBe('path-31')
    expect(store.sheets.map((s) => s.key)).toEqual(['path-5', 'path-31'])
    expect(store.active).toMatchObject({ pathId: 31, revision: 1, name: 'Ferry ramp' })
    expect(store.isDirty('path-31')).toBe(false)
    expect(store.selection).toEqual([at(0, 1, 'to')])
    store.undo()
    expect(serializeEditPath(store.active!.edit)).toBe('M 0 0 L 8 0')
    expect(store.isDirty('path-31')).toBe(true)
    expect(store.selection).toEqual([])
  })

  it('takes a newer revision for a saved path under the same key', () => {
    store.openPath(arrow)
    store.editActive('Move point', moveStart(1))
    const next = { ...arrow, revision: 4, data: 'M5 11H14V6L22 12L14 18V13H4Z' }
    expect(store.markSaved('path-5', next)).toBe('path-5')
    expect(store.active).toMatchObject({ revision: 4 })
    expect(store.isDirty('path-5')).toBe(false)
  })
})

describe('selection', () => {
  it('replaces, adds to and toggles the selection, ignoring points the active path lacks', () => {
    store.openPath(arrow)
    store.select([at(0, 0, 'to'), at(0, 1, 'to'), at(0, 0, 'c1'), at(3, -1, 'start')])
    expect(store.selection).toEqual([at(0, 0, 'to'), at(0, 1, 'to')])
    store.select([at(0, 1, 'to'), at(0, 2, 'to')], 'add')
    expect(store.selection).toEqual([at(0, 0, 'to'), at(0, 1, 'to'), at(0, 2, 'to')])
    store.select([at(0, 0, 'to'), at(0, -1, 'start')], 'toggle')
    expect(store.selection).toEqual([at(0, 1, 'to'), at(0, 2, 'to'), at(0, -1, 'start')])
    store.clearSelection()
    expect(store.selection).toEqual([])
  })

  it('clears the path selection when another sheet becomes active', () => {
    store.openPath(arrow)
    store.openPath(stair)
    store.select([at(0, 0, 'to')])
    store.selectSegment({ contour: 0, segment: 2 })
    expect(store.selectedSegment).toEqual({ contour: 0, segment: 2 })
    store.setActive('path-5')
    expect(store.selection).toEqual([])
    expect(store.selectedSegment).toBeNull()
  })

  it('resets everything, id counters included', () => {
    store.openPath(arrow)
    store.addProbe({ type: 'ray', a: [0, 0], b: [1, 0] })
    store.selectHit({ lineId: 'probe-1', pathKey: 'path-5', index: 0 })
    store.reset()
    expect([store.sheets.length, store.probes.length, store.activeKey, store.selectedHit, store.canUndo]).toEqual([0, 0, null, null, false])
    expect(store.addProbe({ type: 'line', a: [0, 0], b: [0, 1] })).toBe('probe-1')
    expect(store.newPath()).toBe('new-1')
  })
})
